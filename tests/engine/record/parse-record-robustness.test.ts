/**
 * 10,000 random and mutated inputs: parseRecord must answer each with a structured result and
 * never throw. Mutations start from valid generated records and delete keys, change types and
 * put garbage in values, then write the tree as YAML or JSON.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { stringify } from "yaml";
import { parseRecord, type InputError, type ParseResult } from "@teardown/engine";
import { validRawRecord } from "./record-arbitraries.js";

function assertStructured(result: ParseResult): void {
  expect(typeof result.ok).toBe("boolean");
  const problems: InputError[] = result.ok ? result.warnings : result.errors;
  if (!result.ok) expect(problems.length).toBeGreaterThan(0);
  // "unreadable" is the safety net for a reader bug; these inputs must not need it
  expect(problems.filter((p) => p.code === "unreadable")).toEqual([]);
  for (const p of problems) {
    expect(typeof p.path).toBe("string");
    expect(typeof p.code).toBe("string");
    expect(p.message.length).toBeGreaterThan(0);
    expect(p.line === null || (Number.isInteger(p.line) && p.line >= 1)).toBe(true);
    expect(p.column === null || (Number.isInteger(p.column) && p.column >= 1)).toBe(true);
  }
}

type Tree = unknown;

/** All paths to nodes in a tree (objects and arrays), for picking a place to mutate. */
function paths(
  tree: Tree,
  prefix: (string | number)[] = [],
  out: (string | number)[][] = [],
): (string | number)[][] {
  out.push(prefix);
  if (Array.isArray(tree)) tree.forEach((v, i) => paths(v, [...prefix, i], out));
  else if (typeof tree === "object" && tree !== null)
    for (const [k, v] of Object.entries(tree)) paths(v, [...prefix, k], out);
  return out;
}

const garbage = fc.oneof(
  fc.anything({ maxDepth: 3 }),
  fc.constantFrom(
    "",
    "4x7",
    "1e999",
    "330nF",
    "-1",
    "∞",
    "%",
    "R",
    "NaN",
    "\u0000",
    "a b",
    1e308,
    -0,
    2 ** 53 + 1,
  ),
  fc.string({ unit: "binary", maxLength: 20 }),
);

type Mutation = { kind: "delete" | "replace"; at: number; value: unknown };
const mutation: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom("delete" as const, "replace" as const),
  at: fc.nat(),
  value: garbage,
});

function mutate(tree: Tree, m: Mutation): Tree {
  const copy = structuredClone(tree) as Record<string, unknown>;
  const all = paths(copy).filter((p) => p.length > 0);
  const path = all[m.at % all.length];
  if (path === undefined) return copy;
  let parent: unknown = copy;
  for (const seg of path.slice(0, -1)) parent = (parent as Record<string | number, unknown>)[seg];
  const last = path[path.length - 1]!;
  if (m.kind === "delete" && Array.isArray(parent) && typeof last === "number")
    parent.splice(last, 1);
  else if (m.kind === "delete") delete (parent as Record<string, unknown>)[last];
  else (parent as Record<string | number, unknown>)[last] = m.value;
  return copy;
}

function toText(tree: Tree, format: "yaml" | "json"): string {
  try {
    return format === "json" ? (JSON.stringify(tree) ?? "null") : stringify(tree);
  } catch {
    return String(tree);
  }
}

describe("parseRecord robustness", () => {
  it("answers 4,000 mutated valid records with structured results", () => {
    fc.assert(
      fc.property(
        validRawRecord,
        fc.array(mutation, { minLength: 1, maxLength: 4 }),
        fc.constantFrom("yaml" as const, "json" as const),
        (raw, ms, format) => {
          const tree = ms.reduce<Tree>(mutate, raw);
          assertStructured(parseRecord(toText(tree, format), { filename: `m.${format}` }));
        },
      ),
      { numRuns: 4000 },
    );
  });

  it("answers 3,000 random object trees written as YAML or JSON", () => {
    fc.assert(
      fc.property(
        fc.anything({ maxDepth: 4 }),
        fc.constantFrom("yaml" as const, "json" as const),
        (tree, format) => {
          assertStructured(parseRecord(toText(tree, format), { filename: `t.${format}` }));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it("answers 3,000 random texts, binary included, without throwing", () => {
    const yamlish = fc
      .array(
        fc.constantFrom(
          "record: 1\n",
          "title: x\n",
          "parts:\n",
          "  - ",
          "ref: R1",
          "{",
          "}",
          "[",
          "]",
          ": ",
          "- ",
          "&a ",
          "*a",
          '"',
          "'",
          "\t",
          "\n",
          "#",
          "%YAML 1.2\n",
          "---\n",
          "value: 4k7\n",
          ",",
        ),
        { maxLength: 30 },
      )
      .map((a) => a.join(""));
    fc.assert(
      fc.property(
        fc.oneof(fc.string({ unit: "binary", maxLength: 200 }), yamlish),
        fc.constantFrom(undefined, "x.json", "x.yaml"),
        (text, filename) => {
          assertStructured(parseRecord(text, filename === undefined ? {} : { filename }));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it("rejects a mutation that deletes a required field, naming that field", () => {
    fc.assert(
      fc.property(validRawRecord, fc.constantFrom("record", "title", "parts"), (raw, key) => {
        const tree = { ...raw };
        delete tree[key];
        const result = parseRecord(stringify(tree));
        expect(result.ok).toBe(false);
        if (!result.ok) expect(result.errors.map((e) => e.path)).toContain(key);
      }),
      { numRuns: 200 },
    );
  });
});
