/**
 * accessible-mains: a net a person can touch has a conducting path to line or neutral. The
 * evidence is the lowest-resistance path and the peak voltage the solver finds on the net.
 */
import type { Flag } from "./flag-types.js";
import { cite } from "./citations.js";
import { ev } from "./flag-types.js";
import { galvanicPath } from "./galvanic-paths.js";
import type { RiskContext } from "./risk-context.js";
import { sig3, voltageBetween } from "./risk-context.js";

/** One danger flag per accessible net that conducts to line or neutral. */
export function accessibleMainsFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  const nets = ctx.record.nets;
  const earth = Object.keys(nets).find((n) => nets[n]!.role === "earth");
  for (const name of Object.keys(nets).sort()) {
    if (!nets[name]!.accessible) continue;
    const path = galvanicPath(ctx.edges, name, ctx.supplyNets);
    if (path === null) continue;
    const neutral = ctx.analysis.nets[name];
    const toEarth = earth !== undefined ? voltageBetween(ctx, name, earth) : null;
    const peak = neutral?.peak ?? null;
    flags.push({
      code: "accessible-mains",
      severity: "danger",
      parts: path.parts,
      nets: path.nets,
      message:
        `${name} can be touched and conducts to ${path.nets[path.nets.length - 1]} through ${path.parts.join(", ")}` +
        (peak !== null
          ? `; the solver finds ${sig3(peak)} V peak on it against the reference`
          : "") +
        ". Neutral is no protection: plugs reverse and neutrals break.",
      evidence: [
        ev("conducting path", path.steps.join(" – "), ""),
        ev("resistance of the path", path.ohms, "Ω"),
        ev(`peak voltage against ${ctx.solved?.circuit.reference ?? "the reference"}`, peak, "V"),
        ...(earth !== undefined
          ? [ev(`peak voltage against ${earth}`, toEarth?.peak_v ?? null, "V")]
          : []),
        ev("supply peak voltage", ctx.analysis.supply.vrms * Math.SQRT2, "V"),
      ],
      ...cite("iec-60335-1-access"),
      caution:
        "Treat the net as live at full mains voltage until a qualified person has checked the enclosure and the insulation.",
    });
  }
  return flags;
}
