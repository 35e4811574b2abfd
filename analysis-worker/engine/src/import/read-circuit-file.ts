/**
 * The one front door for an uploaded circuit file: a record (YAML or JSON), a netlist deck or a
 * CSV parts list, picked by the file's extension, else by sniffing the text. Every reader gives
 * the same normalised record and the same kind of errors.
 */
import type { ParseResult } from "../record/types.js";
import { parseRecord } from "../record/parse-record.js";
import { readDeck } from "./read-deck.js";
import { readPartsCsv } from "./read-parts-csv.js";

/** The readers a file can go to. */
export type CircuitFileFormat = "record" | "deck" | "csv";

const EXTENSIONS: Readonly<Record<string, CircuitFileFormat>> = {
  yaml: "record",
  yml: "record",
  json: "record",
  cir: "deck",
  net: "deck",
  deck: "deck",
  sp: "deck",
  csv: "csv",
};

/** Which reader a file goes to: by extension, else by its first lines. */
export function circuitFileFormatOf(text: string, filename?: string): CircuitFileFormat {
  const ext = filename?.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1];
  if (ext !== undefined && EXTENSIONS[ext] !== undefined) return EXTENSIONS[ext];
  const body = typeof text === "string" ? text.replace(/^\uFEFF/, "") : "";
  const first = body.trimStart().charAt(0);
  if (first === "{" || first === "[" || /^record\s*:/m.test(body)) return "record";
  const lines = body
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l !== "" && !l.startsWith("#"));
  if (
    lines[0] !== undefined &&
    /^"?ref"?\s*,/i.test(lines[0]) &&
    /(^|,)\s*"?kind"?\s*(,|$)/i.test(lines[0])
  )
    return "csv";
  const elementLines = lines.slice(1).filter((l) => /^([RCLDX][A-Za-z0-9_]*\s|\*|\+|\.)/i.test(l));
  if (
    lines.some((l) => /^\.end\b/i.test(l)) ||
    (lines.length > 1 && elementLines.length === lines.length - 1)
  )
    return "deck";
  return "record";
}

/** Reads any circuit file the app accepts into a validated record; never throws. */
export function readCircuitFile(text: string, opts: { filename?: string } = {}): ParseResult {
  switch (circuitFileFormatOf(text, opts.filename)) {
    case "record":
      return parseRecord(text, opts);
    case "deck":
      return readDeck(text);
    case "csv":
      return readPartsCsv(text, opts);
  }
}
