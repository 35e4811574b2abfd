/**
 * From a record to the solver's circuit: the reference net (neutral, else the lowest-named
 * net), the supply between line and reference, one device per simulated part, node and
 * branch-current unknowns of modified nodal analysis, and the structural checks that would
 * otherwise show up as a singular matrix (floating nets, loops of voltage sources).
 */
import type { Assumption, Gap } from "../record/gaps-and-assumptions.js";
import type { Supply, TeardownRecord } from "../record/types.js";
import { kindInfo } from "../graph/kinds.js";
import type { JunctionParams, SwitchingParams } from "./device-models.js";
import {
  FUSE_DEFAULT_OHMS,
  OFF_STATE_OHMS,
  SWITCH_CLOSED_OHMS,
  diodeModel,
  ledModel,
  switchingModel,
  transformerModel,
  varistorModel,
  zenerModel,
} from "./device-models.js";
import type { SolverOutcome } from "./solver-error.js";
import { solverFailure } from "./solver-error.js";

/** Node index of the reference net. */
export const GROUND = -1;

/** The reference tag used for the supply in device lists and errors. */
export const SUPPLY_REF = "supply";

interface DeviceBase {
  ref: string;
  /** External terminals: node indices (GROUND for the reference). */
  terminals: number[];
  /** Net name of each terminal. */
  nets: string[];
  /** Offset of the device's memory in the circuit's memory vector. */
  mem: number;
}

/** One simulated element. */
export type CircuitDevice =
  | (DeviceBase & { type: "conductance"; g: number })
  | (DeviceBase & { type: "short"; branch: number })
  | (DeviceBase & { type: "capacitor"; c: number })
  | (DeviceBase & { type: "coupled"; branches: number[]; r: number[]; l: number[][] })
  | (DeviceBase & { type: "junction"; inner: number; rs: number; j: JunctionParams })
  | (DeviceBase & { type: "varistor"; vc: number; alpha: number; i0: number })
  | (DeviceBase & { type: "switching"; triac: boolean; p: SwitchingParams })
  | (DeviceBase & {
      type: "supply";
      branch: number;
      vpk: number;
      hz: number;
      /**
       * Phase at t = 0 in radians: v = vpk·sin(2π·hz·t + phase). 0 for every periodic solve
       * (the cycle runner's breakpoints and the AC view assume it); the crest plug-in sets π/2.
       */
      phase: number;
    });

/** The compiled circuit. */
export interface Circuit {
  reference: string;
  line: string;
  /** Net name per node index (internal nodes are named `REF#inner`). */
  nodeNames: string[];
  /** Total unknowns: nodes first, then branch currents. */
  size: number;
  nodeCount: number;
  /** What each unknown is, for messages: a net name or a part ref (branch current). */
  unknownOwner: string[];
  devices: CircuitDevice[];
  memSize: number;
  supply: Supply;
  /** Parts and nets left out of the simulation, and why. */
  gaps: Gap[];
  /** Every default model value chosen where the record was silent. */
  assumptions: Assumption[];
  /** Free-text remarks that are neither (how a part was modelled). */
  notes: string[];
}

/** Memory slots per device type (see transient stamps). */
function memFor(type: CircuitDevice["type"], windings: number): number {
  switch (type) {
    case "capacitor":
      return 2; // v, i
    case "coupled":
      return 2 * windings; // i, u per winding
    case "junction":
    case "varistor":
      return 1; // last junction voltage
    case "switching":
      return 3; // latch, gate junction voltage, main voltage
    default:
      return 0;
  }
}

/** Compiles a record at the given supply; structural problems come back as values. */
export function compileCircuit(rec: TeardownRecord, supply: Supply): SolverOutcome<Circuit> {
  const assumptions: Assumption[] = [];
  const gaps: Gap[] = [];
  const notes: string[] = [];
  const leaveOut = (part: string, reason: string) => gaps.push({ part, reason });
  const netNames = Object.keys(rec.nets).sort();
  for (const p of rec.parts)
    for (const n of Object.values(p.pins)) if (!netNames.includes(n)) netNames.push(n);
  netNames.sort();
  const line = netNames.find((n) => rec.nets[n]?.role === "line");
  if (line === undefined)
    return solverFailure("no-supply", "no net has the role line, so there is no supply to solve");
  const reference =
    netNames.find((n) => rec.nets[n]?.role === "neutral") ??
    netNames.find((n) => n !== line) ??
    line;
  if (reference === line)
    return solverFailure("no-supply", "the line net is the only net", { nets: [line] });

  const nodeNames: string[] = [];
  const nodeOf = new Map<string, number>([[reference, GROUND]]);
  const node = (net: string): number => {
    let i = nodeOf.get(net);
    if (i === undefined) {
      i = nodeNames.length;
      nodeNames.push(net);
      nodeOf.set(net, i);
    }
    return i;
  };
  // Branch unknowns are numbered after all nodes; collect them as placeholders first.
  const pending: Array<{ build: (branchBase: number) => CircuitDevice }> = [];
  let branchCount = 0;
  let memSize = 0;
  const innerNodes: Array<{ name: string }> = [];
  const usedNets = new Set<string>([line, reference]);
  const add = (
    type: CircuitDevice["type"],
    windings: number,
    make: (mem: number, b: number) => CircuitDevice,
    branches: number,
  ) => {
    const mem = memSize;
    memSize += memFor(type, windings);
    const b0 = branchCount;
    branchCount += branches;
    pending.push({ build: (base) => make(mem, base + b0) });
  };

  add(
    "supply",
    0,
    (mem, b) => ({
      type: "supply",
      ref: SUPPLY_REF,
      terminals: [node(line), GROUND],
      nets: [line, reference],
      mem,
      branch: b,
      vpk: supply.vrms * Math.SQRT2,
      hz: supply.hz,
      phase: 0,
    }),
    1,
  );

  for (const p of rec.parts) {
    const info = kindInfo(p.kind);
    if (info === null) {
      leaveOut(p.ref, `unknown kind "${p.kind}"`);
      continue;
    }
    // Connectors and test points carry nothing the figures depend on: not a gap.
    if (info.documentationOnly) continue;
    const pinNets =
      p.kind === "capacitor" && p.polarised
        ? [p.pins.plus, p.pins.minus]
        : info.pins.map((r) => p.pins[r]);
    if (pinNets.some((n) => n === undefined)) {
      leaveOut(p.ref, "a pin is not connected");
      continue;
    }
    const nets = pinNets as string[];
    const gapsBefore = gaps.length;
    for (const n of nets) node(n);
    const t = nets.map((n) => nodeOf.get(n)!);
    const base = { ref: p.ref, terminals: t, nets };
    const two = (g: number) =>
      add("conductance", 0, (mem) => ({ ...base, mem, type: "conductance", g }), 0);
    const short = () =>
      add("short", 0, (mem, b) => ({ ...base, mem, type: "short", branch: b }), 1);
    const resistance = (r: number) => (r > 0 ? two(1 / r) : short());
    const junction = (m: { j: JunctionParams; rs: number }) => {
      let inner = t[0]!;
      if (m.rs > 0) {
        inner = nodeNames.length;
        nodeNames.push(`${p.ref}#inner`);
        innerNodes.push({ name: p.ref });
      }
      add("junction", 0, (mem) => ({ ...base, mem, type: "junction", inner, rs: m.rs, j: m.j }), 0);
    };
    switch (p.kind) {
      case "resistor":
        if (p.value === null) leaveOut(p.ref, "a resistor without a value");
        else {
          if (p.value === 0) notes.push(`${p.ref}: 0 Ω, modelled as an ideal link (a 0 V source)`);
          resistance(p.value);
        }
        break;
      case "fuse": {
        const r = p.model.r ?? FUSE_DEFAULT_OHMS;
        if (p.model.r === undefined)
          assumptions.push({
            part: p.ref,
            field: "model.r",
            value: FUSE_DEFAULT_OHMS,
            why: "cold resistance not in the record; a small fuse's value",
          });
        resistance(r);
        break;
      }
      case "switch":
        assumptions.push({
          part: p.ref,
          field: "model.r",
          value: p.closed ? SWITCH_CLOSED_OHMS : OFF_STATE_OHMS,
          why: p.closed
            ? "a closed contact taken as this small resistance"
            : "an open contact taken as this large resistance",
        });
        two(p.closed ? 1 / SWITCH_CLOSED_OHMS : 1 / OFF_STATE_OHMS);
        break;
      case "capacitor":
        if (p.value === null) leaveOut(p.ref, "a capacitor without a value");
        else add("capacitor", 0, (mem) => ({ ...base, mem, type: "capacitor", c: p.value! }), 0);
        break;
      case "load":
        if (p.model.r !== undefined) resistance(p.model.r);
        else if (p.model.c !== undefined)
          add("capacitor", 0, (mem) => ({ ...base, mem, type: "capacitor", c: p.model.c! }), 0);
        else leaveOut(p.ref, "load without a resistance or capacitance (model.r or model.c)");
        break;
      case "inductor":
        if (p.value === null) leaveOut(p.ref, "an inductor without a value");
        else {
          if (p.model.r === undefined)
            assumptions.push({
              part: p.ref,
              field: "model.r",
              value: 0,
              why: "winding resistance not in the record; taken as none",
            });
          add(
            "coupled",
            1,
            (mem, b) => ({
              ...base,
              mem,
              type: "coupled",
              branches: [b],
              r: [p.model.r ?? 0],
              l: [[p.value!]],
            }),
            1,
          );
        }
        break;
      case "transformer": {
        const m = transformerModel(p, assumptions);
        add(
          "coupled",
          2,
          (mem, b) => ({
            ...base,
            mem,
            type: "coupled",
            branches: [b, b + 1],
            r: [m.rp, m.rs],
            l: [
              [m.lp, m.m],
              [m.m, m.ls],
            ],
          }),
          2,
        );
        break;
      }
      case "diode":
        junction(diodeModel(p, assumptions));
        break;
      case "zener":
        junction(zenerModel(p, assumptions));
        break;
      case "led":
        junction(ledModel(p, assumptions));
        break;
      case "varistor": {
        const m = varistorModel(p, assumptions);
        add("varistor", 0, (mem) => ({ ...base, mem, type: "varistor", ...m }), 0);
        break;
      }
      case "thyristor": {
        // Terminal order for the switching model: main+, gate, main- (anode, gate, cathode).
        const sp = switchingModel(p, false, assumptions);
        add("switching", 0, (mem) => ({ ...base, mem, type: "switching", triac: false, p: sp }), 0);
        break;
      }
      case "triac": {
        // Record order is mt1, mt2, gate; the model wants mt2 (main+), gate, mt1 (reference).
        const sp = switchingModel(p, true, assumptions);
        const order = [1, 2, 0];
        add(
          "switching",
          0,
          (mem) => ({
            ...base,
            terminals: order.map((i) => t[i]!),
            nets: order.map((i) => nets[i]!),
            mem,
            type: "switching",
            triac: true,
            p: sp,
          }),
          0,
        );
        break;
      }
      default:
        leaveOut(p.ref, `a ${p.kind} is not simulated`);
    }
    // a part left out simulates nothing: its nets count as used only through other parts
    if (gaps.length === gapsBefore) for (const n of nets) usedNets.add(n);
  }
  const nodeCount = nodeNames.length;
  const devices = pending.map((d) => d.build(nodeCount));
  for (const n of netNames)
    if (!usedNets.has(n))
      gaps.push({ net: n, reason: "no simulated part reaches it, so it has no figures" });

  const structural = checkStructure(devices, line, reference);
  if (structural !== null) return structural;
  const unknownOwner = [...nodeNames];
  for (const d of devices) {
    if (d.type === "supply" || d.type === "short") unknownOwner[d.branch] = d.ref;
    if (d.type === "coupled") for (const b of d.branches) unknownOwner[b] = d.ref;
  }
  return {
    ok: true,
    value: {
      reference,
      line,
      nodeNames,
      nodeCount,
      size: nodeCount + branchCount,
      unknownOwner,
      devices,
      memSize,
      supply,
      gaps,
      assumptions,
      notes,
    },
  };
}

/** Floating groups of nets (no path of any part to the reference) and loops of voltage sources. */
function checkStructure(
  devices: CircuitDevice[],
  line: string,
  reference: string,
): { ok: false; error: import("./solver-error.js").SolverError } | null {
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
