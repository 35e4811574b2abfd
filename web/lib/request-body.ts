/**
 * Reading request bodies at the edge: a byte limit enforced before and while reading (413 names
 * the limit), the content type checked (415), JSON parsed (400) and checked with a zod schema
 * (422 with each problem's path). Multipart forms are read through the same capped reader.
 */
import type { z } from "zod";
import { MAX_NESTING_DEPTH, nestingExceededAt } from "@teardown/engine";
import { ApiError, type ProblemDetail } from "./api-error";

/** The largest JSON body accepted, in bytes (a record document plus its envelope). */
export const MAX_JSON_BODY_BYTES = 2 * 1024 * 1024;
/** Room for multipart boundaries and the small text fields beside an uploaded file, in bytes. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(bytes % (1024 * 1024) === 0 ? 0 : 1)} MB`;
}

/** 413 naming the limit. */
export function tooLarge(limitBytes: number, what = "request body"): ApiError {
  return new ApiError(
    413,
    "too-large",
    `the ${what} is larger than the limit of ${megabytes(limitBytes)} (${limitBytes} bytes)`,
    { limitBytes },
  );
}

/** The media type of a request, lower case, without parameters. */
export function mediaType(req: Request): string {
  return (req.headers.get("content-type") ?? "").split(";")[0]!.trim().toLowerCase();
}

/**
 * The body's bytes, refusing (413) as soon as it passes `limitBytes`, declared or actual. The
 * answer names `namedLimitBytes` (the file's own limit when the cap includes form overhead).
 */
export async function readBytes(
  req: Request,
  limitBytes: number,
  what?: string,
  namedLimitBytes = limitBytes,
): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > limitBytes) throw tooLarge(namedLimitBytes, what);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limitBytes) {
      await reader.cancel().catch(() => {});
      throw tooLarge(namedLimitBytes, what);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** zod issues as the API's problem list. */
export function zodProblems(error: z.ZodError): ProblemDetail[] {
  return error.issues.map((i) => ({
    path: i.path.map(String).join(".") || "(body)",
    message: i.message,
    code: i.code,
  }));
}

/** Checks a value against a schema, or throws 422 listing every problem. */
export function validate<S extends z.ZodType>(
  schema: S,
  value: unknown,
  what = "request",
): z.infer<S> {
  const parsed = schema.safeParse(value);
  if (!parsed.success) {
    const errors = zodProblems(parsed.error);
    throw new ApiError(
      422,
      "invalid-request",
      `the ${what} is not valid: ${errors[0]?.path}: ${errors[0]?.message}`,
      { errors },
    );
  }
  return parsed.data;
}

/** JSON nesting limits live with the record reader, which refuses deep record files too. */
export const MAX_JSON_DEPTH = MAX_NESTING_DEPTH;
export const depthExceededAt = nestingExceededAt;

/** Parses JSON text, or throws 400 (not JSON, or nested deeper than MAX_JSON_DEPTH). */
export function parseJsonText(text: string, where = "(body)"): unknown {
  const deep = depthExceededAt(text);
  if (deep >= 0) {
    throw new ApiError(
      400,
      "too-deep",
      `${where} nests objects and arrays more than ${MAX_JSON_DEPTH} levels deep (at character ${deep})`,
      { path: where },
    );
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (err) {
    throw new ApiError(
      400,
      "invalid-json",
      `the body is not valid JSON: ${(err as Error).message}`,
      {
        path: where,
      },
    );
  }
  rejectNulBytes(value, where === "(body)" ? "" : where);
  return value;
}

/**
 * Throws 400 naming the first string (or key) holding a NUL character. Postgres text cannot
 * store U+0000, so such a value would otherwise fail deep inside a write.
 */
export function rejectNulBytes(value: unknown, path = ""): void {
  const at = (k: string) => (path ? `${path}.${k}` : k);
  if (typeof value === "string") {
    if (value.includes("\u0000")) throw nulByte(path || "(body)");
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => rejectNulBytes(v, at(String(i))));
  } else if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (k.includes("\u0000")) throw nulByte(at(k));
      rejectNulBytes(v, at(k));
    }
  }
}

/** 400 for a NUL character in the named field. */
export function nulByte(path: string): ApiError {
  return new ApiError(400, "nul-character", `${path} contains a NUL character (U+0000)`, { path });
}

/** A JSON body checked against `schema` (415 unless application/json, 413 past the limit). */
export async function readJson<S extends z.ZodType>(
  req: Request,
  schema: S,
  limitBytes = MAX_JSON_BODY_BYTES,
): Promise<z.infer<S>> {
  const type = mediaType(req);
  if (type !== "application/json" && !type.endsWith("+json")) {
    throw new ApiError(
      415,
      "unsupported-media-type",
      `send the body as application/json (got ${type || "no content type"})`,
    );
  }
  const bytes = await readBytes(req, limitBytes);
  return validate(schema, parseJsonText(new TextDecoder().decode(bytes)));
}

/** A multipart form read through the capped reader (415 unless multipart/form-data). */
export async function readForm(
  req: Request,
  limitBytes: number,
  what?: string,
  namedLimitBytes = limitBytes,
): Promise<FormData> {
  if (mediaType(req) !== "multipart/form-data") {
    throw new ApiError(415, "unsupported-media-type", "send the upload as multipart/form-data");
  }
  const bytes = await readBytes(req, limitBytes, what, namedLimitBytes);
  try {
    return await new Response(bytes as BodyInit, {
      headers: { "content-type": req.headers.get("content-type")! },
    }).formData();
  } catch {
    throw new ApiError(400, "invalid-form", "the multipart body could not be read");
  }
}

/** A text field of a form, or undefined when absent. */
export function formText(form: FormData, name: string): string | undefined {
  const v = form.get(name);
  if (typeof v === "string" && v.includes("\u0000")) throw nulByte(name);
  return typeof v === "string" ? v : undefined;
}

/** The file field of a form, or throws 422 naming the field. */
export function formFile(form: FormData, name: string): File {
  const v = form.get(name);
  if (v === null || typeof v === "string")
    throw new ApiError(422, "invalid-request", `the form needs a file in the field \`${name}\``, {
      path: name,
    });
  return v;
}
