/**
 * Splitting CSV text into rows of fields (RFC 4180: commas, double quotes, `""` inside quotes,
 * line breaks inside quotes), each field with the line and column where it starts.
 */
import type { SourceToken } from "./raw-record-builder.js";

/** One CSV row: its fields, and the line it starts on. */
export interface CsvRow {
  line: number;
  fields: SourceToken[];
}

/** The rows of a CSV text, or where its quoting breaks. */
export type CsvSplit =
  { ok: true; rows: CsvRow[] } | { ok: false; line: number; column: number; message: string };

/** Splits CSV text into rows; blank lines give no row. */
export function splitCsv(text: string): CsvSplit {
  const rows: CsvRow[] = [];
  let line = 1;
  let column = 1;
  let i = 0;
  let fields: SourceToken[] = [];
  let rowLine = 1;
  let field = "";
  let fieldLine = 1;
  let fieldColumn = 1;
  let quoted = false;
  let quoteLine = 0;
  let quoteColumn = 0;
  const endField = (): void => {
    fields.push({ text: field.trim(), line: fieldLine, column: fieldColumn });
    field = "";
  };
  const endRow = (): void => {
    endField();
    if (fields.length > 1 || fields[0]!.text !== "") rows.push({ line: rowLine, fields });
    fields = [];
  };
  while (i < text.length) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i += 2;
        column += 2;
        continue;
      }
      if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"' && field.trim() === "") {
      quoted = true;
      quoteLine = line;
      quoteColumn = column;
      field = "";
    } else if (ch === ",") {
      endField();
      fieldLine = line;
      fieldColumn = column + 1;
    } else if (ch === "\n" || ch === "\r") {
      if (ch === "\r" && text[i + 1] === "\n") i++;
      endRow();
      line++;
      column = 0;
      rowLine = line;
      fieldLine = line;
      fieldColumn = 1;
    } else {
      field += ch;
    }
    if ((ch === "\n" || ch === "\r") && quoted) {
      line++;
      column = 0;
    }
    i++;
    column++;
  }
  if (quoted)
    return {
      ok: false,
      line: quoteLine,
      column: quoteColumn,
      message: "a quoted field is not closed",
    };
  endRow();
  return { ok: true, rows };
}
