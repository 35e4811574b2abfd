/**
 * capacitor-class: a capacitor in series with the supply (a dropper) or straight across it
 * without an X rating (X1/X2/X3; a Y1/Y2 part may stand in), and a capacitor that bridges from
 * a mains-connected net to a touchable one without a Y rating (IEC 60384-14 subclasses). The class is the record's rating.class, else a class printed in
 * the marking ("334K 310V~ X2").
 */
import type { Evidence } from "../record/gaps-and-assumptions.js";
import type { Part } from "../record/types.js";
import type { Flag } from "./flag-types.js";
import { MAINS_CAUTION, ev } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import { cite } from "./citations.js";

const X_OR_Y = new Set(["X1", "X2", "X3", "Y1", "Y2"]);
const Y_CLASSES = new Set(["Y1", "Y2", "Y3", "Y4"]);

/** The safety class of a capacitor (upper case), from its rating or its marking, with where it was read. */
export function safetyClassOf(p: Part): { cls: string; from: "rating" | "marking" } | null {
  const r = p.rating.class?.trim().toUpperCase();
  if (r) return { cls: r, from: "rating" };
  const m = p.marking?.toUpperCase().match(/(?:^|[^A-Z0-9])([XY][1-4])(?![A-Z0-9])/);
  return m ? { cls: m[1]!, from: "marking" } : null;
}

function pinPair(p: Part): [string, string] | null {
  const [a, b] = Object.values(p.pins);
  return a !== undefined && b !== undefined && a !== b ? [a, b] : null;
}

function classEvidence(
  position: string,
  cls: { cls: string; from: "rating" | "marking" } | null,
  accepted: ReadonlySet<string>,
  farads: number | null,
): Evidence[] {
  return [
    ev("position", position, ""),
    ev("safety class found", cls === null ? "none" : `${cls.cls} (read from the ${cls.from})`, ""),
    ev("classes accepted there", [...accepted].join(", "), ""),
    ev("capacitance", farads, "F"),
  ];
}

/** The capacitor-class flags of a record. */
export function capacitorClassFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  const series = ctx.seriesCapacitors;
  for (const p of ctx.record.parts) {
    if (p.kind !== "capacitor") continue;
    const pins = pinPair(p);
    if (pins === null) continue;
    const [a, b] = pins;
    const cls = safetyClassOf(p);
    const l = ctx.paths.mainsLine;
    const n = ctx.paths.mainsNeutral;
    const across = (l.has(a) && n.has(b)) || (l.has(b) && n.has(a));
    const role = series.has(p.ref)
      ? "in series with the supply (a dropper)"
      : across
        ? "straight across the supply"
        : null;
    if (role !== null && (cls === null || !X_OR_Y.has(cls.cls))) {
      flags.push({
        code: "capacitor-class",
        severity: "warning",
        parts: [p.ref],
        nets: [a, b],
        message: `${p.ref} sits ${role} with ${cls ? `class ${cls.cls}` : "no safety class"}; it needs an X rating (a Y1/Y2 part may stand in).`,
        evidence: classEvidence(role, cls, X_OR_Y, p.value),
        ...cite("iec-60384-14-x"),
        caution: MAINS_CAUTION,
      });
    }
    // One side conducts to the mains, the other to something a person can touch.
    const bridges =
      (ctx.mainsConnected.has(a) && ctx.touchable.has(b) && !ctx.mainsConnected.has(b)) ||
      (ctx.mainsConnected.has(b) && ctx.touchable.has(a) && !ctx.mainsConnected.has(a));
    if (bridges && (cls === null || !Y_CLASSES.has(cls.cls))) {
      flags.push({
        code: "capacitor-class",
        severity: "danger",
        parts: [p.ref],
        nets: [a, b],
        message: `${p.ref} bridges from the mains to a touchable net with ${cls ? `class ${cls.cls}` : "no safety class"}; a capacitor there needs a Y rating.`,
        evidence: classEvidence("bridging to a touchable net", cls, Y_CLASSES, p.value),
        ...cite("iec-60384-14-y"),
        caution:
          "A failed bridging capacitor puts mains on the touchable side: treat it as live until a qualified person has checked it.",
      });
    }
  }
  return flags;
}
