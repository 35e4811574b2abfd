/**
 * bleeder-missing and bleeder-slow: what stays charged across the plug pins after unplugging.
 * The capacitance the pins present is read off the steady cycle (the part of the line current's
 * fundamental that leads the supply by 90°, divided by ωV̂); above 0.1 µF the unplugging is
 * simulated at both supply peaks and the worse one is judged against 34 V at 1 s (IEC 60335-1
 * 22.5) and τ ≤ 1 s (IEC 60950-1 2.1.1.7, type A). A pin capacitance at or below 0.1 µF is noted
 * as "rule does not apply".
 */
import type { Flag } from "./flag-types.js";
import { cite } from "./citations.js";
import { ev, evYes } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";
import {
  DISCHARGE_CAPACITANCE_THRESHOLD_F,
  MISSING_BLEEDER_MIN_TIME_CONSTANT_S,
  PIN_VOLTAGE_DELAY_S,
  PIN_VOLTAGE_LIMIT_V,
  TYPE_A_MAX_TIME_CONSTANT_S,
  dischargeVerdicts,
  equivalentTimeConstant,
  maxTimeConstantFor,
} from "./discharge-rules.js";

/** Capacitors on the supply side: in series in a supply chain or straight across the mains nets. */
function supplyCapacitors(ctx: RiskContext): string[] {
  const inChains = [...ctx.seriesCapacitors];
  const across = ctx.record.parts
    .filter((p) => p.kind === "capacitor")
    .filter((p) => {
      const [a, b] = Object.values(p.pins);
      const l = ctx.paths.mainsLine;
      const nn = ctx.paths.mainsNeutral;
      return (
        a !== undefined && b !== undefined && ((l.has(a) && nn.has(b)) || (l.has(b) && nn.has(a)))
      );
    })
    .map((p) => p.ref);
  return [...new Set([...inChains, ...across])].sort();
}

/** The discharge flags of a plug-connected circuit. */
export function bleederFlags(ctx: RiskContext): Flag[] {
  if (ctx.solved === null || ctx.paths.lineNets.length === 0 || ctx.paths.neutralNets.length === 0)
    return [];
  const cPins = ctx.variants.pinCapacitanceF;
  if (cPins <= DISCHARGE_CAPACITANCE_THRESHOLD_F) {
    ctx.notes.push(
      `discharge: the pins present ${sig3(cPins * 1e6)} µF, not above 0.1 µF, so the pin-voltage rules do not apply`,
    );
    return [];
  }
  const sim = ctx.variants.unplug;
  if (sim === null) return [];
  if (!sim.ok) {
    ctx.notes.push(
      `discharge: the unplugging run failed (${sim.error.code}: ${sim.error.message}); no discharge flag was computed`,
    );
    return [];
  }
  const worstRun = sim.value.reduce((a, b) =>
    Math.abs(b.v_after_v) > Math.abs(a.v_after_v) ? b : a,
  );
  // The single time constant that gives the same decay over the delay.
  const worst = {
    ...worstRun,
    tau_s: equivalentTimeConstant(worstRun.v0_v, worstRun.v_after_v, worstRun.delay_s),
  };
  const verdict = dischargeVerdicts(worst.v_after_v, worst.tau_s);
  const missing = worst.tau_s >= MISSING_BLEEDER_MIN_TIME_CONSTANT_S;
  if (!missing && !verdict.exceeds_pin_limit && !verdict.exceeds_type_a_tau) return [];
  const parts = supplyCapacitors(ctx);
  const tauText = Number.isFinite(worst.tau_s) ? `${sig3(worst.tau_s)} s` : "no decay";
  const tauMax = maxTimeConstantFor(Math.abs(worst.v0_v), PIN_VOLTAGE_LIMIT_V, PIN_VOLTAGE_DELAY_S);
  return [
    {
      code: missing ? "bleeder-missing" : "bleeder-slow",
      severity: missing ? "danger" : "warning",
      parts,
      nets: [...ctx.paths.lineNets, ...ctx.paths.neutralNets],
      message: missing
        ? `Nothing discharges the ${sig3(cPins * 1e6)} µF the plug pins present: unplugged at the ${worst.instant}, they still hold ${sig3(Math.abs(worst.v_after_v))} V after 1 s.`
        : `The discharge is slow: unplugged at the ${worst.instant}, the pins hold ${sig3(Math.abs(worst.v_after_v))} V after 1 s (limit ${PIN_VOLTAGE_LIMIT_V} V), equivalent time constant ${tauText} (limit ${TYPE_A_MAX_TIME_CONSTANT_S} s).`,
      evidence: [
        ev("capacitance at the plug pins", cPins, "F"),
        ev("capacitance above which the rule applies", DISCHARGE_CAPACITANCE_THRESHOLD_F, "F"),
        ev("unplugged at", `the ${worst.instant}`, ""),
        ev("pin voltage when unplugged", Math.abs(worst.v0_v), "V"),
        ev("pin voltage after the delay", Math.abs(worst.v_after_v), "V"),
        ev("delay", worst.delay_s, "s"),
        ev("pin voltage limit after the delay", PIN_VOLTAGE_LIMIT_V, "V"),
        ev("equivalent time constant", worst.tau_s, "s"),
        ev("time constant limit", TYPE_A_MAX_TIME_CONSTANT_S, "s"),
        ev("largest time constant that meets the voltage limit", tauMax, "s"),
        ev("largest bleeder resistance that meets the voltage limit", tauMax / cPins, "Ω"),
        evYes("pin voltage above its limit", verdict.exceeds_pin_limit),
        evYes("time constant above its limit", verdict.exceeds_type_a_tau),
      ],
      ...cite("capacitor-discharge"),
      caution:
        "Capacitors stay charged: treat the pins and the board as live after unplugging until they are measured discharged.",
    },
  ];
}
