// The worker stores an analysis in two steps: the cheap part (nominal solve, figures, layout) is
// on the running row, visible to the app, while the variants still run, and the full result
// replaces it when the row is done; variants ended by the hard stop leave the cheap part stored
// as a done, partial result with the reason, not failed.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, schema, startQueue } from "@teardown/db";
import { ENGINE_VERSION, parseStoredResult, type AnalysisResult } from "@teardown/engine";
import { readDemoRecord } from "@teardown/seed-demo";
import { runAnalysisJob } from "../../../analysis-worker/src/analysis-job.js";
import { EngineRunner } from "../../../analysis-worker/src/engine-runner.js";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";
import { makeEntry, makeTeam } from "../../support/entry-fixtures.js";

let t: TestDatabase;
let boss: PgBoss;
const runners: EngineRunner[] = [];

beforeAll(async () => {
  t = await createTestDatabase();
  // The queue only takes the entries' jobs here; the test runs each job itself.
  boss = createQueue(t.url, { supervise: false });
  await startQueue(boss);
});
afterAll(async () => {
  await Promise.all(runners.map((r) => r.close()));
  await boss?.stop({ close: true });
  await t?.drop();
});

/** One read of the analysis row as the app sees it. */
interface Snapshot {
  state: string;
  result: AnalysisResult | null;
  finishedAt: number | null;
}

async function readRow(revisionId: string): Promise<Snapshot | null> {
  const [row] = await t.db
    .select()
    .from(schema.analyses)
    .where(eq(schema.analyses.revisionId, revisionId));
  if (!row) return null;
  const parsed = row.result === null ? null : parseStoredResult(row.result);
  if (parsed !== null && !parsed.ok) throw new Error(`stored result unreadable: ${parsed.message}`);
  return {
    state: row.state,
    result: parsed?.ok ? parsed.result : null,
    finishedAt: row.finishedAt?.getTime() ?? null,
  };
}

/** Runs one job to its end, reading the row every few milliseconds meanwhile. */
async function runWatched(revisionId: string, runner: EngineRunner, budgetMs: number) {
  const seen: Snapshot[] = [];
  let running = true;
  const watch = (async () => {
    while (running) {
      const s = await readRow(revisionId);
      if (s !== null) seen.push(s);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  const outcome = await runAnalysisJob({ db: t.db, engine: runner, budgetMs }, "test-job", {
    revisionId,
    engineVersion: ENGINE_VERSION,
  });
  running = false;
  await watch;
  return { outcome, seen, final: (await readRow(revisionId))! };
}

/** A runner whose hard stop comes 100 ms after the nominal part has been handed over. */
class StopAfterNominal extends EngineRunner {
  override run(
    record: unknown,
    budgetMs: number,
    onNominal?: Parameters<EngineRunner["run"]>[2],
  ): ReturnType<EngineRunner["run"]> {
    const stop = new AbortController();
    return super.run(
      record,
      budgetMs,
      (output) => {
        onNominal?.(output);
        setTimeout(() => stop.abort(), 100);
      },
      stop.signal,
    );
  }
}

/** The variants field of a solved result (a not-solved one has none). */
const variantsOf = (r: AnalysisResult | null) =>
  r !== null && r.status !== "not-solved" ? r.variants : undefined;
const pending = (s: Snapshot) => s.state === "running" && variantsOf(s.result)?.state === "pending";

describe("the worker's two-step storing", () => {
  it("shows the nominal figures while the variants run, then replaces them with the full result", async () => {
    const team = await makeTeam(t.db);
    const doc = readDemoRecord("glowmoth-night-light.yaml");
    const measurements = (doc.measurements as unknown[]).length;
    const { revisionId } = await makeEntry(t.db, boss, team, doc, ENGINE_VERSION);
    const runner = new EngineRunner();
    runners.push(runner);
    const { outcome, seen, final } = await runWatched(revisionId, runner, 120_000);
    expect(outcome).toBe("done");

    const cheap = seen.find(pending);
    expect(cheap, `states seen: ${seen.map((s) => s.state).join(",")}`).toBeDefined();
    const cheapResult = cheap!.result!;
    expect(cheapResult.status).toBe("partial");
    if (cheapResult.status === "not-solved") throw new Error("the nominal part was not solved");
    // Figures to show already, the measured comparisons still to come.
    expect(cheapResult.input.power).toBeGreaterThan(0);
    expect(cheapResult.comparisons).toEqual([]);
    expect(cheapResult.variants!.reason).toMatch(/tolerance bands/);

    // The full result replaced it: no variants pending, every measurement compared, later.
    expect(final.state).toBe("done");
    expect(variantsOf(final.result)).toBeUndefined();
    if (final.result!.status === "not-solved") throw new Error("the full result was not solved");
    expect(final.result!.comparisons).toHaveLength(measurements);
    // Nothing after the full result went back to pending.
    const firstFinal = seen.findIndex((s) => s.state === "done");
    const afterFinal = firstFinal < 0 ? [] : seen.slice(firstFinal);
    expect(afterFinal.some(pending)).toBe(false);
  }, 180_000);

  it("keeps the nominal part as partial, with the reason, when the hard stop ends the variants", async () => {
    const team = await makeTeam(t.db);
    const { revisionId } = await makeEntry(
      t.db,
      boss,
      team,
      readDemoRecord("breezel-desk-ionizer.yaml"),
      ENGINE_VERSION,
    );
    // The variants' own budget is far past the hard stop, and the stop comes as soon as the
    // nominal part is stored (not at a clock time: on a quiet machine the ionizer's variants
    // can finish inside any fixed budget short enough for a test).
    const runner = new StopAfterNominal({ variantBudgetShare: 100 });
    runners.push(runner);
    const { outcome, seen, final } = await runWatched(revisionId, runner, 15_000);
    expect(seen.some(pending)).toBe(true);
    expect(outcome).toBe("done");
    expect(final.state).toBe("done");
    expect(final.result!.status).toBe("partial");
    expect(variantsOf(final.result)).toEqual({
      state: "stopped",
      reason: expect.stringMatching(/time budget of 15000 ms.*nominal figures are kept/),
    });
  }, 120_000);

  it("runs a job again when its running row holds only the nominal part (a worker died mid-variants)", async () => {
    const team = await makeTeam(t.db);
    const { revisionId } = await makeEntry(
      t.db,
      boss,
      team,
      readDemoRecord("dimmbo-lamp-dimmer.yaml"),
      ENGINE_VERSION,
    );
    const runner = new EngineRunner();
    runners.push(runner);
    const first = await runWatched(revisionId, runner, 120_000);
    expect(first.outcome).toBe("done");
    // Put the nominal part back, as a worker that died after storing it would have left it.
    const cheap = first.seen.find(pending)!;
    await t.db
      .update(schema.analyses)
      .set({ state: "running", result: cheap.result })
      .where(eq(schema.analyses.revisionId, revisionId));
    const again = await runWatched(revisionId, runner, 120_000);
    expect(again.outcome).toBe("done");
    expect(variantsOf(again.final.result)).toBeUndefined();
    // A finished row is left alone.
    const third = await runWatched(revisionId, runner, 120_000);
    expect(third.outcome).toBe("skipped");
  }, 240_000);
});
