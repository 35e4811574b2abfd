/**
 * An independent fragment matcher for the tests: plain enumeration over every injective choice of
 * circuit parts and every orientation of interchangeable pins, written from the rules in issue 12
 * alone (no engine code): parts match by kind, polarity and pin roles; the two ends of a
 * non-polarised two-pin part (roles `a` and `b`) may swap; distinct fragment nets land on
 * distinct circuit nets; a fragment net declared line or neutral only on a net with that role;
 * extra parts on those nets are allowed. Exponential, so only for small circuits.
 */

/** The little of a record this matcher reads. */
export interface PlainPart {
  ref: string;
  kind: string;
  polarised: boolean;
  pins: Record<string, string>;
}
export interface PlainCircuit {
  parts: PlainPart[];
  nets: Record<string, { role: string | null }>;
}

function swappable(p: PlainPart): boolean {
  const roles = Object.keys(p.pins).sort();
  return !p.polarised && roles.length === 2 && roles[0] === "a" && roles[1] === "b";
}

function sameShape(f: PlainPart, c: PlainPart): boolean {
  return (
    f.kind === c.kind &&
    f.polarised === c.polarised &&
    Object.keys(f.pins).sort().join() === Object.keys(c.pins).sort().join()
  );
}

/** Every placement (fragment ref -> circuit ref), each once, as sorted JSON strings. */
export function bruteForcePlacements(fragment: PlainCircuit, circuit: PlainCircuit): Set<string> {
  const out = new Set<string>();
  const chosen: PlainPart[] = [];
  const pick = (i: number): void => {
    if (i === fragment.parts.length) {
      if (consistent(fragment, circuit, chosen))
        out.add(
          JSON.stringify(
            Object.fromEntries(
              fragment.parts
                .map((f, k) => [f.ref, chosen[k]!.ref])
                .sort(([x], [y]) => (x! < y! ? -1 : 1)),
            ),
          ),
        );
      return;
    }
    for (const c of circuit.parts) {
      if (chosen.includes(c) || !sameShape(fragment.parts[i]!, c)) continue;
      chosen.push(c);
      pick(i + 1);
      chosen.pop();
    }
  };
  pick(0);
  return out;
}

/** Some orientation of the swappable parts gives a consistent, injective, role-respecting net map. */
function consistent(fragment: PlainCircuit, circuit: PlainCircuit, chosen: PlainPart[]): boolean {
  const flexible = fragment.parts.map((f) => swappable(f));
  const n = flexible.filter(Boolean).length;
  for (let mask = 0; mask < 1 << n; mask++) {
    const netMap = new Map<string, string>();
    let ok = true;
    let bit = 0;
    fragment.parts.forEach((f, k) => {
      if (!ok) return;
      const c = chosen[k]!;
      const flip = flexible[k] ? (mask >> bit++) & 1 : 0;
      for (const [role, net] of Object.entries(f.pins)) {
        const target = c.pins[flip ? (role === "a" ? "b" : "a") : role]!;
        const had = netMap.get(net);
        if (had !== undefined && had !== target) ok = false;
        netMap.set(net, target);
      }
    });
    if (!ok) continue;
    const targets = [...netMap.values()];
    if (new Set(targets).size !== targets.length) continue;
    const rolesOk = [...netMap].every(([fn, cn]) => {
      const want = fragment.nets[fn]?.role ?? null;
      return !(want === "line" || want === "neutral") || (circuit.nets[cn]?.role ?? null) === want;
    });
    if (rolesOk) return true;
  }
  return false;
}
