/**
 * Which side of an isolating transformer each part is on. Nets joined by any part other than a
 * transformer are galvanically one; the primary side is everything joined to the line or
 * neutral. A transformer isolates when none of its secondary nets is on the primary side. The
 * layout puts primary-side parts left of such a transformer and everything else right of it,
 * so the isolation boundary through the transformer crosses nothing else.
 */
import type { TeardownRecord } from "../record/types.js";

/** Column group of a part: 0 primary side, 1 an isolating transformer, 2 the rest. */
export type IsolationSide = 0 | 1 | 2;

/** Side by part ref, or null when no transformer isolates (then no part is constrained). */
export function isolationSides(record: TeardownRecord): Map<string, IsolationSide> | null {
  const parent = new Map<string, string>();
  const find = (n: string): string => {
    let r = n;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    parent.set(n, r);
    return r;
  };
  const join = (a: string, b: string): void => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  for (const p of record.parts) {
    if (p.kind === "transformer") continue;
    const nets = Object.values(p.pins);
    for (const n of nets.slice(1)) join(nets[0]!, n);
  }
  const mains = Object.entries(record.nets)
    .filter(([, info]) => info.role === "line" || info.role === "neutral")
    .map(([name]) => find(name));
  if (mains.length === 0) return null;
  const primary = new Set(mains);
  const onPrimary = (net: string): boolean => primary.has(find(net));
  const isolating = record.parts.filter(
    (p) =>
      p.kind === "transformer" &&
      ["p1", "p2"].some((r) => p.pins[r] !== undefined && onPrimary(p.pins[r]!)) &&
      ["s1", "s2"].every((r) => p.pins[r] !== undefined && !onPrimary(p.pins[r]!)),
  );
  if (isolating.length === 0) return null;
  const sides = new Map<string, IsolationSide>();
  for (const p of record.parts) {
    if (isolating.includes(p)) sides.set(p.ref, 1);
    else sides.set(p.ref, Object.values(p.pins).some(onPrimary) ? 0 : 2);
  }
  return sides;
}
