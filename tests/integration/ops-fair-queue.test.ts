// Finding 6: one team's pile of heavy records held every worker slot, so another team's single
// record waited for the whole pile. Jobs now carry their team as pg-boss's group and workers
// limit how many of one team's jobs run at once; here a pile of six one-second jobs from team A
// is sent first, then one job from team B, to a worker with two slots.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  ANALYSIS_QUEUE,
  analysisWorkOptions,
  createQueue,
  startQueue,
  type AnalysisJob,
} from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";
import type { PgBoss } from "pg-boss";
import { createTestDatabase, type TestDatabase } from "../support/test-database.js";
import { makeEntry, makeTeam } from "../support/entry-fixtures.js";
import { nightLightDoc } from "../support/record-docs.js";

/** What one heavy analysis takes in this test (the handler sleeps it instead of solving). */
const JOB_MS = 1_000;
const PILE = 6;
const SLOTS = 2;

let t: TestDatabase;
let boss: PgBoss;
beforeAll(async () => {
  process.env.QUEUE_SUPERVISE_SECONDS = "1";
  t = await createTestDatabase();
  boss = createQueue(t.url);
  await startQueue(boss);
});
afterAll(async () => {
  await boss?.stop({ close: true, graceful: false });
  await t?.drop();
});

describe("finding 6: fair queueing of analyses between teams", () => {
  it("starts another team's job in the next free slot, not after the first team's whole pile", async () => {
    const teamA = await makeTeam(t.db, "Pile team");
    const teamB = await makeTeam(t.db, "Single team");
    const pileRevs: string[] = [];
    for (let i = 0; i < PILE; i++)
      pileRevs.push(
        (await makeEntry(t.db, boss, teamA, nightLightDoc(i), ENGINE_VERSION)).revisionId,
      );
    const single = (await makeEntry(t.db, boss, teamB, nightLightDoc(9), ENGINE_VERSION))
      .revisionId;

    const started = new Map<string, number>();
    const finished = new Map<string, number>();
    const t0 = Date.now();
    await boss.work<AnalysisJob>(ANALYSIS_QUEUE, analysisWorkOptions(SLOTS), async ([job]) => {
      if (!job) return;
      started.set(job.data.revisionId, Date.now() - t0);
      await new Promise((r) => setTimeout(r, JOB_MS));
      finished.set(job.data.revisionId, Date.now() - t0);
    });
    const end = Date.now() + 30_000;
    while (finished.size < PILE + 1 && Date.now() < end)
      await new Promise((r) => setTimeout(r, 100));
    expect(finished.size).toBe(PILE + 1);

    // First come, first served would start it after PILE / SLOTS = 3 rounds of the pile (3 s);
    // with the team limit it starts in the first round, beside the pile's first job.
    const pileStarts = pileRevs.map((r) => started.get(r)!).sort((a, b) => a - b);
    expect(started.get(single)!).toBeLessThan(pileStarts[1]!);
    expect(finished.get(single)!).toBeLessThan(JOB_MS * 2);
    // And every job of the pile still ran (a lone team keeps going at its own limit).
    expect(pileRevs.every((r) => finished.has(r))).toBe(true);
  }, 45_000);
});
