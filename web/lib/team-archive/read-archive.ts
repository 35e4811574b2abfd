/**
 * Reads and checks a whole archive before anything is written: line sizes, each line's shape,
 * the order of kinds, references between rows, photo keys, every file's hash and size, and the
 * closing line's count and hash. The first problem is returned with its line number.
 */
import { createHash } from "node:crypto";
import {
  lineSchemas,
  MAX_FILE_LINE_CHARS,
  MAX_ROW_LINE_CHARS,
  photoKeyIsSafe,
  type ArchiveLine,
} from "./archive-format";

/** A checked archive, grouped by kind, with each photo's bytes. */
export interface CheckedArchive {
  header: ArchiveLine<"header">;
  people: ArchiveLine<"person">[];
  members: ArchiveLine<"member">[];
  entries: ArchiveLine<"entry">[];
  revisions: ArchiveLine<"revision">[];
  analyses: ArchiveLine<"analysis">[];
  comments: ArchiveLine<"comment">[];
  photos: ArchiveLine<"photo">[];
  files: Map<string, Uint8Array>;
}

export type ArchiveProblem = { line: number; message: string };

/** Rows must come in this order, so every reference points to a row already read. */
const ORDER = ["header", "person", "member", "entry", "revision", "analysis", "comment", "photo"];

/** Checks `text`; the archive, or the first problem found. */
export function readArchive(text: string): CheckedArchive | ArchiveProblem {
  const all = text.endsWith("\n") ? text.slice(0, -1).split("\n") : text.split("\n");
  if (all.length < 2) return { line: 1, message: "not a team archive: too short" };
  const out: CheckedArchive = {
    header: undefined as unknown as ArchiveLine<"header">,
    people: [],
    members: [],
    entries: [],
    revisions: [],
    analyses: [],
    comments: [],
    photos: [],
    files: new Map(),
  };
  const ids = { people: new Set<string>(), entries: new Set<string>(), revs: new Set<string>() };
  const photoById = new Map<string, ArchiveLine<"photo">>();
  let stage = 0;
  for (let i = 0; i < all.length; i++) {
    const n = i + 1;
    const text = all[i]!;
    const isLast = i === all.length - 1;
    const limit = text.startsWith('{"kind":"file"') ? MAX_FILE_LINE_CHARS : MAX_ROW_LINE_CHARS;
    if (text.length > limit) return { line: n, message: `line is longer than ${limit} characters` };
    let raw: unknown;
    try {
      raw = JSON.parse(text);
    } catch {
      return { line: n, message: "line is not JSON" };
    }
    const kind = (raw as { kind?: unknown })?.kind;
    if (typeof kind !== "string" || !(kind in lineSchemas))
      return { line: n, message: `unknown line kind ${JSON.stringify(kind)}` };
    const parsed = lineSchemas[kind as keyof typeof lineSchemas].strict().safeParse(raw);
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      return { line: n, message: `${kind}.${issue.path.join(".")}: ${issue.message}` };
    }
    const row = parsed.data;
    if (i === 0 && row.kind !== "header")
      return { line: n, message: "the first line must be the header" };
    if (isLast !== (row.kind === "end"))
      return {
        line: n,
        message: isLast ? "the last line must be the end line" : "end line before the end",
      };
    if (row.kind === "end") {
      const body = all
        .slice(0, i)
        .map((l) => `${l}\n`)
        .join("");
      if (row.lines !== i)
        return { line: n, message: `end line counts ${row.lines} lines, found ${i}` };
      if (createHash("sha256").update(body).digest("hex") !== row.sha256)
        return {
          line: n,
          message: "the archive's hash does not match its lines (damaged or edited)",
        };
      break;
    }
    if (row.kind === "file") {
      const photo = photoById.get(row.photoId);
      if (!photo) return { line: n, message: `file for unknown photo ${row.photoId}` };
      if (out.files.has(row.photoId))
        return { line: n, message: `second file for photo ${row.photoId}` };
      const bytes = new Uint8Array(Buffer.from(row.base64, "base64"));
      const digest = createHash("sha256").update(bytes).digest("hex");
      if (bytes.byteLength !== photo.sizeBytes)
        return {
          line: n,
          message: `photo ${row.photoId} is ${bytes.byteLength} bytes, its row says ${photo.sizeBytes}`,
        };
      if (digest !== row.sha256 || digest !== photo.sha256)
        return { line: n, message: `photo ${row.photoId}'s bytes do not match their SHA-256` };
      out.files.set(row.photoId, bytes);
      continue;
    }
    const at = ORDER.indexOf(row.kind);
    if (at < stage) return { line: n, message: `${row.kind} line after ${ORDER[stage]} lines` };
    stage = at;
    const person = (id: string | null) => id === null || ids.people.has(id);
    switch (row.kind) {
      case "header":
        if (i !== 0) return { line: n, message: "a second header" };
        out.header = row;
        break;
      case "person":
        if (ids.people.has(row.id)) return { line: n, message: `person ${row.id} twice` };
        ids.people.add(row.id);
        out.people.push(row);
        break;
      case "member":
        if (!person(row.userId))
          return { line: n, message: `member ${row.userId} is not a person of the archive` };
        out.members.push(row);
        break;
      case "entry":
        if (ids.entries.has(row.id)) return { line: n, message: `entry ${row.id} twice` };
        if (!person(row.createdBy))
          return { line: n, message: `entry author ${row.createdBy} unknown` };
        ids.entries.add(row.id);
        out.entries.push(row);
        break;
      case "revision":
        if (!ids.entries.has(row.entryId))
          return { line: n, message: `revision of unknown entry ${row.entryId}` };
        if (!person(row.authorId))
          return { line: n, message: `revision author ${row.authorId} unknown` };
        ids.revs.add(row.id);
        out.revisions.push(row);
        break;
      case "analysis":
        if (!ids.revs.has(row.revisionId))
          return { line: n, message: `analysis of unknown revision ${row.revisionId}` };
        out.analyses.push(row);
        break;
      case "comment":
        if (!ids.entries.has(row.entryId))
          return { line: n, message: `comment on unknown entry ${row.entryId}` };
        if (!person(row.authorId))
          return { line: n, message: `comment author ${row.authorId} unknown` };
        out.comments.push(row);
        break;
      case "photo":
        if (!ids.entries.has(row.entryId))
          return { line: n, message: `photo of unknown entry ${row.entryId}` };
        if (!person(row.uploadedBy))
          return { line: n, message: `photo uploader ${row.uploadedBy} unknown` };
        if (!photoKeyIsSafe(row.storageKey, row.entryId, row.id))
          return {
            line: n,
            message: `photo ${row.id} has a storage name outside its entry's folder`,
          };
        photoById.set(row.id, row);
        out.photos.push(row);
        break;
    }
  }
  for (const p of out.photos)
    if (!out.files.has(p.id))
      return { line: all.length, message: `photo ${p.id} has no file line` };
  return out;
}
