/**
 * Reads a pasted fragment with the app's own circuit readers. A fragment is a piece of a circuit,
 * so what a whole record must carry and a fragment need not is supplied before reading: a YAML
 * record may leave out `record: 1` and `title` (two lines are put in front, and error lines are
 * moved back so they point into the pasted text), and a deck's resistor, capacitor or inductor
 * line may leave out its value (a placeholder is put at the end; values do not take part in
 * fragment matching). Net roles and ratings are optional in every format already.
 */
import { readCircuitFile, type InputError, type TeardownRecord } from "@teardown/engine";

export type FragmentFormat = "record" | "deck" | "csv";

const FILENAME: Readonly<Record<FragmentFormat, string>> = {
  record: "fragment.yaml",
  deck: "fragment.cir",
  csv: "fragment.csv",
};

/** The fragment as a record, or every problem with its line (in the pasted text) and path. */
export function readFragment(
  text: string,
  format: FragmentFormat,
): { ok: true; record: TeardownRecord } | { ok: false; errors: InputError[] } {
  let source = text;
  let shift = 0;
  if (format === "record" && !text.trimStart().startsWith("{")) {
    const head: string[] = [];
    if (!/^record\s*:/m.test(text)) head.push("record: 1");
    if (!/^title\s*:/m.test(text)) head.push("title: fragment");
    source = head.map((l) => `${l}\n`).join("") + text;
    shift = head.length;
  } else if (format === "deck") {
    source = text
      .split("\n")
      .map((line) =>
        /^\s*[RCL][A-Za-z0-9_]*\s+\S+\s+\S+\s*$/i.test(line) ? `${line.trimEnd()} 1` : line,
      )
      .join("\n");
  }
  const parsed = readCircuitFile(source, { filename: FILENAME[format] });
  if (parsed.ok) return { ok: true, record: parsed.record };
  return {
    ok: false,
    errors: parsed.errors.map((e) => ({
      ...e,
      line: e.line === null || e.line === undefined ? e.line : Math.max(1, e.line - shift),
    })),
  };
}
