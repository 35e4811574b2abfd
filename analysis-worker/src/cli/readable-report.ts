/**
 * The analyze command's readable output: the record's parts, nets, blocks, series membership
 * and checks, then whatever figures, triggers, flags and comparisons the engine computed, and
 * the safety caution whenever a safety figure is shown.
 */
import { analysisStateLine, type AnalysisResult, type TeardownRecord } from "@teardown/engine";
import { eng, textTable } from "./text-table.js";

/** The caution printed next to every safety figure (same words as the web app). */
export const SAFETY_CAUTION =
  "CAUTION: mains circuits and their outputs can kill, and capacitors can stay charged after unplugging; ozone and high voltage are hazards too. " +
  "These figures are estimates computed from a traced netlist, not measurements or a compliance verdict. Local codes and licensed practice decide.";

type Result = Record<string, unknown>;
type Num = number | null | undefined;

const UNIT_OF_KIND: Record<string, string> = {
  resistor: "Ω",
  capacitor: "F",
  inductor: "H",
  zener: "V",
  fuse: "A",
  varistor: "V",
};

function valueText(p: TeardownRecord["parts"][number]): string {
  if (p.value === null) return p.value_text ?? "";
  const unit = UNIT_OF_KIND[p.kind];
  return unit ? eng(p.value, unit) : (p.value_text ?? String(p.value));
}

function ratingText(r: TeardownRecord["parts"][number]["rating"]): string {
  const bits: string[] = [];
  if (r.volts !== undefined) bits.push(eng(r.volts, "V"));
  if (r.amps !== undefined) bits.push(eng(r.amps, "A"));
  if (r.watts !== undefined) bits.push(eng(r.watts, "W"));
  if (r.class) bits.push(r.class);
  if (r.package) bits.push(r.package);
  return bits.join(" ");
}

/** Unit of a measured figure, by its `what`. */
function unitOfMeasurement(what: string): string {
  if (what === "input.current_rms" || what === "part.current_rms") return "A";
  if (what === "input.power" || what === "part.power") return "W";
  if (what === "input.apparent_power") return "VA";
  if (what === "input.power_factor") return "";
  return "V";
}

/** Units shown with an SI prefix (24.1 mA); the others (%, mm, ppm, none) as plain numbers. */
const PREFIXED_UNITS = new Set(["V", "A", "W", "VA", "F", "H", "Ω", "s", "Hz", "J"]);
/** Units written against the number (90°, 2.1×). */
const ATTACHED_UNITS = new Set(["°", "×"]);

/** One evidence entry as a sentence: "time constant: 2.2 s". */
export function evidenceSentence(e: { label: string; value: unknown; unit: string }): string {
  const v = e.value;
  if (v === null || v === undefined) return `${e.label}: not computed`;
  if (typeof v !== "number") return `${e.label}: ${String(v)}`;
  if (PREFIXED_UNITS.has(e.unit)) return `${e.label}: ${eng(v, e.unit)}`;
  const n = Number(v.toPrecision(3));
  if (ATTACHED_UNITS.has(e.unit)) return `${e.label}: ${n}${e.unit}`;
  return `${e.label}: ${n}${e.unit ? ` ${e.unit}` : ""}`;
}

/** The odd harmonics of the line current up to the 9th, as one line (older results have none). */
function harmonicsLine(
  h: ReadonlyArray<{ order: number; rms: number | null }> | undefined,
): string | null {
  if (!h || h.length === 0) return null;
  const odd = h.filter((x) => x.order % 2 === 1 && x.order <= 9);
  return `  line-current harmonics (rms): ${odd.map((x) => `${x.order}: ${eng(x.rms, "A")}`).join("   ")}`;
}

/** A what-if's word on each trigger that fires at the rated supply but not as well here. */
function whatIfTriggerLines(result: AnalysisResult): string[] {
  if (result.status === "not-solved") return [];
  const out: string[] = [];
  for (const t of result.triggers) {
    if (t.suggestion)
      out.push(
        `  ${t.part}: fires at the rated supply${t.rated?.angle_deg != null ? ` (at ${t.rated.angle_deg.toFixed(1)}°)` : ""} but ${t.fires ? "later" : "not"} at this one;` +
          ` suggestion: ${t.suggestion.part} = ${eng(t.suggestion.value, "Ω")} (${t.suggestion.series}), firing at ${t.suggestion.angle_deg != null ? `${t.suggestion.angle_deg.toFixed(1)}°` : "an unknown angle"}`,
      );
    else if (t.suggestion_note)
      out.push(
        `  ${t.part}: fires at the rated supply but ${t.fires ? "later" : "not"} at this one; ${t.suggestion_note}`,
      );
  }
  return out;
}

/** The whole readable report for one analysed record. */
export function readableReport(record: TeardownRecord, typed: AnalysisResult): string {
  const result = typed as unknown as Result;
  const out: string[] = [];
  const supply = typed.supply;
  // The state first: a reader must know what the figures below leave out before reading them.
  out.push(
    `${record.title}`,
    `analysis ${analysisStateLine(typed)}`,
    `category: ${record.device.category ?? "—"}   supply analysed: ${supply.vrms} V / ${supply.hz} Hz   engine ${typed.engine}`,
    "",
  );
  if (typed.gaps.length > 0)
    out.push(
      "Left out of the analysis",
      ...typed.gaps.map((g) => `  ${g.part ?? `net ${g.net}`}: ${g.reason}`),
      "",
    );
  if (typed.assumptions.length > 0)
    out.push(
      "Assumed where the record is silent",
      textTable(
        ["part", "field", "value", "why"],
        typed.assumptions.map((a) => [
          a.part,
          a.field,
          typeof a.value === "number" ? String(Number(a.value.toPrecision(4))) : a.value,
          a.why,
        ]),
      ),
      "",
    );
  const series = (result.series as Record<string, string | null> | undefined) ?? {};
  out.push(
    "Parts",
    textTable(
      ["ref", "kind", "value", "series", "rating", "pins"],
      record.parts.map((p) => [
        p.ref,
        p.kind,
        valueText(p),
        p.ref in series ? (series[p.ref] ?? "none") : "",
        ratingText(p.rating),
        Object.entries(p.pins)
          .map(([role, net]) => `${role}=${net}`)
          .join(" "),
      ]),
    ),
    "",
  );
  const pinCount = new Map<string, number>();
  for (const p of record.parts)
    for (const n of Object.values(p.pins)) pinCount.set(n, (pinCount.get(n) ?? 0) + 1);
  const gapNets = new Set(typed.gaps.flatMap((g) => (g.net !== undefined ? [g.net] : [])));
  const netFigures =
    (result.nets as Record<string, { dc: Num; rms: Num; peak: Num }> | undefined) ?? {};
  out.push(
    "Nets",
    textTable(
      ["net", "role", "accessible", "pins", "dc", "rms", "peak"],
      Object.entries(record.nets)
        .sort(([a], [b]) => a.localeCompare(b))
        .map(([name, info]) => [
          name,
          info.role ?? "",
          info.accessible ? "yes" : "",
          pinCount.get(name) ?? 0,
          ...(gapNets.has(name) || typed.status === "not-solved"
            ? ["not computed", "", ""]
            : [
                eng(netFigures[name]?.dc, "V"),
                eng(netFigures[name]?.rms, "V"),
                eng(netFigures[name]?.peak, "V"),
              ]),
        ]),
    ),
    "",
  );
  const blocks = (result.blocks as Array<{ kind: string; parts: string[] }> | undefined) ?? [];
  out.push(
    "Functional blocks",
    blocks.length
      ? blocks.map((b) => `  ${b.kind.padEnd(22)} ${b.parts.join(", ")}`).join("\n")
      : "  none found",
    "",
  );
  const checks =
    (result.checks as Array<{ severity: string; code: string; message: string }> | undefined) ?? [];
  out.push(
    "Checks",
    checks.length
      ? checks.map((c) => `  ${c.severity.padEnd(8)} ${c.code.padEnd(24)} ${c.message}`).join("\n")
      : "  no problems found",
    "",
  );

  const input = typed.status === "not-solved" ? undefined : typed.input;
  let safetyShown = false;
  if (typed.status === "not-solved") out.push(`Figures: not computed (${typed.reason})`, "");
  if (input) {
    safetyShown = true;
    out.push(
      "Input",
      `  current ${eng(input.current_rms, "A")} rms   real power ${eng(input.power, "W")}   apparent ${eng(input.apparent_power, "VA")}   power factor ${input.power_factor?.toFixed(3) ?? "—"}   THD ${input.thd !== null && input.thd !== undefined ? `${(input.thd * 100).toFixed(1)} %` : "—"}`,
      "",
    );
    const harmonics = harmonicsLine(input.harmonics);
    if (harmonics) out.push(harmonics, "");
    const parts =
      (result.parts as
        Record<string, { voltage_peak: Num; current_rms: Num; power: Num }> | undefined) ?? {};
    out.push(
      "Per part",
      textTable(
        ["ref", "peak voltage", "rms current", "dissipation"],
        Object.entries(parts).map(([ref, f]) => [
          ref,
          eng(f.voltage_peak, "V"),
          eng(f.current_rms, "A"),
          eng(f.power, "W"),
        ]),
      ),
      "",
    );
  }
  const triggers =
    (result.triggers as
      Array<{ part: string; fires: boolean; angle_deg: Num; min_supply_vrms: Num }> | undefined) ??
    [];
  if (triggers.length) {
    out.push(
      "Triggers",
      textTable(
        ["part", "fires", "firing angle", "lowest firing supply"],
        triggers.map((t) => [
          t.part,
          t.fires ? "yes" : "no",
          t.angle_deg !== null && t.angle_deg !== undefined ? `${t.angle_deg.toFixed(1)}°` : null,
          eng(t.min_supply_vrms, "V"),
        ]),
      ),
      "",
    );
    const notes = whatIfTriggerLines(typed);
    if (notes.length) out.push(...notes, "");
  }
  const flags =
    (result.flags as
      | Array<{
          code: string;
          severity: string;
          message: string;
          evidence: unknown;
          source: string;
          parts: string[];
          nets: string[];
        }>
      | undefined) ?? [];
  if (flags.length) {
    safetyShown = true;
    out.push("Risk flags");
    for (const f of flags) {
      out.push(`  [${f.severity.toUpperCase()}] ${f.code}: ${f.message}`);
      const where = [...f.parts, ...f.nets];
      if (where.length) out.push(`      concerns: ${where.join(", ")}`);
      // Older stored results kept evidence as raw keys; they are not guessed at.
      if (Array.isArray(f.evidence))
        for (const e of f.evidence as Array<{ label: string; value: unknown; unit: string }>)
          out.push(`      ${evidenceSentence(e)}.`);
      else out.push("      evidence: in an older format, re-analyse to see it");
      out.push(`      source: ${f.source}`);
    }
    out.push("");
  }
  const comparisons =
    (result.comparisons as
      | Array<{
          what: string;
          measured: number;
          predicted: Num;
          low: Num;
          high: Num;
          verdict: string;
        }>
      | undefined) ?? [];
  if (comparisons.length) {
    out.push(
      "Measured against predicted",
      textTable(
        ["measurement", "measured", "predicted", "band", "verdict"],
        comparisons.map((c) => {
          const u = unitOfMeasurement(c.what);
          const f = (v: Num) =>
            u ? eng(v, u, 4) : v === null || v === undefined ? "—" : v.toFixed(3);
          return [c.what, f(c.measured), f(c.predicted), `${f(c.low)} … ${f(c.high)}`, c.verdict];
        }),
      ),
      "",
    );
  }
  if (safetyShown) out.push(SAFETY_CAUTION);
  return out.join("\n");
}
