/**
 * Time-domain device equations: companion models for the trapezoidal rule (or backward Euler
 * on a damped step), Newton linearisations with junction voltage limiting, terminal currents
 * for the figures, and the latch rules of thyristors and triacs.
 */
import type { CircuitDevice } from "./circuit-model.js";
import type { JunctionParams } from "./device-models.js";
import { OFF_STATE_OHMS } from "./device-models.js";
import type { MnaPattern } from "./mna.js";
import { addCurrent, nodeV } from "./mna.js";

/** Exponent beyond which the junction law is continued linearly (overflow guard, never reached after limiting in practice). */
const MAX_EXPONENT = 80;
/** A varistor's voltage may move freely up to this fraction of its clamping voltage in one Newton iteration... */
const VARISTOR_FREE_FRACTION = 0.8;
/** ...and beyond it by at most this fraction per iteration (the power law is steep). */
const VARISTOR_STEP_FRACTION = 0.05;
const G_OFF = 1 / OFF_STATE_OHMS;

/** What a stamp needs: the pattern, the matrix and right-hand side being built, the iterate, the memories. */
export interface StampContext {
  p: MnaPattern;
  vals: Float64Array;
  rhs: Float64Array;
  /** Newton iterate at t_{n+1}. */
  x: Float64Array;
  /** CircuitDevice memory accepted at t_n. */
  mem: Float64Array;
  /** CircuitDevice memory being built for t_{n+1} (junction voltages of the iterate). */
  work: Float64Array;
  h: number;
  trap: boolean;
  /** Time at the end of the step. */
  t: number;
}

/** Junction current and conductance at voltage v. */
export function junctionEval(j: JunctionParams, v: number): { i: number; g: number } {
  const out = { i: 0, g: 0 };
  junctionInto(j, v, out);
  return out;
}

/** Reused result of the junction law in the Newton loop (no allocation per evaluation). */
const scratch = { i: 0, g: 0 };

/** The junction law written into `out`. */
function junctionInto(j: JunctionParams, v: number, out: { i: number; g: number }): void {
  const a = v / j.vt;
  let i: number;
  let g: number;
  if (a > MAX_EXPONENT) {
    const e = Math.exp(MAX_EXPONENT);
    g = (j.is * e) / j.vt;
    i = j.is * (e - 1) + g * (v - MAX_EXPONENT * j.vt);
  } else {
    const e = Math.exp(a);
    i = j.is * (e - 1);
    g = (j.is * e) / j.vt;
  }
  if (j.breakdown) {
    const { bv, ib, vtb } = j.breakdown;
    const w = -(v + bv) / vtb;
    if (w > MAX_EXPONENT) {
      const e = Math.exp(MAX_EXPONENT);
      const gb = (ib * e) / vtb;
      i -= ib * e + gb * (-(v + bv) - MAX_EXPONENT * vtb);
      g += gb;
    } else {
      const e = Math.exp(w);
      i -= ib * e;
      g += (ib * e) / vtb;
    }
  }
  out.i = i;
  out.g = g;
}

/**
 * Junction voltage limiting after the classic method: above the critical voltage, a step is
 * replaced by the step of the logarithm of the current, so e^{v/vt} cannot explode.
 */
export function limitJunction(vNew: number, vOld: number, vt: number, is: number): number {
  const vcrit = vt * Math.log(vt / (Math.SQRT2 * is));
  if (vNew > vcrit && Math.abs(vNew - vOld) > 2 * vt) {
    if (vOld > 0) {
      const arg = 1 + (vNew - vOld) / vt;
      return arg > 0 ? vOld + vt * Math.log(arg) : vcrit;
    }
    return vt * Math.log(vNew / vt);
  }
  return vNew;
}

/** Limits forward conduction and (when set) reverse breakdown of a junction. */
function limitBoth(j: JunctionParams, vNew: number, vOld: number): number {
  let v = limitJunction(vNew, vOld, j.vt, j.is);
  if (j.breakdown) {
    const { bv, ib, vtb } = j.breakdown;
    v = -(limitJunction(-(v + bv), -(vOld + bv), vtb, ib) + bv);
  }
  return v;
}

/** Gate junction of a thyristor (one junction) or triac (an anti-parallel pair). */
export function gateEval(triac: boolean, j: JunctionParams, v: number): { i: number; g: number } {
  const f = junctionEval(j, v);
  if (!triac) return f;
  const r = junctionEval(j, -v);
  return { i: f.i - r.i, g: f.g + r.g };
}

/** Main path of a thyristor or triac: off is a high resistance, on is von in series with ron. */
export function mainEval(
  d: Extract<CircuitDevice, { type: "switching" }>,
  on: boolean,
  v: number,
): { i: number; g: number } {
  let i = G_OFF * v;
  let g = G_OFF;
  if (on) {
    const { von, ron } = d.p;
    if (v > von) {
      i += (v - von) / ron;
      g += 1 / ron;
    } else if (d.triac && v < -von) {
      i += (v + von) / ron;
      g += 1 / ron;
    }
  }
  return { i, g };
}

/** Varistor power law I = i0 sign(V) (|V|/vc)^alpha. */
export function varistorEval(
  d: Extract<CircuitDevice, { type: "varistor" }>,
  v: number,
): { i: number; g: number } {
  const u = Math.abs(v) / d.vc;
  const pow = Math.pow(u, d.alpha - 1);
  return { i: Math.sign(v) * d.i0 * pow * u, g: (d.alpha * d.i0 * pow) / d.vc };
}

/**
 * The pattern slots a device stamps into, in a fixed order per type (-1 for a ground row or
 * column), looked up once per circuit so the stamps in the Newton loop are plain array writes.
 * A two-terminal block (a, b) is [aa, bb, ab, ba].
 */
export function deviceSlots(p: MnaPattern, d: CircuitDevice): Int32Array {
  const t = d.terminals;
  const out: number[] = [];
  const at = (r: number, c: number) => out.push(r < 0 || c < 0 ? -1 : p.slot(r, c));
  const block = (a: number, b: number) => {
    at(a, a);
    at(b, b);
    at(a, b);
    at(b, a);
  };
  switch (d.type) {
    case "conductance":
    case "capacitor":
    case "varistor":
      block(t[0]!, t[1]!);
      break;
    case "short":
    case "supply":
      at(t[0]!, d.branch);
      at(t[1]!, d.branch);
      at(d.branch, t[0]!);
      at(d.branch, t[1]!);
      break;
    case "coupled":
      d.branches.forEach((b, w) => {
        at(t[2 * w]!, b);
        at(t[2 * w + 1]!, b);
        at(b, t[2 * w]!);
        at(b, t[2 * w + 1]!);
        for (const b2 of d.branches) at(b, b2);
      });
      break;
    case "junction":
      if (d.inner !== t[0]) block(t[0]!, d.inner);
      else out.push(-1, -1, -1, -1);
      block(d.inner, t[1]!);
      break;
    case "switching":
      block(t[1]!, t[2]!);
      block(t[0]!, t[2]!);
      break;
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
  return Int32Array.from(out);
}

/** Adds conductance g to the block of four slots starting at `o`. */
function blockAdd(vals: Float64Array, sl: Int32Array, o: number, g: number): void {
  let s = sl[o]!;
  if (s >= 0) vals[s]! += g;
  s = sl[o + 1]!;
  if (s >= 0) vals[s]! += g;
  s = sl[o + 2]!;
  if (s >= 0) vals[s]! -= g;
  s = sl[o + 3]!;
  if (s >= 0) vals[s]! -= g;
}

function slotAdd(vals: Float64Array, s: number, v: number): void {
  if (s >= 0) vals[s]! += v;
}

/** True for the devices whose stamp depends on the Newton iterate. */
export function isNonlinear(d: CircuitDevice): boolean {
  return d.type === "junction" || d.type === "varistor" || d.type === "switching";
}

/**
 * The matrix entries that depend only on the step (h, trap): every linear device, and the series
 * resistance of a junction. Stamped once per step size and copied into each Newton iteration.
 */
export function stampLinearMatrix(
  d: CircuitDevice,
  sl: Int32Array,
  vals: Float64Array,
  h: number,
  trap: boolean,
): void {
  switch (d.type) {
    case "conductance":
      blockAdd(vals, sl, 0, d.g);
      return;
    case "short":
      slotAdd(vals, sl[0]!, 1);
      slotAdd(vals, sl[1]!, -1);
      slotAdd(vals, sl[2]!, 1);
      slotAdd(vals, sl[3]!, -1);
      return;
    case "supply":
      slotAdd(vals, sl[0]!, -1);
      slotAdd(vals, sl[2]!, 1);
      return;
    case "capacitor":
      blockAdd(vals, sl, 0, ((trap ? 2 : 1) * d.c) / h);
      return;
    case "coupled": {
      const alpha = (trap ? 2 : 1) / h;
      const nw = d.branches.length;
      for (let w = 0; w < nw; w++) {
        const o = w * (4 + nw);
        slotAdd(vals, sl[o]!, 1);
        slotAdd(vals, sl[o + 1]!, -1);
        slotAdd(vals, sl[o + 2]!, 1);
        slotAdd(vals, sl[o + 3]!, -1);
        slotAdd(vals, sl[o + 4 + w]!, -d.r[w]!);
        for (let k = 0; k < nw; k++) slotAdd(vals, sl[o + 4 + k]!, -alpha * d.l[w]![k]!);
      }
      return;
    }
    case "junction":
      if (d.inner !== d.terminals[0]) blockAdd(vals, sl, 0, 1 / d.rs);
      return;
    case "varistor":
    case "switching":
      return;
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
}

/** The right-hand side of a linear device at a step: the supply at time t, the companion histories. */
export function stampLinearRhs(
  d: CircuitDevice,
  rhs: Float64Array,
  mem: Float64Array,
  h: number,
  trap: boolean,
  t: number,
): void {
  switch (d.type) {
    case "supply":
      rhs[d.branch] = d.vpk * Math.sin(2 * Math.PI * d.hz * t + d.phase);
      return;
    case "capacitor": {
      const geq = ((trap ? 2 : 1) * d.c) / h;
      const ieq = geq * mem[d.mem]! + (trap ? mem[d.mem + 1]! : 0);
      addCurrent(rhs, d.terminals[1]!, d.terminals[0]!, ieq);
      return;
    }
    case "coupled": {
      const alpha = (trap ? 2 : 1) / h;
      const nw = d.branches.length;
      for (let w = 0; w < nw; w++) {
        let hist = 0;
        for (let k = 0; k < nw; k++) hist += d.l[w]![k]! * mem[d.mem + 2 * k]!;
        rhs[d.branches[w]!] = -alpha * hist - (trap ? mem[d.mem + 2 * w + 1]! : 0);
      }
      return;
    }
    default:
      return;
  }
}

/** Stamps the iterate-dependent part of a nonlinear device; returns true when a voltage was limited. */
export function stampNonlinear(d: CircuitDevice, sl: Int32Array, c: StampContext): boolean {
  const { vals, rhs, x, mem, work } = c;
  const t = d.terminals;
  switch (d.type) {
    case "junction": {
      const vRaw = nodeV(x, d.inner) - nodeV(x, t[1]!);
      const v = limitBoth(d.j, vRaw, work[d.mem]!);
      work[d.mem] = v;
      junctionInto(d.j, v, scratch);
      const g = scratch.g;
      blockAdd(vals, sl, 4, g);
      addCurrent(rhs, d.inner, t[1]!, scratch.i - g * v);
      return Math.abs(v - vRaw) > 1e-12;
    }
    case "varistor": {
      const vRaw = nodeV(x, t[0]!) - nodeV(x, t[1]!);
      const vOld = work[d.mem]!;
      let v = vRaw;
      const knee = VARISTOR_FREE_FRACTION * d.vc;
      if (Math.abs(v) > knee && Math.abs(v) > Math.abs(vOld) + VARISTOR_STEP_FRACTION * d.vc) {
        v = Math.sign(v) * Math.max(knee, Math.abs(vOld) + VARISTOR_STEP_FRACTION * d.vc);
      }
      work[d.mem] = v;
      const { i, g } = varistorEval(d, v);
      blockAdd(vals, sl, 0, g);
      addCurrent(rhs, t[0]!, t[1]!, i - g * v);
      return v !== vRaw;
    }
    case "switching": {
      const on = mem[d.mem]! > 0.5;
      const vgRaw = nodeV(x, t[1]!) - nodeV(x, t[2]!);
      const vgOld = work[d.mem + 1]!;
      // Limit the gate junction on the side that conducts (both sides for a triac).
      const vg =
        vgRaw >= 0 || !d.triac
          ? limitJunction(vgRaw, vgOld, d.p.gate.vt, d.p.gate.is)
          : -limitJunction(-vgRaw, -vgOld, d.p.gate.vt, d.p.gate.is);
      work[d.mem + 1] = vg;
      const ge = gateEval(d.triac, d.p.gate, vg);
      blockAdd(vals, sl, 0, ge.g);
      addCurrent(rhs, t[1]!, t[2]!, ge.i - ge.g * vg);
      const vm = nodeV(x, t[0]!) - nodeV(x, t[2]!);
      work[d.mem + 2] = vm;
      const me = mainEval(d, on, vm);
      blockAdd(vals, sl, 4, me.g);
      addCurrent(rhs, t[0]!, t[2]!, me.i - me.g * vm);
      return Math.abs(vg - vgRaw) > 1e-12;
    }
    default:
      return false;
  }
}

/** Stamps one device; returns true when a voltage was limited (the iterate is not final). */
export function stampDevice(d: CircuitDevice, c: StampContext): boolean {
  const sl = deviceSlots(c.p, d);
  stampLinearMatrix(d, sl, c.vals, c.h, c.trap);
  stampLinearRhs(d, c.rhs, c.mem, c.h, c.trap, c.t);
  return stampNonlinear(d, sl, c);
}

/** After convergence: the memory of t_{n+1} (capacitor current, winding voltage, junction voltages). */
export function commitDevice(d: CircuitDevice, c: StampContext): void {
  const { x, mem, work } = c;
  const t = d.terminals;
  switch (d.type) {
    case "capacitor": {
      const v = nodeV(x, t[0]!) - nodeV(x, t[1]!);
      const geq = ((c.trap ? 2 : 1) * d.c) / c.h;
      const ieq = geq * mem[d.mem]! + (c.trap ? mem[d.mem + 1]! : 0);
      work[d.mem] = v;
      work[d.mem + 1] = geq * v - ieq;
      return;
    }
    case "coupled":
      d.branches.forEach((b, w) => {
        const i = x[b]!;
        work[d.mem + 2 * w] = i;
        work[d.mem + 2 * w + 1] = nodeV(x, t[2 * w]!) - nodeV(x, t[2 * w + 1]!) - d.r[w]! * i;
      });
      return;
    case "junction":
      work[d.mem] = nodeV(x, d.inner) - nodeV(x, t[1]!);
      return;
    case "varistor":
      work[d.mem] = nodeV(x, t[0]!) - nodeV(x, t[1]!);
      return;
    case "switching":
      work[d.mem + 1] = nodeV(x, t[1]!) - nodeV(x, t[2]!);
      work[d.mem + 2] = nodeV(x, t[0]!) - nodeV(x, t[2]!);
      return;
    default:
      return;
  }
}

/** Current into each external terminal at an accepted point (memory of that point). */
export function terminalCurrents(d: CircuitDevice, x: Float64Array, mem: Float64Array): number[] {
  const t = d.terminals;
  const v = (k: number) => nodeV(x, t[k]!);
  switch (d.type) {
    case "conductance": {
      const i = d.g * (v(0) - v(1));
      return [i, -i];
    }
    case "short":
      return [x[d.branch]!, -x[d.branch]!];
    case "supply":
      return [-x[d.branch]!, x[d.branch]!];
    case "capacitor":
      return [mem[d.mem + 1]!, -mem[d.mem + 1]!];
    case "coupled":
      return d.branches.flatMap((b) => [x[b]!, -x[b]!]);
    case "junction": {
      const i =
        d.inner !== t[0] ? (v(0) - nodeV(x, d.inner)) / d.rs : junctionEval(d.j, v(0) - v(1)).i;
      return [i, -i];
    }
    case "varistor": {
      const i = varistorEval(d, v(0) - v(1)).i;
      return [i, -i];
    }
    case "switching": {
      const { main, gate } = switchingCurrents(d, x, mem);
      return [main, gate, -(main + gate)];
    }
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
}

/** Main and gate current of a thyristor or triac at a solution, with its latch from `mem`. */
export function switchingCurrents(
  d: Extract<CircuitDevice, { type: "switching" }>,
  x: Float64Array,
  mem: Float64Array,
): { main: number; gate: number; vMain: number } {
  const t = d.terminals;
  const vMain = nodeV(x, t[0]!) - nodeV(x, t[2]!);
  const main = mainEval(d, mem[d.mem]! > 0.5, vMain).i;
  const gate = gateEval(d.triac, d.p.gate, nodeV(x, t[1]!) - nodeV(x, t[2]!)).i;
  return { main, gate, vMain };
}

/**
 * Latch rule and its event function. Off: fires when the gate current reaches igt (either
 * sign for a triac) with a thyristor forward biased. On: stays on while the main current
 * exceeds ih or the gate still carries igt. The event value crosses zero upwards at the change.
 */
export function latchEvent(
  d: Extract<CircuitDevice, { type: "switching" }>,
  x: Float64Array,
  mem: Float64Array,
): { flip: boolean; value: number } {
  const on = mem[d.mem]! > 0.5;
  const { main, gate, vMain } = switchingCurrents(d, x, mem);
  const g = d.triac ? Math.abs(gate) : gate;
  if (!on) {
    const value = g - d.p.igt;
    return { flip: value >= 0 && (d.triac || vMain > 0), value };
  }
  const value = d.p.ih - (d.triac ? Math.abs(main) : main);
  return { flip: value > 0 && g < d.p.igt, value };
}
