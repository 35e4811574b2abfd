// The lint rule that keeps the engine pure rejects wrong-way imports and ambient I/O, and lets
// the same imports through outside the engine.
import { ESLint } from "eslint";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const eslint = new ESLint({ cwd: projectRoot() });

async function problems(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(projectRoot(), file) });
  return (result?.messages ?? []).map((m) => `${m.ruleId}: ${m.message}`);
}

const ENGINE_FILE = "analysis-worker/engine/src/graph/wrong-way.ts";

describe("the engine import rule", () => {
  it.each([
    ['import pg from "pg";\nexport const x = pg;\n'],
    ['import { readFileSync } from "node:fs";\nexport const x = readFileSync;\n'],
    ['import { openDatabase } from "@teardown/db";\nexport const x = openDatabase;\n'],
    ['import { NextResponse } from "next/server";\nexport const x = NextResponse;\n'],
    ['import { schema } from "../../../../db/index.js";\nexport const x = schema;\n'],
  ])("rejects %s inside the engine", async (code) => {
    const found = await problems(ENGINE_FILE, code);
    expect(found.some((m) => m.startsWith("no-restricted-imports"))).toBe(true);
  });

  it("rejects the clock and ambient randomness inside the engine", async () => {
    const found = await problems(ENGINE_FILE, "export const t = Date.now() + Math.random();\n");
    expect(found.filter((m) => m.startsWith("no-restricted-properties"))).toHaveLength(2);
  });

  it("accepts an import of a sibling engine stage", async () => {
    expect(
      await problems(ENGINE_FILE, 'import { KINDS } from "./kinds.js";\nexport const x = KINDS;\n'),
    ).toEqual([]);
  });

  it("lets the worker import the database package", async () => {
    const code = 'import { openDatabase } from "@teardown/db";\nexport const x = openDatabase;\n';
    expect(await problems("analysis-worker/src/wrong-way.ts", code)).toEqual([]);
  });
});
