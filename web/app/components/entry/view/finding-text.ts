/**
 * Findings (the analysis's risk flags) in words for people: most severe first, each as one
 * sentence carrying its leading quantities with their units, and the rest of its figures kept
 * for a "show all" list. Pure functions so the page and its tests read them the same way.
 */
import { evidenceSentence } from "./evidence-sentence";
import { arr, obj, str, strings, type Obj } from "./result-access";

export type Severity = "danger" | "warning" | "info";

const SEVERITY_ORDER: Readonly<Record<string, number>> = { danger: 0, warning: 1, info: 2 };

/** The word a severity is shown with (never colour alone). */
export const SEVERITY_WORD: Readonly<Record<Severity, string>> = {
  danger: "Danger",
  warning: "Warning",
  info: "Note",
};

/** How many of a finding's figures go into its sentence; the rest sit behind "all figures". */
export const SENTENCE_FIGURES = 3;

/** One finding, read once from the stored flag. */
export interface Finding {
  code: string;
  severity: Severity;
  parts: string[];
  nets: string[];
  message: string;
  /** Each figure as "label: value unit". */
  figures: string[];
  source: string;
  caution: string;
  /** An older engine kept its figures as raw keys; they are not guessed at. */
  olderEvidence: boolean;
}

function severityOf(x: unknown): Severity {
  return x === "danger" || x === "warning" ? x : "info";
}

/** The stored flags as findings, danger first, then warning, then notes (stable otherwise). */
export function findingsOf(flags: unknown): Finding[] {
  return arr(flags)
    .map((raw) => {
      const f: Obj = obj(raw);
      return {
        code: str(f.code) ?? "unnamed",
        severity: severityOf(f.severity),
        parts: strings(f.parts),
        nets: strings(f.nets),
        message: (str(f.message) ?? "").trim(),
        figures: arr(f.evidence)
          .map(evidenceSentence)
          .filter((s): s is string => s !== null),
        source: str(f.source) ?? "",
        caution: str(f.caution) ?? "",
        olderEvidence: !Array.isArray(f.evidence) && f.evidence !== undefined,
      };
    })
    .map((f, i) => ({ f, i }))
    .sort((a, b) => SEVERITY_ORDER[a.f.severity]! - SEVERITY_ORDER[b.f.severity]! || a.i - b.i)
    .map(({ f }) => f);
}

/** A flag code in words: "measurement-mismatch" reads "measurement mismatch". */
export function codeWords(code: string): string {
  return code.replace(/[-_]+/g, " ");
}

/** The finding as one sentence: its message, then its leading figures with their units. */
export function findingSentence(f: Finding): string {
  const message = f.message === "" ? `${codeWords(f.code)}.` : f.message;
  const lead = f.figures.slice(0, SENTENCE_FIGURES);
  if (lead.length === 0) return message;
  const ended = /[.!?]$/.test(message) ? message : `${message}.`;
  return `${ended} Figures: ${lead.join("; ")}.`;
}

/** The finding on one line for the summary: the message alone, first sentence only. */
export function findingLine(f: Finding): string {
  const first = f.message.split(/(?<=[.!?])\s+/)[0] ?? "";
  return first === "" ? codeWords(f.code) : first;
}

/** The worst severity each part is named in (danger beats warning; notes do not mark). */
export function markedParts(findings: readonly Finding[]): Map<string, "danger" | "warning"> {
  const marks = new Map<string, "danger" | "warning">();
  for (const f of findings) {
    if (f.severity === "info") continue;
    for (const p of f.parts)
      if (marks.get(p) !== "danger") marks.set(p, f.severity === "danger" ? "danger" : "warning");
  }
  return marks;
}
