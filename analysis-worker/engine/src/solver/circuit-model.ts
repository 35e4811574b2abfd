/**
 * From a record to the solver's circuit: the reference net (neutral, else the lowest-named
 * net), the supply between line and reference, one device per simulated part, node and
 * branch-current unknowns of modified nodal analysis, and the structural checks that would
 * otherwise show up as a singular matrix (floating nets, loops of voltage sources).
 */
import type { Assumption, Gap } from "../record/gaps-and-assumptions.js";
import type { NetName, PartRef, Supply, TeardownRecord } from "../record/types.js";
import { isKnownPart } from "../record/types.js";
import type { JunctionParams, SwitchingParams } from "./device-models.js";
import type { SolverOutcome } from "./solver-error.js";
import { solverFailure } from "./solver-error.js";
import type { CircuitBuilder } from "./compile-part.js";
import { compilePart } from "./compile-part.js";
import { checkStructure } from "./circuit-structure.js";

export type { NetName, PartRef };

/** Node index of the reference net. */
export const GROUND = -1;

/** The reference tag used for the supply in device lists and errors. */
export const SUPPLY_REF = "supply" as PartRef;

interface DeviceBase {
  ref: PartRef;
  /** External terminals: node indices (GROUND for the reference). */
  terminals: number[];
  /** Net name of each terminal. */
  nets: NetName[];
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
  reference: NetName;
  line: NetName;
  /**
   * Net name per node index (internal nodes are named `REF#inner`). Plain strings, unlike the
   * devices' nets: callers look nodes up by names they read from a record or a measurement.
   */
  nodeNames: string[];
  /** Total unknowns: nodes first, then branch currents. */
  size: number;
  nodeCount: number;
  /** What each unknown is, for messages: a net name or a part ref (branch current). */
  unknownOwner: Array<NetName | PartRef>;
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

/** The record's nets, sorted, with the supply's line net and its reference (neutral, else the lowest-named other net). */
function supplyNets(
  rec: TeardownRecord,
): SolverOutcome<{ netNames: NetName[]; line: NetName; reference: NetName }> {
  const names = new Set(Object.keys(rec.nets));
  for (const p of rec.parts) for (const n of Object.values(p.pins)) names.add(n);
  const netNames = [...names].sort() as NetName[];
  const line = netNames.find((n) => rec.nets[n]?.role === "line");
  if (line === undefined)
    return solverFailure("no-supply", "no net has the role line, so there is no supply to solve");
  const reference =
    netNames.find((n) => rec.nets[n]?.role === "neutral") ??
    netNames.find((n) => n !== line) ??
    line;
  if (reference === line)
    return solverFailure("no-supply", "the line net is the only net", { nets: [line] });
  return { ok: true, value: { netNames, line, reference } };
}

/** A builder that numbers nodes as parts name them and collects devices to build once all nodes are known. */
function circuitBuilder(reference: NetName) {
  const nodeNames: NetName[] = [];
  const nodeOf = new Map<NetName, number>([[reference, GROUND]]);
  // Branch unknowns are numbered after all nodes; devices are built once their count is known.
  const pending: Array<(branchBase: number) => CircuitDevice> = [];
  const counts = { branches: 0, mem: 0 };
  const gaps: Gap[] = [];
  const builder: CircuitBuilder = {
    node(net) {
      let i = nodeOf.get(net);
      if (i === undefined) {
        i = nodeNames.length;
        nodeNames.push(net);
        nodeOf.set(net, i);
      }
      return i;
    },
    innerNode(ref) {
      nodeNames.push(`${ref}#inner` as NetName);
      return nodeNames.length - 1;
    },
    add(type, windings, make, branches) {
      const mem = counts.mem;
      counts.mem += memFor(type, windings);
      const b0 = counts.branches;
      counts.branches += branches;
      pending.push((base) => make(mem, base + b0));
    },
    leaveOut(part, reason) {
      gaps.push({ part, reason });
    },
    assumptions: [] as Assumption[],
    notes: [] as string[],
  };
  const build = () => pending.map((make) => make(nodeNames.length));
  return { builder, nodeNames, gaps, counts, build };
}

/** Compiles a record at the given supply; structural problems come back as values. */
export function compileCircuit(rec: TeardownRecord, supply: Supply): SolverOutcome<Circuit> {
  const nets = supplyNets(rec);
  if (!nets.ok) return nets;
  const { netNames, line, reference } = nets.value;
  const { builder, nodeNames, gaps, counts, build } = circuitBuilder(reference);
  const usedNets = new Set<NetName>([line, reference]);
  builder.add(
    "supply",
    0,
    (mem, branch) => ({
      type: "supply",
      ref: SUPPLY_REF,
      terminals: [builder.node(line), GROUND],
      nets: [line, reference],
      mem,
      branch,
      vpk: supply.vrms * Math.SQRT2,
      hz: supply.hz,
      phase: 0,
    }),
    1,
  );
  for (const p of rec.parts) {
    if (!isKnownPart(p)) {
      builder.leaveOut(p.ref as PartRef, `unknown kind "${p.kind}"`);
      continue;
    }
    // A part left out simulates nothing: its nets count as used only through other parts.
    for (const n of compilePart(p, builder) ?? []) usedNets.add(n);
  }
  const nodeCount = nodeNames.length;
  const devices = build();
  for (const n of netNames)
    if (!usedNets.has(n))
      gaps.push({ net: n, reason: "no simulated part reaches it, so it has no figures" });

  const structural = checkStructure(devices, line, reference);
  if (structural !== null) return structural;
  const unknownOwner: Array<NetName | PartRef> = [...nodeNames];
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
      size: nodeCount + counts.branches,
      unknownOwner,
      devices,
      memSize: counts.mem,
      supply,
      gaps,
      assumptions: builder.assumptions,
      notes: builder.notes,
    },
  };
}
