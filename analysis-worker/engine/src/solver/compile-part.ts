/**
 * One part of a record compiled into the solver's devices: an exhaustive switch over the known
 * kinds (the compiler checks every kind is handled), each kind's model with its defaults reported
 * as assumptions, and a part that cannot be simulated left out with the reason (a gap).
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { KnownPart } from "../record/types.js";
import { kindInfo } from "../graph/kinds.js";
import type { NetName, PartRef } from "../record/types.js";
import type { CircuitDevice } from "./circuit-model.js";
import type { JunctionParams } from "./device-models.js";
import {
  FUSE_DEFAULT_OHMS,
  OFF_STATE_OHMS,
  SWITCH_CLOSED_OHMS,
  diodeModel,
  ledModel,
  param,
  switchingModel,
  transformerModel,
  varistorModel,
  zenerModel,
} from "./device-models.js";

/** What compiling one part may do: name nodes, add devices, leave the part out, report defaults. */
export interface CircuitBuilder {
  /** The node index of a net, numbering it on first use. */
  node(net: NetName): number;
  /** A new internal node of a part (a junction's series resistance), named `REF#inner`. */
  innerNode(ref: PartRef): number;
  /**
   * Adds a device: `make` gets its memory offset and first branch unknown (branches are
   * numbered after every node, so devices are built once all parts are compiled).
   */
  add(
    type: CircuitDevice["type"],
    windings: number,
    make: (mem: number, branch: number) => CircuitDevice,
    branches: number,
  ): void;
  leaveOut(part: PartRef, reason: string): void;
  assumptions: Assumption[];
  notes: string[];
}

/** The nets of a part's pins in the kind's terminal order, or null when a pin is not connected. */
function pinNets(p: KnownPart): NetName[] | null {
  const roles =
    p.kind === "capacitor" && p.polarised ? ["plus", "minus"] : (kindInfo(p.kind)?.pins ?? []);
  const nets = roles.map((r) => p.pins[r]);
  return nets.some((n) => n === undefined) ? null : (nets as NetName[]);
}

/** Compiles one part; returns the nets it simulates, or null when it was left out (a gap) or is documentation only. */
export function compilePart(p: KnownPart, b: CircuitBuilder): NetName[] | null {
  const ref = p.ref as PartRef;
  // Connectors and test points carry nothing the figures depend on: not a gap.
  if (kindInfo(p.kind)?.documentationOnly) return null;
  const nets = pinNets(p);
  if (nets === null) {
    b.leaveOut(ref, "a pin is not connected");
    return null;
  }
  const t = nets.map((n) => b.node(n));
  const base = { ref, terminals: t, nets };
  const conductance = (g: number) =>
    b.add("conductance", 0, (mem) => ({ ...base, mem, type: "conductance", g }), 0);
  const resistance = (r: number) =>
    r > 0
      ? conductance(1 / r)
      : b.add("short", 0, (mem, branch) => ({ ...base, mem, type: "short", branch }), 1);
  const capacitance = (c: number) =>
    b.add("capacitor", 0, (mem) => ({ ...base, mem, type: "capacitor", c }), 0);
  const junction = (m: { j: JunctionParams; rs: number }) => {
    const inner = m.rs > 0 ? b.innerNode(ref) : t[0]!;
    b.add("junction", 0, (mem) => ({ ...base, mem, type: "junction", inner, rs: m.rs, j: m.j }), 0);
  };
  const leaveOut = (reason: string) => {
    b.leaveOut(ref, reason);
    return null;
  };
  switch (p.kind) {
    case "resistor":
      if (p.value === null) return leaveOut("a resistor without a value");
      if (p.value === 0) b.notes.push(`${ref}: 0 Ω, modelled as an ideal link (a 0 V source)`);
      resistance(p.value);
      return nets;
    case "fuse":
      resistance(
        param(
          p,
          "r",
          FUSE_DEFAULT_OHMS,
          b.assumptions,
          "cold resistance not in the record; a small fuse's value",
        ),
      );
      return nets;
    case "switch": {
      const r = p.closed ? SWITCH_CLOSED_OHMS : OFF_STATE_OHMS;
      b.assumptions.push({
        part: ref,
        field: "model.r",
        value: r,
        why: p.closed
          ? "a closed contact taken as this small resistance"
          : "an open contact taken as this large resistance",
      });
      conductance(1 / r);
      return nets;
    }
    case "capacitor":
      if (p.value === null) return leaveOut("a capacitor without a value");
      capacitance(p.value);
      return nets;
    case "load":
      // A load's value lives in its model: a resistance, else a capacitance.
      if (p.model.r !== undefined) resistance(p.model.r);
      else if (p.model.c !== undefined) capacitance(p.model.c);
      else return leaveOut("load without a resistance or capacitance (model.r or model.c)");
      return nets;
    case "inductor": {
      if (p.value === null) return leaveOut("an inductor without a value");
      const l = p.value;
      const r = param(
        p,
        "r",
        0,
        b.assumptions,
        "winding resistance not in the record; taken as none",
      );
      b.add(
        "coupled",
        1,
        (mem, branch) => ({ ...base, mem, type: "coupled", branches: [branch], r: [r], l: [[l]] }),
        1,
      );
      return nets;
    }
    case "transformer": {
      const m = transformerModel(p, b.assumptions);
      b.add(
        "coupled",
        2,
        (mem, branch) => ({
          ...base,
          mem,
          type: "coupled",
          branches: [branch, branch + 1],
          r: [m.rp, m.rs],
          l: [
            [m.lp, m.m],
            [m.m, m.ls],
          ],
        }),
        2,
      );
      return nets;
    }
    case "diode":
      junction(diodeModel(p, b.assumptions));
      return nets;
    case "zener":
      junction(zenerModel(p, b.assumptions));
      return nets;
    case "led":
      junction(ledModel(p, b.assumptions));
      return nets;
    case "varistor": {
      const m = varistorModel(p, b.assumptions);
      b.add("varistor", 0, (mem) => ({ ...base, mem, type: "varistor", ...m }), 0);
      return nets;
    }
    case "thyristor": {
      // Terminal order for the switching model: main+, gate, main- (anode, gate, cathode).
      const sp = switchingModel(p, false, b.assumptions);
      b.add("switching", 0, (mem) => ({ ...base, mem, type: "switching", triac: false, p: sp }), 0);
      return nets;
    }
    case "triac": {
      // Record order is mt1, mt2, gate; the model wants mt2 (main+), gate, mt1 (reference).
      const sp = switchingModel(p, true, b.assumptions);
      const order = [1, 2, 0];
      b.add(
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
      return nets;
    }
    case "connector":
    case "testpoint":
      return null; // documentation only, returned above
    default: {
      const unhandled: never = p;
      throw new Error(`no compile step for the kind of ${(unhandled as KnownPart).ref}`);
    }
  }
}
