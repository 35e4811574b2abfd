/**
 * Reading a CSV parts list into a teardown record. A header row names the columns (any order,
 * any case): `ref`, `kind`, `pins` are required; `value`, `tolerance`, `rating`, `marking`,
 * `model`, `note`, `polarised`, `closed` are optional. Values use the record notation (`4k7`,
 * `330n`, `2M2`).
 *
 * - pins: `a=L b=A` (role=net, separated by spaces or semicolons) or `L A` (the kind's order)
 * - rating: `310V X2` (a unit tells volts/amps/watts, X1/X2/Y1/Y2 is the class) or
 *   `volts=310 class=X2`
 * - model: `vgt=0.7 igt=50u`
 *
 * Lines starting with `#` before the header are comments, or directives: `# title: ...`,
 * `# supply: 230 50`, `# line: L`, `# neutral: N`, `# earth: PE`, `# output: OUT`,
 * `# accessible: CASE`. Without a title the file name (or "Imported parts list") is used.
 */
import type { ParseResult } from "../record/types.js";
import { internalFailure, MAX_RECORD_TEXT_CHARS } from "../record/parse-record.js";
import { parseValue } from "../values/parse-value.js";
import { splitCsv } from "./csv-rows.js";
import { applyParams, splitParam } from "./part-params.js";
import { RawRecordBuilder, tokenizeLine, type SourceToken } from "./raw-record-builder.js";

/** Columns a parts list may have. */
export const CSV_COLUMNS = [
  "ref",
  "kind",
  "value",
  "tolerance",
  "pins",
  "rating",
  "marking",
  "model",
  "note",
  "polarised",
  "closed",
] as const;
const REQUIRED_COLUMNS = ["ref", "kind", "pins"] as const;
const SAFETY_CLASS = /^[XY][1-4]$/i;

/** Options of readPartsCsv: the file name gives a title when the file has none. */
export interface ReadCsvOptions {
  filename?: string;
}

/** Words of a field, split on spaces and semicolons, each with its place. */
function words(field: SourceToken): SourceToken[] {
  const { tokens } = tokenizeLine(field.text.replace(/;/g, " "), field.line, field.column);
  return tokens;
}

function readHeaderDirective(text: string, line: number, builder: RawRecordBuilder): void {
  const m = /^#\s*([A-Za-z_]+)\s*:\s*(.*)$/.exec(text.trim());
  if (m === null) return; // a plain comment
  const name = m[1]!.toLowerCase();
  const value = m[2]!.trim();
  const column = text.indexOf(m[2]!) + 1;
  const at = { line, column: column > 0 ? column : 1 };
  if (name === "title") {
    builder.title = value;
    builder.place(["title"], at);
  } else if (name === "supply") {
    const [v, f] = value.split(/[\s/]+/);
    const vrms = parseValue(v ?? "", { unit: "V" });
    const hz = parseValue(f ?? "", { unit: "Hz" });
    if (!vrms.ok || !hz.ok)
      builder.errorAt(
        at,
        "bad-directive",
        "# supply: takes RMS volts and hertz, e.g. # supply: 230 50",
      );
    else {
      builder.supply = { vrms: vrms.value, hz: hz.value };
      builder.place(["device", "rated_supply"], at);
    }
  } else {
    const nets = tokenizeLine(value, line, at.column).tokens;
    if (!builder.applyRoleDirective(name, nets))
      builder.warnAt(at, "unknown-directive", `"# ${name}:" is not a directive; read as a comment`);
  }
}

function readRating(
  rawPart: Record<string, unknown>,
  index: number,
  field: SourceToken,
  builder: RawRecordBuilder,
): void {
  const keyed: SourceToken[] = [];
  for (const w of words(field)) {
    if (splitParam(w) !== null) {
      keyed.push(w);
      continue;
    }
    const rating = (rawPart.rating ??= {}) as Record<string, unknown>;
    builder.place(["parts", index, "rating"], w);
    if (SAFETY_CLASS.test(w.text)) {
      rating.class = w.text.toUpperCase();
      continue;
    }
    const read = parseValue(w.text);
    const key = read.ok
      ? ({ V: "volts", A: "amps", W: "watts" } as Record<string, string>)[read.unit ?? ""]
      : undefined;
    if (read.ok && key !== undefined) rating[key] = read.value;
    else if (read.ok)
      builder.errorAt(
        w,
        "bad-rating",
        `"${w.text}": give a unit (310V, 1A, 0.25W) or a key (volts=310)`,
      );
    else rating.package = w.text;
  }
  applyParams(rawPart, index, keyed, "record", builder);
}

function readPins(
  rawPart: Record<string, unknown>,
  index: number,
  field: SourceToken,
  builder: RawRecordBuilder,
): void {
  const ws = words(field);
  builder.place(["parts", index, "pins"], field);
  const keyed = ws.filter((w) => splitParam(w) !== null);
  if (keyed.length === 0) {
    rawPart.pins = ws.map((w) => w.text);
  } else if (keyed.length === ws.length) {
    const pins: Record<string, string> = {};
    for (const w of ws) {
      const eq = w.text.indexOf("=");
      const role = w.text.slice(0, eq);
      pins[role] = w.text.slice(eq + 1);
      builder.place(["parts", index, "pins", role], w);
    }
    rawPart.pins = pins;
  } else {
    builder.errorAt(field, "bad-pins", "pins are either all role=net or all plain net names");
    builder.markReported(["parts", index, "pins"]);
  }
}

function readCsvUnguarded(text: string, opts: ReadCsvOptions): ParseResult {
  if (text.length > MAX_RECORD_TEXT_CHARS) {
    return {
      ok: false,
      errors: [
        {
          path: "",
          code: "too-large",
          message: `a parts list is at most ${MAX_RECORD_TEXT_CHARS} characters`,
          line: null,
          column: null,
        },
      ],
    };
  }
  const builder = new RawRecordBuilder();
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  // leading comment and directive lines are blanked out, so the CSV keeps its line numbers
  let first = 0;
  while (
    first < lines.length &&
    (lines[first]!.trim() === "" || lines[first]!.trim().startsWith("#"))
  ) {
    readHeaderDirective(lines[first]!, first + 1, builder);
    lines[first] = "";
    first++;
  }
  if (builder.title === null)
    builder.title =
      opts.filename?.replace(/^.*[\\/]/, "").replace(/\.[^.]*$/, "") || "Imported parts list";
  const split = splitCsv(lines.join("\n"));
  if (!split.ok) {
    builder.errorAt(split, "csv-syntax", split.message);
    return builder.finish();
  }
  const [header, ...rows] = split.rows;
  if (header === undefined) {
    builder.errorAt(
      { line: 1, column: 1 },
      "csv-no-header",
      `a parts list starts with a header row: ${CSV_COLUMNS.join(",")}`,
    );
    return builder.finish();
  }
  const columns = header.fields.map((f) => f.text.toLowerCase());
  header.fields.forEach((f, i) => {
    if (!(CSV_COLUMNS as readonly string[]).includes(columns[i]!))
      builder.warnAt(f, "unknown-column", `column "${f.text}" is ignored`);
  });
  const missing = REQUIRED_COLUMNS.filter((c) => !columns.includes(c));
  if (missing.length > 0) {
    builder.errorAt(
      { line: header.line, column: 1 },
      "csv-missing-column",
      `the header lacks ${missing.join(", ")}`,
    );
    return builder.finish();
  }
  for (const row of rows) {
    if (row.fields.length !== columns.length) {
      builder.errorAt(
        { line: row.line, column: 1 },
        "csv-field-count",
        `this row has ${row.fields.length} fields; the header has ${columns.length}`,
      );
      continue;
    }
    const get = (name: string): SourceToken | undefined => {
      const f = row.fields[columns.indexOf(name)];
      return f === undefined || f.text === "" ? undefined : f;
    };
    const ref = get("ref");
    const kind = get("kind");
    const rawPart: Record<string, unknown> = { ref: ref?.text ?? "", kind: kind?.text ?? "" };
    const index = builder.addPart(rawPart, row.fields[0]!);
    if (ref !== undefined) builder.place(["parts", index, "ref"], ref);
    if (kind !== undefined) builder.place(["parts", index, "kind"], kind);
    for (const name of ["value", "tolerance", "marking", "note"] as const) {
      const f = get(name);
      if (f === undefined) continue;
      rawPart[name] = f.text;
      builder.place(["parts", index, name], f);
    }
    const flagWords = (["polarised", "closed"] as const).flatMap((name) => {
      const f = get(name);
      return f === undefined ? [] : [{ ...f, text: `${name}=${f.text}` }];
    });
    applyParams(rawPart, index, flagWords, "record", builder);
    const pins = get("pins");
    if (pins !== undefined) readPins(rawPart, index, pins, builder);
    else builder.place(["parts", index, "pins"], { line: row.line, column: 1 });
    const rating = get("rating");
    if (rating !== undefined) readRating(rawPart, index, rating, builder);
    const model = get("model");
    if (model !== undefined) applyParams(rawPart, index, words(model), "record", builder);
  }
  return builder.finish();
}

/** Reads a CSV parts list (columns above) into a validated record; never throws. */
export function readPartsCsv(text: string, opts: ReadCsvOptions = {}): ParseResult {
  try {
    return readCsvUnguarded(text, opts);
  } catch (e) {
    return internalFailure(e);
  }
}
