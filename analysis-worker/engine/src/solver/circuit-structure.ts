/**
 * The structural checks of a compiled circuit that would otherwise show up as a singular matrix:
 * nets with no path of any part to the reference (floating), and loops of voltage sources (the
 * supply and ideal links), each named with the parts and nets involved.
 */
import type { CircuitDevice } from "./circuit-model.js";
import type { SolverError } from "./solver-error.js";
import { solverFailure } from "./solver-error.js";

/** Floating groups of nets (no path of any part to the reference) and loops of voltage sources. */
export function checkStructure(
  devices: CircuitDevice[],
  line: string,
  reference: string,
): { ok: false; error: SolverError } | null {
  const parent = new Map<string, string>();
  const find = (a: string): string => {
    let r = a;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    parent.set(a, r);
    return r;
  };
  const union = (a: string, b: string) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  // Sources (the supply and ideal links) form a forest; an edge inside one tree closes a loop.
  const sourceAdj = new Map<string, Array<{ to: string; ref: string }>>();
  const sourceParent = new Map<string, string>();
  const sFind = (a: string): string => {
    let r = a;
    while (sourceParent.has(r) && sourceParent.get(r) !== r) r = sourceParent.get(r)!;
    return r;
  };
  for (const d of devices) {
    for (const n of d.nets) find(n);
    for (let i = 1; i < d.nets.length; i++) union(d.nets[0]!, d.nets[i]!);
    if (d.type === "supply" || d.type === "short") {
      const [a, b] = [d.nets[0]!, d.nets[1]!];
      if (sFind(a) === sFind(b)) {
        const path = sourcePath(sourceAdj, a, b);
        return solverFailure(
          "voltage-source-loop",
          `a loop of voltage sources (supply and ideal links): ${[...path, d.ref].join(", ")}`,
          {
            parts: [...path, d.ref],
            nets: [a, b],
          },
        );
      }
      sourceParent.set(sFind(a), sFind(b));
      sourceAdj.set(a, [...(sourceAdj.get(a) ?? []), { to: b, ref: d.ref }]);
      sourceAdj.set(b, [...(sourceAdj.get(b) ?? []), { to: a, ref: d.ref }]);
    }
  }
  const groundRoot = find(reference);
  const floating = [...parent.keys()].filter((n) => find(n) !== groundRoot).sort();
  if (floating.length > 0) {
    return solverFailure(
      "floating-net",
      `no part connects ${floating.join(", ")} to the supply's reference ${reference} (line ${line})`,
      {
        nets: floating,
      },
    );
  }
  return null;
}

/** Refs of the source edges on the path from a to b in the source forest. */
function sourcePath(
  adj: Map<string, Array<{ to: string; ref: string }>>,
  a: string,
  b: string,
): string[] {
  const prev = new Map<string, { from: string; ref: string }>();
  const queue = [a];
  const seen = new Set([a]);
  while (queue.length > 0) {
    const cur = queue.shift()!;
    if (cur === b) break;
    for (const e of adj.get(cur) ?? []) {
      if (seen.has(e.to)) continue;
      seen.add(e.to);
      prev.set(e.to, { from: cur, ref: e.ref });
      queue.push(e.to);
    }
  }
  const refs: string[] = [];
  for (let cur = b; cur !== a && prev.has(cur); cur = prev.get(cur)!.from)
    refs.push(prev.get(cur)!.ref);
  return refs.reverse();
}
