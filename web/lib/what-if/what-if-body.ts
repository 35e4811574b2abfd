/**
 * The what-if request body, `{ supply?: { vrms, hz }, changes?: [{ part, value }] }`, read with
 * problems named the way a person writes them (`changes[0].value`), and checked against the
 * entry's record so an unknown part or an unreadable value is a 422 naming its place.
 */
import { z } from "zod";
import { checkWhatIf, type CheckedWhatIf, type TeardownRecord } from "@teardown/engine";
import { ApiError, type ProblemDetail } from "../api-error";
import { parseJsonText, readBytes, mediaType } from "../request-body";

/** A what-if body is small: a supply and a few values. */
export const MAX_WHAT_IF_BODY_BYTES = 16 * 1024;

const whatIfBody = z.strictObject({
  supply: z.strictObject({ vrms: z.number(), hz: z.number() }).optional(),
  changes: z
    .array(
      z.strictObject({
        part: z.string().min(1).max(64),
        value: z.union([z.number(), z.string().max(64)]),
      }),
    )
    .optional(),
});
export type WhatIfBody = z.infer<typeof whatIfBody>;

/** A zod path as written in the issue and the docs: `changes[0].part`. */
export function bracketPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const k of path)
    out += typeof k === "number" ? `[${k}]` : out === "" ? String(k) : `.${String(k)}`;
  return out || "(body)";
}

function unprocessable(errors: ProblemDetail[]): ApiError {
  const first = errors[0]!;
  return new ApiError(
    422,
    "invalid-what-if",
    `the what-if is not valid: ${first.path}: ${first.message}`,
    {
      path: first.path,
      errors,
    },
  );
}

/** The body of a what-if request (415 unless JSON, 413 past the limit, 422 with paths). */
export async function readWhatIfBody(req: Request): Promise<WhatIfBody> {
  const type = mediaType(req);
  if (type !== "application/json")
    throw new ApiError(
      415,
      "unsupported-media-type",
      `send the what-if as application/json (got ${type || "no content type"})`,
    );
  const text = new TextDecoder().decode(await readBytes(req, MAX_WHAT_IF_BODY_BYTES));
  const parsed = whatIfBody.safeParse(parseJsonText(text));
  if (!parsed.success)
    throw unprocessable(
      parsed.error.issues.map((i) => ({
        path: bracketPath(i.path),
        message: i.message,
        code: i.code,
      })),
    );
  return parsed.data;
}

/** The body checked against the record: the variant to analyse, or 422 naming each bad field. */
export function checkedWhatIf(record: TeardownRecord, body: WhatIfBody): CheckedWhatIf {
  const checked = checkWhatIf(record, body);
  if (!checked.ok)
    throw unprocessable(
      checked.errors.map((e) => ({ path: e.path, message: e.message, code: e.code })),
    );
  return checked.value;
}
