/**
 * Structural checks of a record before it is solved: what the person who traced the board should
 * look at (a pin on the wrong role, a net with one wire, a part shorted by its own pins, an island
 * with no path to the mains). Every finding is a value; nothing here throws on odd input.
 */
import type { TeardownRecord } from "../record/types.js";
import {
  buildCircuitGraph,
  netsWithRole,
  type CircuitGraph,
  type PartNode,
} from "./circuit-graph.js";
import { kindInfo, pinRolesFor } from "./kinds.js";
import { partPlausibility } from "../record/plausibility.js";

/** One finding of checkCircuit. */
export interface CircuitIssue {
  code: CircuitIssueCode;
  severity: "error" | "warning" | "info";
  message: string;
  parts: string[];
  nets: string[];
}

export type CircuitIssueCode =
  | "duplicate-ref"
  | "pin-missing"
  | "pin-unknown"
  | "measurement-unknown-net"
  | "measurement-unknown-part"
  | "floating-net"
  | "part-shorted"
  | "no-supply"
  | "no-neutral"
  | "no-line"
  | "no-supply-path"
  | "unknown-kind"
  | "implausible-value"
  | "impossible-value";

const SEVERITY_ORDER = { error: 0, warning: 1, info: 2 } as const;

/** Check a record's structure; issues come sorted by severity, code, then parts and nets. */
export function checkCircuit(record: TeardownRecord): CircuitIssue[] {
  const graph = buildCircuitGraph(record);
  const issues: CircuitIssue[] = [
    ...duplicateRefs(record),
    ...pinFit(graph),
    ...measurementNames(record, graph),
    ...floatingNets(graph),
    ...shortedParts(graph),
    ...supplyIssues(graph),
    ...unknownKinds(graph),
    ...valueChecks(record),
  ];
  return issues.sort(
    (a, b) =>
      SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] ||
      cmp(a.code, b.code) ||
      cmp(a.parts.join(","), b.parts.join(",")) ||
      cmp(a.nets.join(","), b.nets.join(",")),
  );
}

function cmp(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

function issue(
  code: CircuitIssueCode,
  severity: CircuitIssue["severity"],
  message: string,
  parts: string[] = [],
  nets: string[] = [],
): CircuitIssue {
  return {
    code,
    severity,
    message,
    parts: [...new Set(parts)].sort(),
    nets: [...new Set(nets)].sort(),
  };
}

function duplicateRefs(record: TeardownRecord): CircuitIssue[] {
  const count = new Map<string, number>();
  for (const p of record.parts) count.set(p.ref, (count.get(p.ref) ?? 0) + 1);
  return [...count]
    .filter(([, n]) => n > 1)
    .map(([ref, n]) =>
      issue("duplicate-ref", "error", `${n} parts share the ref ${ref}; refs must be unique.`, [
        ref,
      ]),
    );
}

/** Known kinds must use exactly their roles; connectors and test points take p1, p2, ... */
function pinFit(graph: CircuitGraph): CircuitIssue[] {
  const out: CircuitIssue[] = [];
  for (const part of graph.parts) {
    const info = kindInfo(part.kind);
    if (info === null) continue;
    const given = part.pins.map((e) => e.role);
    const nets = part.pins.map((e) => e.net);
    if (info.variadic) {
      const bad = given.filter((r) => !/^p[1-9][0-9]*$/.test(r));
      if (given.length === 0)
        out.push(
          issue("pin-missing", "error", `${part.ref} (${part.kind}) has no pins.`, [part.ref]),
        );
      if (bad.length > 0)
        out.push(
          issue(
            "pin-unknown",
            "error",
            `${part.ref} (${part.kind}) has pins named ${bad.join(", ")}; contacts are p1, p2, ...`,
            [part.ref],
            nets,
          ),
        );
      continue;
    }
    const expected = pinRolesFor(part.kind, part.polarised) ?? [];
    const missing = expected.filter((r) => !given.includes(r));
    const unknown = given.filter((r) => !expected.includes(r));
    if (missing.length > 0)
      out.push(
        issue(
          "pin-missing",
          "error",
          `${part.ref} (${part.kind}) has no ${missing.join(", ")} pin; a ${part.kind} has ${expected.join(", ")}.`,
          [part.ref],
          nets,
        ),
      );
    if (unknown.length > 0)
      out.push(
        issue(
          "pin-unknown",
          "error",
          `${part.ref} (${part.kind}) has pins ${unknown.join(", ")} that a ${part.kind} does not have (${expected.join(", ")}).`,
          [part.ref],
          nets,
        ),
      );
  }
  return out;
}

function measurementNames(record: TeardownRecord, graph: CircuitGraph): CircuitIssue[] {
  const out: CircuitIssue[] = [];
  record.measurements.forEach((m, i) => {
    for (const net of m.between ?? [])
      if (!graph.netByName.has(net))
        out.push(
          issue(
            "measurement-unknown-net",
            "error",
            `measurements[${i}] (${m.what}) names the net ${net}, which the circuit does not have.`,
            [],
            [net],
          ),
        );
    if (m.part !== null && !graph.partByRef.has(m.part))
      out.push(
        issue(
          "measurement-unknown-part",
          "error",
          `measurements[${i}] (${m.what}) names the part ${m.part}, which the circuit does not have.`,
          [m.part],
        ),
      );
  });
  return out;
}

/**
 * A net reached by one simulated pin carries no current; connectors and unknown kinds do not
 * count. A line or neutral net is never floating: the supply itself is its other connection.
 */
function floatingNets(graph: CircuitGraph): CircuitIssue[] {
  const out: CircuitIssue[] = [];
  for (const net of graph.nets) {
    if (net.role === "line" || net.role === "neutral") continue;
    const simulated = net.pins.filter((e) => graph.partByRef.get(e.part)?.simulated === true);
    if (simulated.length !== 1) continue;
    const only = simulated[0]!;
    out.push(
      issue(
        "floating-net",
        "warning",
        `The net ${net.name} reaches only ${only.part} (${only.role}) among simulated parts, so no current flows through it.`,
        [only.part],
        [net.name],
      ),
    );
  }
  return out;
}

/** All pins on one net (or a transformer winding across itself): the part does nothing. */
function shortedParts(graph: CircuitGraph): CircuitIssue[] {
  const out: CircuitIssue[] = [];
  for (const part of graph.parts) {
    if (!part.simulated || part.pins.length < 2) continue;
    const nets = new Set(part.pins.map((e) => e.net));
    if (nets.size === 1) {
      const [net] = [...nets];
      out.push(
        issue(
          "part-shorted",
          "warning",
          `Every pin of ${part.ref} (${part.kind}) is on the net ${net}, so it is shorted by its own pins.`,
          [part.ref],
          [net!],
        ),
      );
      continue;
    }
    if (part.kind === "transformer") {
      for (const [x, y, name] of [
        ["p1", "p2", "primary"],
        ["s1", "s2", "secondary"],
      ] as const) {
        const a = part.pins.find((e) => e.role === x)?.net;
        if (a !== undefined && a === part.pins.find((e) => e.role === y)?.net)
          out.push(
            issue(
              "part-shorted",
              "warning",
              `The ${name} winding of ${part.ref} has both ends on the net ${a}, so it is shorted.`,
              [part.ref],
              [a],
            ),
          );
      }
    }
  }
  return out;
}

function supplyIssues(graph: CircuitGraph): CircuitIssue[] {
  const line = netsWithRole(graph, ["line"]);
  const neutral = netsWithRole(graph, ["neutral"]);
  if (line.length === 0 && neutral.length === 0)
    return [
      issue(
        "no-supply",
        "error",
        "No net is declared as line or neutral, so the circuit has no supply to analyse.",
      ),
    ];
  const out: CircuitIssue[] = [];
  if (neutral.length === 0)
    out.push(
      issue(
        "no-neutral",
        "warning",
        `No neutral net is declared; voltages fall back to the lowest-named net as reference.`,
        [],
        line,
      ),
    );
  if (line.length === 0)
    out.push(
      issue(
        "no-line",
        "warning",
        "No line net is declared; the supply has only its neutral side.",
        [],
        neutral,
      ),
    );
  out.push(...islandsWithoutSupply(graph, new Set([...line, ...neutral])));
  return out;
}

/**
 * Simulated parts grouped into islands (parts joined through shared nets; a part joins all its
 * own nets, so a transformer carries its secondary into the primary's island). One issue per
 * island that touches no supply net.
 */
function islandsWithoutSupply(graph: CircuitGraph, supply: Set<string>): CircuitIssue[] {
  const simulated = graph.parts.filter((p) => p.simulated);
  const seen = new Set<PartNode>();
  const out: CircuitIssue[] = [];
  for (const start of simulated) {
    if (seen.has(start)) continue;
    const parts: PartNode[] = [];
    const nets = new Set<string>();
    const stack = [start];
    seen.add(start);
    while (stack.length > 0) {
      const p = stack.pop()!;
      parts.push(p);
      for (const e of p.pins) {
        if (nets.has(e.net)) continue;
        nets.add(e.net);
        for (const q of graph.netByName.get(e.net)?.pins ?? []) {
          const other = graph.partByRef.get(q.part);
          if (other !== undefined && other.simulated && !seen.has(other)) {
            seen.add(other);
            stack.push(other);
          }
        }
      }
    }
    if ([...nets].some((n) => supply.has(n))) continue;
    const refs = parts.map((p) => p.ref).sort();
    out.push(
      issue(
        "no-supply-path",
        "warning",
        `No path joins ${refs.join(", ")} to the supply nets; ${refs.length === 1 ? "it is" : "they are"} left without a source.`,
        refs,
        [...nets],
      ),
    );
  }
  return out;
}

function unknownKinds(graph: CircuitGraph): CircuitIssue[] {
  return graph.parts
    .filter((p) => !p.known)
    .map((p) =>
      issue(
        "unknown-kind",
        "info",
        `${p.ref} has the kind "${p.kind}", which the engine does not know; it is kept and searched but left out of the simulation.`,
        [p.ref],
        p.pins.map((e) => e.net),
      ),
    );
}

/**
 * Numbers a part of its kind is unlikely to have (a warning naming the field path), and, for a
 * record built in code that skipped validation, numbers it cannot have (an error).
 */
function valueChecks(record: TeardownRecord): CircuitIssue[] {
  return record.parts.flatMap((p, i) =>
    partPlausibility(p).map((f) => {
      const path = `parts[${i}].${f.field.join(".")}`;
      return issue(
        f.level === "impossible" ? "impossible-value" : "implausible-value",
        f.level === "impossible" ? "error" : "warning",
        `${p.ref} (${path}): ${f.message}.`,
        [p.ref],
        Object.values(p.pins),
      );
    }),
  );
}
