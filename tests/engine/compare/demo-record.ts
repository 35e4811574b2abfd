/** A demo record file read through the engine's parser, by its path under seed-demo/records. */
import { readFileSync } from "node:fs";
import { parseRecord, type TeardownRecord } from "@teardown/engine";

const DEMO_DIR = new URL("../../../seed-demo/records/", import.meta.url);

/** The normalised record of `seed-demo/records/<slug>.yaml` (throws when it does not read). */
export function demoRecord(slug: string): TeardownRecord {
  const read = parseRecord(readFileSync(new URL(`${slug}.yaml`, DEMO_DIR), "utf8"), {
    filename: `${slug}.yaml`,
  });
  if (!read.ok) throw new Error(`${slug}: ${read.errors[0]?.message}`);
  return read.record;
}
