/**
 * Where uploaded files live, behind one small interface: put, get and delete by key. The local
 * disk store serves one machine; an object store (S3-compatible) is the multi-machine option
 * and only needs these three methods.
 */

/** A place to keep uploaded bytes by key (keys are `a-z0-9`, `/`, `.`, `_`, `-`). */
export interface BlobStore {
  /** Stores the bytes under the key, replacing any earlier bytes there. */
  put(key: string, bytes: Uint8Array): Promise<void>;
  /** The bytes under the key, or null when there are none. */
  get(key: string): Promise<Uint8Array | null>;
  /** Removes the key; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
}

const KEY_PATTERN = /^[a-z0-9][a-z0-9/._-]*$/;

/** Throws when a key could escape the store (absolute, `..`, odd characters): keys are made by us. */
export function assertStorageKey(key: string): void {
  if (
    !KEY_PATTERN.test(key) ||
    key.split("/").some((seg) => seg === "" || seg === "." || seg === "..")
  ) {
    throw new Error(`not a storage key: ${JSON.stringify(key)}`);
  }
}
