// Every demo revision, analysed by a real worker process from the queue, ends `done` (none
// fails), is complete, raises each flag the scenario intends and no danger flag it does not, and
// its measurements agree or disagree exactly as intended. The mismatch hints are checked on a
// clock-free engine run, which is deterministic (the worker's hints are cut by a wall-clock
// budget, so under load they may stop early). Stored results are read back the way the app
// reads them (parseStoredResult), so a result the schema rejects fails here too.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, recordHash, startQueue } from "@teardown/db";
import {
  analyzeStoredRecord,
  parseStoredResult,
  type SolvedResult,
  type StoredFlag,
} from "@teardown/engine";
import { demoRecordDocs, loadDemoData } from "@teardown/seed-demo";
import {
  REVISION_EXPECTATIONS,
  type IntendedFlag,
  type RevisionExpectation,
} from "@teardown/seed-demo/scenario-expectations";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";
import { startWorkerProcess, type WorkerProcess } from "../../support/worker-process.js";

/** How long all demo analyses may take on a loaded two-core machine. */
const ALL_ANALYSES_MS = 900_000;
/** One analysis's budget in the test worker: generous, since helpers share the cores. */
const WORKER_BUDGET_MS = "240000";

let t: TestDatabase;
let boss: PgBoss;
let worker: WorkerProcess | undefined;
let uploads: string;
const docs = demoRecordDocs().flatMap((e) => e.revisions);
const results = new Map<string, SolvedResult>();

beforeAll(async () => {
  t = await createTestDatabase();
  boss = createQueue(t.url, { supervise: false });
  await startQueue(boss);
  uploads = mkdtempSync(path.join(tmpdir(), "tl-seed-analyses-"));
});
afterAll(async () => {
  if (worker && worker.child.exitCode === null) worker.child.kill("SIGKILL");
  await boss?.stop({ close: true });
  await t?.drop();
  if (uploads) rmSync(uploads, { recursive: true, force: true });
});

function matches(f: StoredFlag, want: IntendedFlag): boolean {
  const named = new Set([...f.parts, ...f.nets]);
  return f.code === want.code && f.severity === want.severity && want.on.every((x) => named.has(x));
}

/** The part a mismatch hint names as the explanation, from its labelled evidence. */
function explainingPart(f: StoredFlag): string | null {
  for (const e of f.evidence) {
    const m = /^value of (\S+) that would explain it$/.exec(e.label);
    if (m) return m[1]!;
  }
  return null;
}

/** The measurement (0-based, as in the record's list) a mismatch flag is about. */
function measurementOf(f: StoredFlag): number | null {
  const e = f.evidence.find((x) => x.label === "measurement number");
  // The evidence counts measurements from 1, as a reader does.
  return typeof e?.value === "number" ? e.value - 1 : null;
}

/** A stored result read back as the app reads it; a not-solved one fails the test. */
function solvedResult(file: string, raw: unknown): SolvedResult {
  const read = parseStoredResult(raw);
  if (!read.ok) throw new Error(`${file}: ${read.message}`);
  if (read.result.status === "not-solved")
    throw new Error(`${file}: not solved (${read.result.reason})`);
  return read.result;
}

function checkAgainstIntent(file: string, r: SolvedResult, want: RevisionExpectation): void {
  const where = `${file}: `;
  for (const w of want.flags)
    expect(
      r.flags.some((f) => matches(f, w)),
      `${where}intended ${w.severity} ${w.code} on ${w.on.join(",")}; got ${r.flags.map((f) => f.code).join(", ")}`,
    ).toBe(true);
  for (const f of r.flags.filter((x) => x.severity === "danger"))
    expect(
      want.flags.some((w) => w.severity === "danger" && matches(f, w)),
      `${where}unintended danger ${f.code} on ${[...f.parts, ...f.nets].join(",")}`,
    ).toBe(true);
  const intended = new Set(want.mismatches.map((m) => m.measurement));
  r.comparisons.forEach((c, i) =>
    expect(c.verdict, `${where}measurement ${i} (${c.what})`).toBe(
      intended.has(i) ? "disagrees" : "agrees",
    ),
  );
  for (const m of want.mismatches) {
    expect(r.comparisons[m.measurement]?.what).toBe(m.what);
    const hinted = r.flags.filter((f) => f.code === "measurement-mismatch");
    expect(
      hinted.some((f) => measurementOf(f) === m.measurement),
      `${where}a mismatch flag for measurement ${m.measurement}`,
    ).toBe(true);
  }
}

describe("the demo's analyses", () => {
  it(
    "gives every demo revision an analysis from a real worker, and none fails",
    async () => {
      await loadDemoData(t.db, boss, { uploadsDir: uploads });
      worker = startWorkerProcess(t.url, {
        WORKER_CONCURRENCY: "2",
        ANALYSIS_BUDGET_MS: WORKER_BUDGET_MS,
      });
      const end = Date.now() + ALL_ANALYSES_MS;
      for (;;) {
        const rows = await t.db.execute<{ open: number }>(
          sql`select count(*)::int as open from analyses where state in ('queued', 'running')`,
        );
        if (rows.rows[0]!.open === 0) break;
        if (Date.now() > end) throw new Error(`analyses still open after ${ALL_ANALYSES_MS} ms`);
        await new Promise((r) => setTimeout(r, 1000));
      }
      const states = await t.db.execute<{ state: string; n: number; errors: string | null }>(
        sql`select state, count(*)::int as n, string_agg(error, ' | ') as errors from analyses group by state`,
      );
      expect(states.rows.map((r) => [r.state, r.n, r.errors])).toEqual([
        ["done", docs.length, null],
      ]);
      const stored = await t.db.execute<{ record_hash: string; result: unknown }>(
        sql`select r.record_hash, a.result from analyses a join revisions r on r.id = a.revision_id`,
      );
      const byHash = new Map(stored.rows.map((r) => [r.record_hash, r.result]));
      for (const d of docs) {
        const result = byHash.get(recordHash(d.doc));
        expect(result, `${d.file} has a stored analysis`).toBeDefined();
        results.set(d.file, solvedResult(d.file, result));
      }
    },
    ALL_ANALYSES_MS + 60_000,
  );

  it("is complete for every revision: nothing left out of the simulation", () => {
    expect(results.size).toBe(docs.length);
    for (const [file, r] of results) {
      expect(r.status, file).toBe("complete");
      expect(r.gaps, file).toEqual([]);
      for (const d of docs.filter((x) => x.file === file))
        for (const p of d.doc.parts as Array<{ kind: string; model?: Record<string, unknown> }>) {
          if (p.kind === "load") expect(p.model?.r ?? p.model?.c, file).toBeDefined();
          expect(p.kind).not.toMatch(/^(connector|testpoint)$/);
        }
    }
  });

  it("raises each intended flag and mismatch, and no danger flag the scenario does not intend", () => {
    expect(results.size).toBe(docs.length);
    expect(Object.keys(REVISION_EXPECTATIONS).sort()).toEqual(docs.map((d) => d.file).sort());
    for (const [file, r] of results) checkAgainstIntent(file, r, REVISION_EXPECTATIONS[file]!);
    const withMismatch = Object.values(REVISION_EXPECTATIONS).filter((e) =>
      e.mismatches.some((m) => m.explainedBy !== null),
    );
    expect(withMismatch.length).toBeGreaterThanOrEqual(3);
  });

  it("names the intended part in each explained mismatch hint (clock-free engine run)", async () => {
    for (const d of docs) {
      const want = REVISION_EXPECTATIONS[d.file]!.mismatches.filter((m) => m.explainedBy);
      if (want.length === 0) continue;
      const out = await analyzeStoredRecord(d.doc);
      expect(out.ok, d.file).toBe(true);
      if (!out.ok) continue;
      const flags = out.output.result.flags.filter((f) => f.code === "measurement-mismatch");
      for (const m of want) {
        const f = flags.find((x) => measurementOf(x) === m.measurement);
        expect(f && explainingPart(f), `${d.file} measurement ${m.measurement}`).toBe(
          m.explainedBy,
        );
      }
    }
  }, 600_000);
});
