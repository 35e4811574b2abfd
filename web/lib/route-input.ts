/**
 * Small parsers for what a route gets besides its body: path ids (a malformed id is 404, the
 * same as an unknown one), query strings checked with zod, and the JSON answer helper.
 */
import { NextResponse } from "next/server";
import { z } from "zod";
import { notFound } from "./api-error";
import { DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE, type EntryListQuery } from "./entry-list";
import { nulByte, validate } from "./request-body";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id that must be a uuid; anything else is 404 (never a 500 from the database). */
export function uuidParam(value: string, what = "entry"): string {
  if (!UUID.test(value)) throw notFound(what);
  return value.toLowerCase();
}

/** A revision number from the path; anything but a positive integer is 404. */
export function revisionParam(value: string): number {
  if (!/^[1-9][0-9]{0,8}$/.test(value)) throw notFound("revision");
  return Number(value);
}

/** The query string as a plain object (the first value of each key). */
export function queryObject(req: Request): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of new URL(req.url).searchParams) {
    if (k.includes("\u0000") || v.includes("\u0000")) throw nulByte(k.replaceAll("\u0000", ""));
    if (!(k in out) && v !== "") out[k] = v;
  }
  return out;
}

/** Checks the query string against a schema (422 listing the problems). */
export function readQuery<S extends z.ZodType>(req: Request, schema: S): z.infer<S> {
  return validate(schema, queryObject(req), "query string");
}

const listQuery = z.object({
  q: z.string().max(200).optional(),
  category: z.string().max(100).optional(),
  flag: z.string().max(100).optional(),
  block: z.string().max(100).optional(),
  sort: z.enum(["updated", "title"]).default("updated"),
  archived: z.enum(["exclude", "include", "only"]).default("exclude"),
  limit: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(DEFAULT_PAGE_SIZE),
  cursor: z.string().max(500).optional(),
});

/** The list/search query of `GET /api/entries` and `GET /api/teams/:id/entries`. */
export function readListQuery(req: Request, teamId?: string): EntryListQuery {
  return { ...readQuery(req, listQuery), teamId };
}

/** A JSON answer. */
export function json(data: unknown, status = 200): NextResponse {
  return NextResponse.json(data, { status });
}
