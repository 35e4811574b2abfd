/**
 * accessible-mains: a net a person can touch has a conducting path to line or neutral. The
 * evidence is the lowest-resistance path and the peak voltage the solver finds on the net.
 */
import type { Flag } from "./flag-types.js";
import { galvanicPath } from "./galvanic-paths.js";
import type { RiskContext } from "./risk-context.js";
import { sig3, voltageBetween } from "./risk-context.js";

const SOURCE =
  "IEC 60335-1, 8.1 (protection against access to live parts; 8.1.4 protective impedance: ≤ 0.7 mA peak a.c., FOUND per reference-values.md §1a)";

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
      evidence: {
        path: path.steps,
        path_resistance_ohms: path.ohms,
        peak_v_to_reference: peak,
        reference_net: ctx.solved?.circuit.reference ?? null,
        peak_v_to_earth: toEarth?.peak_v ?? null,
        supply_peak_v: ctx.analysis.supply.vrms * Math.SQRT2,
      },
      source: SOURCE,
      caution:
        "Treat the net as live at full mains voltage until a qualified person has checked the enclosure and the insulation.",
    });
  }
  return flags;
}
