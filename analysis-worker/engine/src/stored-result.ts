/**
 * Reading a stored analysis result back: the one place the worker and the web app turn the JSON
 * in the database into an `AnalysisResult`. Results written by an older engine (before status,
 * gaps and labelled evidence) are upgraded in memory; what cannot be upgraded is reported, and
 * the reader shows it as analysed by an older engine until the re-analysis is done.
 */
import { AnalysisResultSchema, type AnalysisResult } from "./analysis-result.js";
import { kindInfo } from "./graph/kinds.js";
import type { Evidence, Gap } from "./record/gaps-and-assumptions.js";

/** The outcome of reading a stored result. */
export type StoredResultRead =
  | { ok: true; result: AnalysisResult; upgradedFrom: string | null }
  | { ok: false; engine: string | null; message: string };

type Obj = Record<string, unknown>;
const isObj = (x: unknown): x is Obj => x !== null && typeof x === "object" && !Array.isArray(x);

/** Parses a stored result, upgrading an older engine's shape first; never throws. */
export function parseStoredResult(raw: unknown): StoredResultRead {
  if (!isObj(raw))
    return { ok: false, engine: null, message: "the stored result is not an object" };
  const engine = typeof raw.engine === "string" ? raw.engine : null;
  const upgraded = "status" in raw ? null : upgradeOlderResult(raw);
  const parsed = AnalysisResultSchema.safeParse(upgraded ?? raw);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    const where = first && first.path.length > 0 ? first.path.join(".") : "(result)";
    return {
      ok: false,
      engine,
      message: `the stored result does not have the expected shape (${where}: ${first?.message ?? "invalid"})`,
    };
  }
  return { ok: true, result: parsed.data, upgradedFrom: upgraded ? (engine ?? "unknown") : null };
}

/** A part as the note reader needs it. */
interface PartBrief {
  ref: string;
  kind: string;
  pins: Readonly<Record<string, string>>;
}

/**
 * The gaps an older engine (or a solver that reports only note strings) wrote as notes: each
 * "REF: why (left out)" or "net N: why (left out)". Documentation-only parts (connectors, test
 * points) are not gaps: they carry nothing the figures depend on; so a net is a gap only when a
 * part on it is one (without the parts at hand, nets are skipped).
 */
export function gapsFromSolverNotes(notes: readonly string[], parts?: readonly PartBrief[]): Gap[] {
  const byRef = new Map((parts ?? []).map((p) => [p.ref, p]));
  const gaps: Gap[] = [];
  const netNotes: Array<{ net: string }> = [];
  for (const note of notes) {
    const m = /^(net )?([^:\s]+): (.*) \(left out\)$/.exec(note);
    if (!m) continue;
    const [, isNet, name, why] = m as unknown as [string, string | undefined, string, string];
    if (isNet) {
      netNotes.push({ net: name });
      continue;
    }
    if (/documentation only/.test(why)) continue;
    const kind = byRef.get(name)?.kind;
    let reason = why;
    if (/^kind ".*" is not simulated$/.test(why))
      reason = kind !== undefined && kindInfo(kind) === null ? `unknown kind "${kind}"` : why;
    else if (/^load without model\.r or model\.c$/.test(why))
      reason = "load without a resistance or capacitance";
    gaps.push({ part: name, reason });
  }
  // A net whose every simulated part was left out has no figures worth showing (the solver
  // holds it at the reference through gmin), whether or not a note said so.
  const gapParts = new Set(gaps.map((g) => g.part));
  const nets = new Set([
    ...netNotes.map((n) => n.net),
    ...(parts ?? []).flatMap((p) => Object.values(p.pins)),
  ]);
  for (const net of [...nets].sort()) {
    const onNet = (parts ?? []).filter(
      (p) => Object.values(p.pins).includes(net) && kindInfo(p.kind)?.documentationOnly !== true,
    );
    if (onNet.length > 0 && onNet.every((p) => gapParts.has(p.ref)))
      gaps.push({ net, reason: "no simulated part reaches it, so it has no figures" });
  }
  return gaps;
}

// Evidence keys of older results carry their unit as a suffix ("tau_s", "v_after_delay_v").
const UNIT_SUFFIXES: Record<string, string> = {
  v: "V",
  a: "A",
  w: "W",
  s: "s",
  hz: "Hz",
  ohm: "Ω",
  ohms: "Ω",
  f: "F",
  h: "H",
  ppm: "ppm",
  mm: "mm",
  pct: "%",
  deg: "°",
  j: "J",
  va: "VA",
};

/** A value of an older evidence record as one number, word or null. */
function evidenceValue(v: unknown): number | string | null {
  if (v === null || typeof v === "number") return v;
  if (typeof v === "string") return withoutInternalMarks(v);
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (Array.isArray(v)) return v.map((x) => (isObj(x) ? JSON.stringify(x) : String(x))).join(", ");
  return JSON.stringify(v);
}

/** Evidence as labelled quantities, from either shape (a list already, or an older key record). */
export function evidenceList(evidence: unknown): Evidence[] {
  if (Array.isArray(evidence)) return evidence as Evidence[];
  if (!isObj(evidence)) return [];
  return Object.entries(evidence).map(([key, v]) => {
    const words = key.split("_");
    const last = words[words.length - 1]!.toLowerCase();
    const unit = words.length > 1 ? UNIT_SUFFIXES[last] : undefined;
    return {
      label: (unit ? words.slice(0, -1) : words).join(" "),
      value: evidenceValue(v),
      unit: unit ?? "",
    };
  });
}

/**
 * Older flags named internal notes and confidence marks in their sources; the page must show
 * neither, so an upgraded source keeps only the published document's words.
 */
export function withoutInternalMarks(text: string): string {
  return text
    .replace(/\b(?:mark\s+)?(?:FOUND|MEMORY|DERIVED)\b/g, "")
    .replace(/(?:\bper\s+)?(?:\.\.\/)?(?:shared\/)?[\w-]+\.md(?:\s*§\s*[\w.]+)?/g, "")
    .replace(/\(\s*(?:[,;]\s*)+/g, "(")
    .replace(/(?:\s*[,;])+\s*\)/g, ")")
    .replace(/\s*\(\s*\)/g, "")
    .replace(/\(\s+/g, "(")
    .replace(/\s+([,;:)])/g, "$1")
    .replace(/([,;])(?:\s*[,;])+/g, "$1")
    .replace(/\s{2,}/g, " ")
    .replace(/^[\s,;:]+|[\s,;:]+$/g, "");
}

const arrayOr = (x: unknown): unknown[] => (Array.isArray(x) ? x : []);

/** The current shape of a result written before status, gaps and labelled evidence. */
function upgradeOlderResult(raw: Obj): Obj {
  const solver = isObj(raw.solver) ? raw.solver : {};
  const flags = arrayOr(raw.flags).map((f) => {
    const flag = isObj(f) ? f : {};
    return {
      ...flag,
      evidence: evidenceList(flag.evidence),
      source: withoutInternalMarks(String(flag.source ?? "")) || "common practice",
      source_id: typeof flag.source_id === "string" ? flag.source_id : String(flag.code ?? ""),
    };
  });
  const common = {
    engine: raw.engine,
    supply: raw.supply,
    assumptions: [],
    flags,
    blocks: arrayOr(raw.blocks),
    checks: arrayOr(raw.checks),
    series: isObj(raw.series) ? raw.series : {},
  };
  if (!isObj(raw.input))
    return {
      ...common,
      status: "not-solved",
      gaps: [],
      reason:
        typeof solver.skipped === "string"
          ? solver.skipped
          : "this analysis, by an older engine, has no solution",
      solver_code: null,
    };
  const gaps = gapsFromSolverNotes(arrayOr(solver.notes).map(String));
  return {
    ...common,
    status: gaps.length > 0 ? "partial" : "complete",
    gaps,
    input: raw.input,
    // an older engine reported no mean current: unknown, not zero
    parts: Object.fromEntries(
      Object.entries(isObj(raw.parts) ? raw.parts : {}).map(([ref, figures]) => [
        ref,
        { current_dc: null, ...(isObj(figures) ? figures : {}) },
      ]),
    ),
    nets: raw.nets ?? {},
    triggers: arrayOr(raw.triggers),
    waveforms: raw.waveforms ?? { t: [], series: {} },
    linear: raw.linear,
    solver: raw.solver,
    comparisons: arrayOr(raw.comparisons),
    risk_notes: arrayOr(raw.risk_notes),
  };
}
