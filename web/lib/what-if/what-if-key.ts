/**
 * The cache key of a what-if: a hash of its checked input, the supply analysed and the changes
 * in SI units sorted by part, so "22k" and 22000, or the same changes in another order, are one
 * question. The revision and the engine version are the key's other two columns.
 */
import { createHash } from "node:crypto";
import type { CheckedWhatIf } from "@teardown/engine";

/** The canonical input, as stored beside the cached result and returned with it. */
export interface WhatIfInput {
  supply: { vrms: number; hz: number };
  changes: Array<{ part: string; value: number }>;
}

export function canonicalInput(checked: CheckedWhatIf): WhatIfInput {
  return {
    supply: { vrms: checked.supply.vrms, hz: checked.supply.hz },
    changes: [...checked.changes]
      .sort((a, b) => (a.part < b.part ? -1 : a.part > b.part ? 1 : 0))
      .map((c) => ({ part: c.part, value: c.value })),
  };
}

/** SHA-256 of the canonical input's JSON (its key order is fixed by `canonicalInput`). */
export function inputKey(input: WhatIfInput): string {
  return createHash("sha256").update(JSON.stringify(input)).digest("hex");
}
