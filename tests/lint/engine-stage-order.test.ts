// The stage-order lint rule bites on a wrong-way import between engine stages (a later stage
// imported by an earlier one), lets right-way imports through, and leaves code outside the
// engine alone.
import { ESLint } from "eslint";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const eslint = new ESLint({ cwd: projectRoot() });
const RULE = "engine-stages/engine-stage-order";

async function stageProblems(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(projectRoot(), file) });
  return (result?.messages ?? []).filter((m) => m.ruleId === RULE).map((m) => m.message);
}

const src = (p: string) => `analysis-worker/engine/src/${p}`;

describe("the engine stage-order rule", () => {
  it.each([
    ["solver/wrong-way.ts", 'import { cycleFigures } from "../figures/circuit-figures.js";'],
    ["solver/variants/wrong-way.ts", 'import type { Flag } from "../../flags/flag-types.js";'],
    ["figures/wrong-way.ts", 'import { cite } from "../flags/citations.js";'],
    ["flags/wrong-way.ts", 'import { analyzeRecord } from "../analyze.js";'],
    ["graph/wrong-way.ts", 'export { findBlocks } from "../blocks/find-blocks.js";'],
    ["record/wrong-way.ts", 'import { solveSteady } from "../solver/variants/steady-variant.js";'],
    ["blocks/wrong-way.ts", 'export * from "../solver/mna.js";'],
  ])("rejects a wrong-way import in %s", async (file, code) => {
    const found = await stageProblems(src(file), `${code}\nexport const x = 1;\n`);
    expect(found).toHaveLength(1);
    expect(found[0]).toMatch(/may not import .* engine stages flow one way/);
  });

  it.each([
    [
      "flags/right-way.ts",
      'import type { SteadyCircuit } from "../solver/variants/steady-variant.js";',
    ],
    ["flags/types-only.ts", 'import { type Budget } from "../solver/transient.js";'],
    ["flags/reads-figures.ts", 'import { SURGE_KINDS } from "../figures/risk-variants.js";'],
    ["figures/right-way.ts", 'import { GROUND } from "../solver/circuit-model.js";'],
    ["solver/variants/right-way.ts", 'import { compileCircuit } from "../circuit-model.js";'],
    ["analyze-right-way.ts", 'import { judgeRisks } from "./flags/judge-risks.js";'],
    ["analyze-runs-variants.ts", 'import { simulateUnplug } from "./solver/variants/unplug.js";'],
    ["solver/right-way.ts", 'import { ENGINE_VERSION } from "../engine-version.js";'],
    ["record/right-way.ts", 'import { parseValue } from "../values/parse-value.js";'],
  ])("accepts a right-way import in %s", async (file, code) => {
    expect(await stageProblems(src(file), `${code}\nexport const x = 1;\n`)).toEqual([]);
  });

  it.each([
    ["flags/runs-unplug.ts", 'import { simulateUnplug } from "../solver/variants/unplug.js";'],
    ["flags/spends-budget.ts", 'import { budgetSpent } from "../solver/variants/budget.js";'],
    ["flags/mixed.ts", 'import { type Budget, makeBudget } from "../solver/variants/budget.js";'],
    ["flags/side-effect.ts", 'import "../solver/transient.js";'],
    [
      "flags/re-export.ts",
      'export { simulateCrestSwitchOn } from "../solver/variants/plug-in.js";',
    ],
  ])("rejects a solver value imported by the flags in %s", async (file, code) => {
    const found = await stageProblems(src(file), `${code}\nexport const x = 1;\n`);
    expect(found).toHaveLength(1);
    expect(found[0]).toMatch(/flags\/ may import only types from solver\//);
  });

  it("finds no solver value imported by the flags stage as it stands", async () => {
    const results = await eslint.lintFiles([src("flags/*.ts")]);
    const found = results.flatMap((r) =>
      r.messages.filter((m) => m.ruleId === RULE).map((m) => `${r.filePath}: ${m.message}`),
    );
    expect(results.length).toBeGreaterThan(10);
    expect(found).toEqual([]);
  });

  it("names an engine folder it does not know", async () => {
    const found = await stageProblems(
      src("solver/x.ts"),
      'import { y } from "../mystery/y.js";\nexport const x = y;\n',
    );
    expect(found).toEqual([expect.stringMatching(/mystery\/ is not an engine stage/)]);
  });

  it("leaves files outside the engine alone", async () => {
    const code = 'import { x } from "./figures/anything.js";\nexport const y = x;\n';
    expect(await stageProblems("analysis-worker/src/solver/wrong-way.ts", code)).toEqual([]);
  });
});
