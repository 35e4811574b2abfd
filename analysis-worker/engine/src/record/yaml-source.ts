/**
 * Reading record text (YAML, or JSON, which is YAML 1.2 too) into a raw object plus a locator
 * that maps a field path to the 1-based line and column of its node, from the yaml package's
 * node ranges and a LineCounter. JSON is first checked by JSON.parse, because the YAML reader
 * is more forgiving than JSON (it accepts a trailing comma, for one).
 */
import {
  LineCounter,
  isAlias,
  isMap,
  isPair,
  isScalar,
  isSeq,
  parseDocument,
  visit,
  type Document,
  type Node,
} from "yaml";
import type { LineColumn, PathSegment, SourceLocator } from "./input-errors.js";

/** Most aliases a document may expand (guards against "billion laughs" input). */
export const MAX_YAML_ALIAS_EXPANSIONS = 100;

/** Fields whose value is text even when YAML reads it as a number (`marking: 104`). */
const TEXT_FIELDS = new Set([
  "title",
  "summary",
  "category",
  "marking",
  "note",
  "instrument",
  "class",
  "package",
]);

/** A syntax problem at a place in the text. */
export interface SyntaxProblem extends LineColumn {
  code: string;
  message: string;
}

/** The raw tree and its locator, or the syntax problems. */
export type ReadTextResult =
  | { ok: true; raw: unknown; locator: SourceLocator; warnings: SyntaxProblem[] }
  | { ok: false; errors: SyntaxProblem[] };

function nodeAt(
  doc: Document,
  path: readonly PathSegment[],
): { node: Node | null; keyNode: Node | null; depth: number } {
  let node: Node | null = doc.contents as Node | null;
  let keyNode: Node | null = null;
  let depth = 0;
  for (const seg of path) {
    if (node !== null && isAlias(node)) node = (node.resolve(doc) as Node | undefined) ?? null;
    if (node === null) break;
    let next: Node | null = null;
    let nextKey: Node | null = null;
    if (isMap(node)) {
      const pair = node.items.find(
        (p) => isPair(p) && isScalar(p.key) && String(p.key.value) === String(seg),
      );
      if (pair !== undefined) {
        nextKey = pair.key as Node;
        next = (pair.value as Node | null) ?? null;
        if (next === null || (isScalar(next) && next.range === undefined)) next = nextKey;
      }
    } else if (isSeq(node) && typeof seg === "number") {
      next = (node.items[seg] as Node | undefined) ?? null;
    }
    if (next === null) break;
    node = next;
    keyNode = nextKey;
    depth++;
  }
  return { node, keyNode, depth };
}

function makeLocator(doc: Document, lines: LineCounter): SourceLocator {
  const at = (offset: number | undefined): LineColumn => {
    if (offset === undefined) return { line: null, column: null };
    const pos = lines.linePos(offset);
    return { line: pos.line, column: pos.col };
  };
  return {
    place(path) {
      const { node, keyNode, depth } = nodeAt(doc, path);
      // a missing field is placed at the key of its parent when there is one
      const target = depth < path.length && keyNode !== null ? keyNode : node;
      return at(target?.range?.[0]);
    },
    numberText(path) {
      const { node, depth } = nodeAt(doc, path);
      if (
        depth !== path.length ||
        node === null ||
        !isScalar(node) ||
        typeof node.value !== "number"
      )
        return null;
      return typeof node.source === "string" ? node.source : null;
    },
  };
}

/** The first line of a parser message; a stack overflow is told as what it means here. */
function syntaxMessage(message: string): string {
  if (/call stack/i.test(message)) return "the document is nested too deeply to read";
  return message.split("\n")[0]!;
}

/** Where JSON.parse says its error is, as an offset into the text. */
function jsonErrorOffset(message: string, text: string): number | null {
  const pos = /position (\d+)/.exec(message);
  if (pos !== null) return Number(pos[1]);
  if (/end of JSON input/i.test(message)) return text.length;
  return null;
}

/** Scalars of text fields that YAML read as numbers or booleans get their source text back. */
function restoreTextFields(doc: Document): void {
  visit(doc, {
    Pair(_, pair) {
      if (!isScalar(pair.key) || !isScalar(pair.value)) return;
      const key = String(pair.key.value);
      const v = pair.value;
      if (
        TEXT_FIELDS.has(key) &&
        (typeof v.value === "number" || typeof v.value === "boolean") &&
        typeof v.source === "string"
      ) {
        v.value = v.source;
      }
    },
    Seq(_key, seq, path) {
      const parent = path[path.length - 1];
      if (!isPair(parent) || !isScalar(parent.key) || parent.key.value !== "tags") return;
      for (const item of seq.items) {
        if (isScalar(item) && typeof item.value === "number" && typeof item.source === "string")
          item.value = item.source;
      }
    },
  });
}

/** Reads YAML or JSON text into a raw value and a locator; syntax errors carry line and column. */
export function readRecordText(text: string, format: "yaml" | "json"): ReadTextResult {
  const lines = new LineCounter();
  if (format === "json") {
    try {
      JSON.parse(text);
    } catch (e) {
      const message = e instanceof Error ? e.message : String(e);
      const offset = jsonErrorOffset(message, text);
      // the offset is counted on the same text, so the LineCounter of a YAML pass can place it
      const counter = new LineCounter();
      parseDocument(text, { lineCounter: counter, prettyErrors: false });
      const pos = offset === null ? null : counter.linePos(offset);
      return {
        ok: false,
        errors: [
          {
            code: "json-syntax",
            message: `not valid JSON: ${message}`,
            line: pos?.line ?? null,
            column: pos?.col ?? null,
          },
        ],
      };
    }
  }
  const doc = parseDocument(text, {
    lineCounter: lines,
    prettyErrors: false,
    uniqueKeys: true,
    keepSourceTokens: false,
  });
  const place = (pos: [number, number] | undefined): LineColumn => {
    if (pos === undefined) return { line: null, column: null };
    const p = lines.linePos(pos[0]);
    return { line: p.line, column: p.col };
  };
  const code = format === "json" ? "json-syntax" : "yaml-syntax";
  if (doc.errors.length > 0) {
    return {
      ok: false,
      errors: doc.errors.map((e) => ({ code, message: syntaxMessage(e.message), ...place(e.pos) })),
    };
  }
  const warnings = doc.warnings.map((w) => ({
    code: "yaml-warning",
    message: w.message.split("\n")[0]!,
    ...place(w.pos),
  }));
  restoreTextFields(doc);
  let raw: unknown;
  try {
    raw = doc.toJS({ maxAliasCount: MAX_YAML_ALIAS_EXPANSIONS });
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    return {
      ok: false,
      errors: [
        { code, message: `cannot expand the document: ${message}`, line: null, column: null },
      ],
    };
  }
  return { ok: true, raw, locator: makeLocator(doc, lines), warnings };
}
