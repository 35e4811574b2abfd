// The worker stores only a result its readers can parse: a result that lacks its status, or whose
// status contradicts its gaps (a "complete" analysis that left a part out), fails the analysis
// with the schema's reason instead of being shown as done; a well-formed one is stored as done.
// The engine's real output is tampered with by hand, so the expectations are the schema's rules.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, schema, startQueue } from "@teardown/db";
import { analyzeStoredRecord, ENGINE_VERSION, type AnalysisOutcome } from "@teardown/engine";
import { runAnalysisJob } from "../../../analysis-worker/src/analysis-job.js";
import type { EngineRunner } from "../../../analysis-worker/src/engine-runner.js";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";
import { nightLightDoc } from "../../support/record-docs.js";
import { makeEntry, makeTeam } from "../../support/entry-fixtures.js";

let t: TestDatabase;
let boss: PgBoss;
let teamId: string;
let genuine: AnalysisOutcome;

beforeAll(async () => {
  t = await createTestDatabase();
  boss = createQueue(t.url, { supervise: false });
  await startQueue(boss);
  teamId = await makeTeam(t.db);
  genuine = await analyzeStoredRecord(nightLightDoc());
  if (!genuine.ok) throw new Error(genuine.message);
}, 180_000);
afterAll(async () => {
  await boss?.stop({ close: true, graceful: false });
  await t?.drop();
});

/** An engine that answers with the genuine outcome, its result changed by `tamper`. */
function engineAnswering(tamper: (result: Record<string, unknown>) => void): EngineRunner {
  return {
    run: async () => {
      if (!genuine.ok) throw new Error("unreachable");
      const result = structuredClone(genuine.output.result) as unknown as Record<string, unknown>;
      tamper(result);
      return {
        kind: "outcome",
        outcome: { ...genuine, output: { ...genuine.output, result } } as AnalysisOutcome,
      };
    },
  } as unknown as EngineRunner;
}

async function analyseWith(engine: EngineRunner) {
  const { revisionId } = await makeEntry(t.db, boss, teamId, nightLightDoc(), ENGINE_VERSION);
  const outcome = await runAnalysisJob(
    { db: t.db, engine, budgetMs: 60_000 },
    `job-${revisionId}`,
    { revisionId, engineVersion: ENGINE_VERSION },
  );
  const [row] = await t.db
    .select()
    .from(schema.analyses)
    .where(eq(schema.analyses.revisionId, revisionId));
  return { outcome, row: row! };
}

describe("the worker's check of a result before it is stored", () => {
  it("stores the engine's own result as done", async () => {
    const { outcome, row } = await analyseWith(engineAnswering(() => {}));
    expect(outcome).toBe("done");
    expect(row.state).toBe("done");
    expect((row.result as { status: string }).status).toBe("complete");
  });

  it("fails a result without a status, saying so, and stores no result", async () => {
    const { outcome, row } = await analyseWith(engineAnswering((r) => delete r.status));
    expect(outcome).toBe("failed");
    expect(row.state).toBe("failed");
    expect(row.result).toBeNull();
    expect(row.error).toMatch(/does not match its schema: it lacks a status/);
  });

  it("fails a 'complete' result that names a left-out part, naming the status field", async () => {
    const { outcome, row } = await analyseWith(
      engineAnswering((r) => {
        r.gaps = [{ part: "HT1", reason: "load without a resistance" }];
      }),
    );
    expect(outcome).toBe("failed");
    expect(row.state).toBe("failed");
    expect(row.result).toBeNull();
    expect(row.error).toMatch(/does not match its schema: .*status/);
  });
});
