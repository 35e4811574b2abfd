/**
 * Time-domain device equations: companion models for the trapezoidal rule (or backward Euler
 * on a damped step), Newton linearisations with junction voltage limiting, terminal currents
 * for the figures, and the latch rules of thyristors and triacs.
 */
import type { CircuitDevice } from "./circuit-model.js";
import type { JunctionParams } from "./device-models.js";
import { OFF_STATE_OHMS } from "./device-models.js";
import type { MnaPattern } from "./mna.js";
import { addAt, addConductance, addCurrent, nodeV } from "./mna.js";

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
  return { i, g };
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
export function mainEval(d: Extract<CircuitDevice, { type: "switching" }>, on: boolean, v: number): { i: number; g: number } {
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
export function varistorEval(d: Extract<CircuitDevice, { type: "varistor" }>, v: number): { i: number; g: number } {
  const u = Math.abs(v) / d.vc;
  const pow = Math.pow(u, d.alpha - 1);
  return { i: Math.sign(v) * d.i0 * pow * u, g: (d.alpha * d.i0 * pow) / d.vc };
}

/** Stamps one device; returns true when a voltage was limited (the iterate is not final). */
export function stampDevice(d: CircuitDevice, c: StampContext): boolean {
  const { p, vals, rhs, x, mem, work } = c;
  const t = d.terminals;
  switch (d.type) {
    case "conductance":
      addConductance(p, vals, t[0]!, t[1]!, d.g);
      return false;
    case "short":
      addAt(p, vals, t[0]!, d.branch, 1);
      addAt(p, vals, t[1]!, d.branch, -1);
      addAt(p, vals, d.branch, t[0]!, 1);
      addAt(p, vals, d.branch, t[1]!, -1);
      return false;
    case "supply":
      addAt(p, vals, t[0]!, d.branch, -1);
      addAt(p, vals, d.branch, t[0]!, 1);
      rhs[d.branch] = d.vpk * Math.sin(2 * Math.PI * d.hz * c.t);
      return false;
    case "capacitor": {
      const geq = ((c.trap ? 2 : 1) * d.c) / c.h;
      const ieq = geq * mem[d.mem]! + (c.trap ? mem[d.mem + 1]! : 0);
      addConductance(p, vals, t[0]!, t[1]!, geq);
      addCurrent(rhs, t[1]!, t[0]!, ieq);
      return false;
    }
    case "coupled": {
      const alpha = (c.trap ? 2 : 1) / c.h;
      d.branches.forEach((b, w) => {
        addAt(p, vals, t[2 * w]!, b, 1);
        addAt(p, vals, t[2 * w + 1]!, b, -1);
        addAt(p, vals, b, t[2 * w]!, 1);
        addAt(p, vals, b, t[2 * w + 1]!, -1);
        addAt(p, vals, b, b, -d.r[w]!);
        let hist = 0;
        d.branches.forEach((b2, k) => {
          addAt(p, vals, b, b2, -alpha * d.l[w]![k]!);
          hist += d.l[w]![k]! * mem[d.mem + 2 * k]!;
        });
        rhs[b] = -alpha * hist - (c.trap ? mem[d.mem + 2 * w + 1]! : 0);
      });
      return false;
    }
    case "junction": {
      if (d.inner !== t[0]) addConductance(p, vals, t[0]!, d.inner, 1 / d.rs);
      const vRaw = nodeV(x, d.inner) - nodeV(x, t[1]!);
      const v = limitBoth(d.j, vRaw, work[d.mem]!);
      work[d.mem] = v;
      const { i, g } = junctionEval(d.j, v);
      addConductance(p, vals, d.inner, t[1]!, g);
      addCurrent(rhs, d.inner, t[1]!, i - g * v);
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
      addConductance(p, vals, t[0]!, t[1]!, g);
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
      addConductance(p, vals, t[1]!, t[2]!, ge.g);
      addCurrent(rhs, t[1]!, t[2]!, ge.i - ge.g * vg);
      const vm = nodeV(x, t[0]!) - nodeV(x, t[2]!);
      work[d.mem + 2] = vm;
      const me = mainEval(d, on, vm);
      addConductance(p, vals, t[0]!, t[2]!, me.g);
      addCurrent(rhs, t[0]!, t[2]!, me.i - me.g * vm);
      return Math.abs(vg - vgRaw) > 1e-12;
    }
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
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
      const i = d.inner !== t[0] ? (v(0) - nodeV(x, d.inner)) / d.rs : junctionEval(d.j, v(0) - v(1)).i;
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
