/**
 * The front door for record files: YAML or JSON text in, the normalised `TeardownRecord` or
 * every problem (field path, line, column) out. It never throws: an unexpected failure inside
 * is itself reported as a problem, so absurd input still gets a structured answer.
 */
import type { InputError, ParseResult } from "./types.js";
import { ProblemList, sortByPlace } from "./input-errors.js";
import { readRecordText } from "./yaml-source.js";
import { validateRawRecord } from "./validate-record.js";
import { MAX_NESTING_DEPTH, nestingExceededAt } from "./nesting-depth.js";

/** Largest record text we read, in characters (a traced gadget is a few kilobytes). */
export const MAX_RECORD_TEXT_CHARS = 2_000_000;

/** Options of parseRecord. */
export interface ParseRecordOptions {
  /** The file's name; its extension picks YAML or JSON, otherwise the text is sniffed. */
  filename?: string;
}

/** The record format a file name or text stands for. */
export function recordFormatOf(text: string, filename?: string): "yaml" | "json" {
  const ext = filename?.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1];
  if (ext === "json") return "json";
  if (ext === "yaml" || ext === "yml") return "yaml";
  const first = text
    .replace(/^\uFEFF/, "")
    .trimStart()
    .charAt(0);
  return first === "{" || first === "[" ? "json" : "yaml";
}

/** A failure of the reader itself, reported rather than thrown. */
export function internalFailure(e: unknown): ParseResult {
  const message = e instanceof Error ? e.message : String(e);
  const error: InputError = {
    path: "",
    code: "unreadable",
    message: `the input could not be read: ${message}`,
    line: null,
    column: null,
  };
  return { ok: false, errors: [error] };
}

function parseRecordUnguarded(text: string, opts: ParseRecordOptions): ParseResult {
  if (typeof text !== "string") {
    return {
      ok: false,
      errors: [
        {
          path: "",
          code: "not-text",
          message: "a record must be given as text",
          line: null,
          column: null,
        },
      ],
    };
  }
  if (text.length > MAX_RECORD_TEXT_CHARS) {
    const message = `the file is ${text.length} characters; a record is at most ${MAX_RECORD_TEXT_CHARS}`;
    return {
      ok: false,
      errors: [{ path: "", code: "too-large", message, line: null, column: null }],
    };
  }
  const source = text.replace(/^\uFEFF/, "");
  const format = recordFormatOf(source, opts.filename);
  const deep = format === "json" ? nestingExceededAt(source) : -1;
  if (deep >= 0) {
    const line = source.slice(0, deep).split("\n").length;
    const message = `the file nests objects and arrays more than ${MAX_NESTING_DEPTH} levels deep`;
    return { ok: false, errors: [{ path: "", code: "too-deep", message, line, column: null }] };
  }
  const read = readRecordText(source, format);
  if (!read.ok) return { ok: false, errors: read.errors.map((e) => ({ path: "", ...e })) };
  const problems = new ProblemList(read.locator);
  for (const w of read.warnings) problems.warnAt(w, "", w.code, w.message);
  const result = validateRawRecord(read.raw, read.locator, problems);
  return result.ok ? { ...result, warnings: sortByPlace(result.warnings) } : result;
}

/** Parses and validates a record file (YAML or JSON); never throws. */
export function parseRecord(text: string, opts: ParseRecordOptions = {}): ParseResult {
  try {
    return parseRecordUnguarded(text, opts);
  } catch (e) {
    return internalFailure(e);
  }
}
