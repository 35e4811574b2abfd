/** The blob store on local disk, under `<data dir>/uploads` (writes go to a temp file, then rename). */
import { randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { dataDir } from "@teardown/db";
import { assertStorageKey, type BlobStore } from "./blob-store";

/** A store keeping each key as a file under `root`. */
export function localDiskStore(root: string): BlobStore {
  const fileFor = (key: string): string => {
    assertStorageKey(key);
    return path.join(root, ...key.split("/"));
  };
  return {
    async put(key, bytes) {
      const file = fileFor(key);
      await mkdir(path.dirname(file), { recursive: true });
      // A reader never sees half a file: write beside it, then rename over it.
      const tmp = `${file}.${randomBytes(6).toString("hex")}.tmp`;
      await writeFile(tmp, bytes);
      await rename(tmp, file);
    },
    async get(key) {
      try {
        return new Uint8Array(await readFile(fileFor(key)));
      } catch (err) {
        if ((err as { code?: string }).code === "ENOENT") return null;
        throw err;
      }
    },
    async delete(key) {
      await rm(fileFor(key), { force: true });
    },
  };
}

const globalForStore = globalThis as unknown as { teardownUploads?: BlobStore };

/** The process's upload store: `<data dir>/uploads`. */
export function uploadStore(): BlobStore {
  globalForStore.teardownUploads ??= localDiskStore(path.join(dataDir(), "uploads"));
  return globalForStore.teardownUploads;
}
