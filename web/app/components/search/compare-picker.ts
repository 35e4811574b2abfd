"use client";
/** "Pick two to compare": the ticked entries, at most two, the oldest tick dropped for a third. */
import { useState } from "react";

/** Entries that can be compared at once. */
const PICK_LIMIT = 2;

export function useComparePicks() {
  const [picked, setPicked] = useState<string[]>([]);
  function toggle(id: string) {
    setPicked((p) => (p.includes(id) ? p.filter((x) => x !== id) : [...p, id].slice(-PICK_LIMIT)));
  }
  return { picked, toggle, clear: () => setPicked([]) };
}
