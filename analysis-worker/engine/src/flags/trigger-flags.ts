/**
 * no-trigger and trigger-marginal, from the solver's trigger figures: a thyristor or triac that
 * never fires at the analysed supply; one whose lowest firing supply is within 10 % below the
 * analysed supply (a low mains stops it), or whose firing angle is within 10° of 90° (past the
 * crest the gate drive falls, so a small drift stops it firing).
 */
import type { Flag } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";
import { cite } from "./citations.js";
import { ev, evPercent } from "./flag-types.js";

/** A lowest firing supply within this fraction below the analysed supply is marginal. */
export const TRIGGER_SUPPLY_MARGIN_FRACTION = 0.1;
/** A firing angle within this many degrees of 90° is marginal. */
export const TRIGGER_ANGLE_MARGIN_DEG = 10;
const CAUTION =
  "The gate figures rest on the traced values and on datasheet-class gate parameters; real parts spread widely.";

/** The trigger flags of every thyristor and triac. */
export function triggerFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  const supply = ctx.analysis.supply.vrms;
  for (const t of ctx.analysis.triggers) {
    const part = ctx.record.parts.find((p) => p.ref === t.part);
    const nets = part ? Object.values(part.pins) : [];
    if (!t.fires) {
      flags.push({
        code: "no-trigger",
        severity: "warning",
        parts: [t.part],
        nets,
        message: `${t.part} never fires at ${sig3(supply)} V: its gate never reaches the trigger current.`,
        evidence: [
          ev("supply voltage (RMS)", supply, "V"),
          ev("gate trigger current", part?.model.igt ?? null, "A"),
        ],
        ...cite("common-practice"),
        caution: CAUTION,
      });
      continue;
    }
    const lowSupply =
      t.min_supply_vrms !== null &&
      t.min_supply_vrms >= supply * (1 - TRIGGER_SUPPLY_MARGIN_FRACTION);
    const angles = [t.angle_deg, t.angle_negative_deg].filter((a): a is number => a !== null);
    const nearCrest = angles.find((a) => Math.abs(a - 90) < TRIGGER_ANGLE_MARGIN_DEG) ?? null;
    if (!lowSupply && nearCrest === null) continue;
    const why = [
      lowSupply
        ? `it stops firing below ${sig3(t.min_supply_vrms!)} V, within ${100 * TRIGGER_SUPPLY_MARGIN_FRACTION} % of ${sig3(supply)} V`
        : null,
      nearCrest !== null
        ? `it fires at ${sig3(nearCrest)}°, within ${TRIGGER_ANGLE_MARGIN_DEG}° of the crest`
        : null,
    ].filter((x) => x !== null);
    flags.push({
      code: "trigger-marginal",
      severity: "warning",
      parts: [t.part],
      nets,
      message: `${t.part} fires with little margin: ${why.join("; ")}.`,
      evidence: [
        ev("supply voltage (RMS)", supply, "V"),
        ev("lowest supply that still fires it (RMS)", t.min_supply_vrms, "V"),
        t.min_supply_vrms !== null
          ? evPercent("supply margin", 1 - t.min_supply_vrms / supply)
          : ev("supply margin", null, "%"),
        evPercent("least supply margin", TRIGGER_SUPPLY_MARGIN_FRACTION),
        ev("firing angle, positive half-cycle", t.angle_deg, "°"),
        ev("firing angle, negative half-cycle", t.angle_negative_deg, "°"),
        ev("least distance from the crest", TRIGGER_ANGLE_MARGIN_DEG, "°"),
      ],
      ...cite("common-practice"),
      caution: CAUTION,
    });
  }
  return flags;
}
