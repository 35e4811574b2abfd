/**
 * AC steady state with complex phasors at the supply frequency: the linear view of the circuit
 * (dropper reactance and current, divider ratios). Nonlinear parts are linearised as open:
 * diodes, zeners, LEDs, varistors and the thyristor/triac gate junctions and main paths are the
 * off-state resistance (1 GΩ); a series rs stays in place. The complex system is solved as the
 * real system [[G, -B], [B, G]] with the same sparse LU as the transient.
 * Phasors are peak values with v(t) = Im(V e^{jωt}), so the supply is V = vpk at angle 0.
 */
import type { Supply, TeardownRecord } from "../record/types.js";
import type { Circuit, CircuitDevice } from "./circuit-model.js";
import { compileCircuit } from "./circuit-model.js";
import { OFF_STATE_OHMS } from "./device-models.js";
import type { LuChoice } from "./mna.js";
import { GMIN_SIEMENS, MnaPattern } from "./mna.js";
import type { SolverOutcome } from "./solver-error.js";
import { solverFailure } from "./solver-error.js";

/** A phasor (peak) with its RMS magnitude and phase. */
export interface Phasor {
  re: number;
  im: number;
  rms: number;
  phase_deg: number;
}

/** The linear view at one supply. */
export interface AcSolution {
  supply: Supply;
  input_current: Phasor;
  nets: Record<string, Phasor>;
  /** Current into each part's first pin (thyristor anode, triac MT2, transformer p1). */
  parts: Record<string, Phasor>;
  /** Parts linearised as open (their off-state resistance). */
  linearised: string[];
}

function phasor(re: number, im: number): Phasor {
  return {
    re,
    im,
    rms: Math.hypot(re, im) / Math.SQRT2,
    phase_deg: (Math.atan2(im, re) * 180) / Math.PI,
  };
}

const G_OPEN = 1 / OFF_STATE_OHMS;

/** Solves the compiled circuit in phasors. */
export function solveAcCircuit(c: Circuit, lu: LuChoice = "sparse"): SolverOutcome<AcSolution> {
  const solved = phasorUnknowns(c, lu);
  if (!solved.ok) return solved;
  const { x, linearised } = solved.value;
  const n = c.size;
  const w = 2 * Math.PI * c.supply.hz;
  const v = (node: number): [number, number] => (node < 0 ? [0, 0] : [x[node]!, x[node + n]!]);
  const nets: Record<string, Phasor> = { [c.reference]: phasor(0, 0) };
  c.nodeNames.forEach((name, i) => {
    if (!name.includes("#")) nets[name] = phasor(x[i]!, x[i + n]!);
  });
  const parts: Record<string, Phasor> = {};
  let input = phasor(0, 0);
  for (const d of c.devices) {
    const cur = acCurrent(d, v, x, n, w);
    if (d.type === "supply") input = phasor(cur[0], cur[1]);
    else parts[d.ref] = phasor(cur[0], cur[1]);
  }
  return { ok: true, value: { supply: c.supply, input_current: input, nets, parts, linearised } };
}

/**
 * The start of the transient's first cycle taken from the phasor solution: every winding's
 * current at t = 0 (the imaginary part of its phasor). A winding started from zero against a
 * sine supply carries a DC flux offset of V/(ωL) that only its own resistance takes away, over
 * L/R (minutes for a mains transformer), so the cycles would never settle; started on its AC
 * orbit it has no offset to lose (only windings with L/R above a cycle need it). Capacitors keep their power-on zero: behind a rectifier the
 * linear view says nothing about their DC charge.
 */
export function windingStartMem(c: Circuit, lu: LuChoice = "sparse"): SolverOutcome<Float64Array> {
  const solved = phasorUnknowns(c, lu);
  if (!solved.ok) return solved;
  const { x } = solved.value;
  const n = c.size;
  const mem = new Float64Array(c.memSize);
  const period = 1 / c.supply.hz;
  for (const d of c.devices) {
    if (d.type !== "coupled") continue;
    // A winding whose offset dies within a cycle or two (a pulse transformer) keeps its
    // power-on start: the cycles settle it anyway, and a relaxation trigger behind it would
    // be sent down another transient to another (equally valid) firing pattern.
    const slow = d.branches.some((_, k) => d.l[k]![k]! > d.r[k]! * period);
    if (slow) d.branches.forEach((b, k) => (mem[d.mem + 2 * k] = x[b + n]!));
  }
  return { ok: true, value: mem };
}

/** The phasor system's solution: real parts at [0, n), imaginary parts at [n, 2n). */
function phasorUnknowns(
  c: Circuit,
  lu: LuChoice,
): SolverOutcome<{ x: Float64Array; linearised: string[] }> {
  const n = c.size;
  const p = new MnaPattern(2 * n);
  const entries: Array<[number, number, number, number]> = []; // row, col, G, B
  const add = (r: number, col: number, g: number, b: number) => {
    if (r >= 0 && col >= 0) entries.push([r, col, g, b]);
  };
  const admittance = (a: number, b: number, g: number, bb: number) => {
    add(a, a, g, bb);
    add(b, b, g, bb);
    add(a, b, -g, -bb);
    add(b, a, -g, -bb);
  };
  const rhs = new Float64Array(2 * n);
  const w = 2 * Math.PI * c.supply.hz;
  const linearised: string[] = [];
  for (let i = 0; i < c.nodeCount; i++) add(i, i, GMIN_SIEMENS, 0);
  for (const d of c.devices) {
    const t = d.terminals;
    switch (d.type) {
      case "conductance":
        admittance(t[0]!, t[1]!, d.g, 0);
        break;
      case "capacitor":
        admittance(t[0]!, t[1]!, 0, w * d.c);
        break;
      case "short":
      case "supply": {
        const sign = d.type === "supply" ? -1 : 1;
        add(t[0]!, d.branch, sign, 0);
        if (d.type === "short") add(t[1]!, d.branch, -1, 0);
        add(d.branch, t[0]!, 1, 0);
        add(d.branch, t[1]!, -1, 0);
        if (d.type === "supply") rhs[d.branch] = d.vpk;
        break;
      }
      case "coupled":
        d.branches.forEach((b, k) => {
          add(t[2 * k]!, b, 1, 0);
          add(t[2 * k + 1]!, b, -1, 0);
          add(b, t[2 * k]!, 1, 0);
          add(b, t[2 * k + 1]!, -1, 0);
          add(b, b, -d.r[k]!, 0);
          d.branches.forEach((b2, q) => add(b, b2, 0, -w * d.l[k]![q]!));
        });
        break;
      case "junction":
        if (d.inner !== t[0]) admittance(t[0]!, d.inner, 1 / d.rs, 0);
        admittance(d.inner, t[1]!, G_OPEN, 0);
        linearised.push(d.ref);
        break;
      case "varistor":
        admittance(t[0]!, t[1]!, G_OPEN, 0);
        linearised.push(d.ref);
        break;
      case "switching":
        admittance(t[0]!, t[2]!, G_OPEN, 0);
        admittance(t[1]!, t[2]!, G_OPEN, 0);
        linearised.push(d.ref);
        break;
      default: {
        const never: never = d;
        throw new Error(`unhandled device ${String(never)}`);
      }
    }
  }
  for (const [r, col] of entries) {
    p.reserve(r, col);
    p.reserve(r, col + n);
    p.reserve(r + n, col);
    p.reserve(r + n, col + n);
  }
  const vals = new Float64Array(p.count);
  for (const [r, col, g, b] of entries) {
    vals[p.slot(r, col)]! += g;
    vals[p.slot(r, col + n)]! -= b;
    vals[p.slot(r + n, col)]! += b;
    vals[p.slot(r + n, col + n)]! += g;
  }
  const solver = p.solver(lu);
  const status = solver.factor(vals);
  if (!status.ok) {
    const owner = c.unknownOwner[status.singularUnknown % n] ?? "an unknown";
    return solverFailure("singular-matrix", `the phasor matrix is singular at ${owner}`, {
      nets: [owner],
    });
  }
  return { ok: true, value: { x: solver.solve(rhs), linearised } };
}

function acCurrent(
  d: CircuitDevice,
  v: (n: number) => [number, number],
  x: Float64Array,
  n: number,
  w: number,
): [number, number] {
  const t = d.terminals;
  const across = (a: number, b: number): [number, number] => {
    const [ar, ai] = v(a);
    const [br, bi] = v(b);
    return [ar - br, ai - bi];
  };
  switch (d.type) {
    case "conductance": {
      const [r, i] = across(t[0]!, t[1]!);
      return [d.g * r, d.g * i];
    }
    case "capacitor": {
      const [r, i] = across(t[0]!, t[1]!);
      return [-w * d.c * i, w * d.c * r];
    }
    case "short":
    case "supply":
      return [x[d.branch]!, x[d.branch + n]!];
    case "coupled":
      return [x[d.branches[0]!]!, x[d.branches[0]! + n]!];
    case "junction": {
      const [r, i] = across(d.inner, t[1]!);
      return [G_OPEN * r, G_OPEN * i];
    }
    case "varistor":
    case "switching": {
      const [r, i] = across(t[0]!, d.type === "varistor" ? t[1]! : t[2]!);
      return [G_OPEN * r, G_OPEN * i];
    }
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
}

/** The linear view of a record at a supply (the record's rated supply when none is given). */
export function solveAcPhasor(
  rec: TeardownRecord,
  opts: { supply?: Supply } = {},
): SolverOutcome<AcSolution> {
  const compiled = compileCircuit(rec, opts.supply ?? rec.device.rated_supply);
  if (!compiled.ok) return compiled;
  return solveAcCircuit(compiled.value);
}
