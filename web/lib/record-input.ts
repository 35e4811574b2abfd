/**
 * A record submitted to the API, as a JSON body holding the record document or as an uploaded
 * file (YAML/JSON record, netlist deck, CSV parts list) in a multipart form. Either way the
 * engine reads it; a malformed record is a 422 listing every problem with its path and line.
 * What is stored is the normalised record written back as a record document.
 */
import { z } from "zod";
import { MAX_RECORD_TEXT_CHARS, type TeardownRecord } from "@teardown/engine";
import { ApiError } from "./api-error";
import { readRecordOffThread } from "./record-parse/record-parse-pool";
import { takeUploadAllowance } from "./record-parse/upload-rate";
import {
  MAX_JSON_BODY_BYTES,
  MAX_JSON_DEPTH,
  MULTIPART_OVERHEAD_BYTES,
  depthExceededAt,
  formFile,
  formText,
  mediaType,
  parseJsonText,
  readBytes,
  readForm,
  validate,
} from "./request-body";

/** A record that passed the engine, and the document to store for it. */
export interface AcceptedRecord {
  record: TeardownRecord;
  document: Record<string, unknown>;
  warnings: {
    path: string;
    line: number | null;
    column: number | null;
    code: string;
    message: string;
  }[];
}

/** The largest uploaded circuit file, in bytes (the engine reads at most this many characters). */
export const MAX_CIRCUIT_FILE_BYTES = MAX_RECORD_TEXT_CHARS;

/**
 * Reads circuit-file text with the engine, in a reader thread (see record-parse-pool): the
 * accepted record, or 422 with every error; 503 when the readers are all busy. NUL bytes and
 * absurd nesting are refused first, without a thread.
 */
export async function acceptRecordText(text: string, filename?: string): Promise<AcceptedRecord> {
  const nul = text.indexOf("\u0000");
  if (nul >= 0) {
    const line = text.slice(0, nul).split("\n").length;
    throw new ApiError(
      400,
      "nul-character",
      `file: line ${line} contains a NUL character (U+0000)`,
      {
        path: "file",
        errors: [
          {
            path: "file",
            line,
            column: null,
            code: "nul-character",
            message: "a NUL character (U+0000)",
          },
        ],
      },
    );
  }
  // A JSON file nested 100k deep exhausts the process's memory inside the reader; refuse such
  // nesting first, by the same count as JSON bodies (a record is a few levels deep).
  if (/\.json$/i.test(filename ?? "") || /^\s*[[{]/.test(text)) {
    const deep = depthExceededAt(text);
    if (deep >= 0) {
      const line = text.slice(0, deep).split("\n").length;
      throw new ApiError(
        400,
        "too-deep",
        `file: line ${line} nests objects and arrays more than ${MAX_JSON_DEPTH} levels deep`,
        { path: "file" },
      );
    }
  }
  const read = await readRecordOffThread(text, filename);
  switch (read.kind) {
    case "busy":
      throw new ApiError(
        503,
        "busy",
        "the server is reading other uploads; try again in a few seconds",
        { retryAfterSeconds: 5 },
      );
    case "timeout":
      throw new ApiError(
        422,
        "record-too-slow",
        `the record took longer than ${read.budgetMs / 1000} s to read; split it or simplify it`,
        { path: "record" },
      );
    case "crash":
      throw new Error(`record reader failed: ${read.message}`);
    case "read":
      break;
  }
  if (!read.ok) {
    const first = read.errors[0];
    const where = first
      ? `${first.path || "(file)"}${first.line !== null ? ` (line ${first.line})` : ""}: ${first.message}`
      : "unknown problem";
    throw new ApiError(
      422,
      "invalid-record",
      `the record has ${read.errors.length} problem(s); first: ${where}`,
      {
        errors: read.errors.map((e) => ({
          path: e.path,
          line: e.line,
          column: e.column,
          code: e.code,
          message: e.message,
        })),
      },
    );
  }
  checkStoredSize(read.document);
  return { record: read.record, document: read.document, warnings: read.warnings };
}

/**
 * The limit applies to the stored form, not only to the upload: the worker reads a revision back
 * as compact JSON through the same reader, which refuses more than MAX_RECORD_TEXT_CHARS. A
 * compact deck or YAML file can grow past that as JSON, and would then be accepted here only to
 * fail its analysis; so it is refused now, with both sizes named.
 */
export function checkStoredSize(document: Record<string, unknown>): void {
  const stored = JSON.stringify(document).length;
  if (stored <= MAX_RECORD_TEXT_CHARS) return;
  throw new ApiError(
    413,
    "too-large",
    `the record is ${stored} characters once stored as JSON; the limit is ${MAX_RECORD_TEXT_CHARS}. Split the board into several entries, or trim notes.`,
    { path: "record", limitChars: MAX_RECORD_TEXT_CHARS, storedChars: stored },
  );
}

/** Reads a record document given as a JSON value (pretty-printed first, so errors carry lines). */
export function acceptRecordDocument(doc: unknown): Promise<AcceptedRecord> {
  return acceptRecordText(JSON.stringify(doc, null, 2), "record.json");
}

/** Fields that may travel beside a record (entry metadata and revision details). */
export const submissionFields = z.object({
  title: z.string().trim().min(1).max(200).optional(),
  category: z.string().trim().max(100).nullable().optional(),
  visibility: z.enum(["team", "public"]).optional(),
  message: z.string().max(2000).optional(),
  baseRevision: z.coerce.number().int().positive().optional(),
});
export type SubmissionFields = z.infer<typeof submissionFields>;

const jsonSubmission = submissionFields.extend({ record: z.record(z.string(), z.unknown()) });

/** A record with its fields, from a JSON body (`{ record, ...fields }`) or a form (`file` + fields). */
export async function readRecordSubmission(
  req: Request,
  callerKey: string,
): Promise<{ accepted: AcceptedRecord; fields: SubmissionFields; filename: string | null }> {
  // Before the body is read: reading records is the costly part of a request.
  takeUploadAllowance(callerKey);
  const type = mediaType(req);
  if (type === "application/json") {
    const bytes = await readBytes(req, MAX_JSON_BODY_BYTES);
    const body = validate(jsonSubmission, parseJsonText(new TextDecoder().decode(bytes)));
    const { record, ...fields } = body;
    return { accepted: await acceptRecordDocument(record), fields, filename: null };
  }
  if (type === "multipart/form-data") {
    const form = await readForm(
      req,
      MAX_CIRCUIT_FILE_BYTES + MULTIPART_OVERHEAD_BYTES,
      "uploaded file",
      MAX_CIRCUIT_FILE_BYTES,
    );
    const file = formFile(form, "file");
    let text: string;
    try {
      text = new TextDecoder("utf-8", { fatal: true }).decode(await file.arrayBuffer());
    } catch {
      throw new ApiError(
        415,
        "unsupported-media-type",
        "the uploaded circuit file is not UTF-8 text (a YAML or JSON record, a netlist deck or a CSV parts list)",
        { path: "file" },
      );
    }
    const raw: Record<string, string> = {};
    for (const key of ["title", "category", "visibility", "message", "baseRevision"]) {
      const v = formText(form, key);
      if (v !== undefined && v !== "") raw[key] = v;
    }
    const fields = validate(submissionFields, raw);
    return {
      accepted: await acceptRecordText(text, file.name || undefined),
      fields,
      filename: file.name || null,
    };
  }
  throw new ApiError(
    415,
    "unsupported-media-type",
    `send application/json with a \`record\`, or multipart/form-data with a \`file\` (got ${type || "no content type"})`,
  );
}
