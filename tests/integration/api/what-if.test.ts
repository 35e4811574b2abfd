// POST /api/entries/:entryId/what-if through the route handler: 422 naming the bad field, 404
// for a caller who may not read the entry, the cache (the same question written another way is
// a hit and leaves one row), and the per-caller limit on computed runs.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../../support/api-client.js";

let app: TestWebApp;
let owner: TestUser;
let outsider: TestUser;
let entryId: string;

/** A dropper into a resistor: quick to solve, and its current has a closed form. */
const dropperDoc = {
  record: 1,
  title: "What-if test dropper",
  device: { category: "test", rated_supply: { vrms: 230, hz: 50 } },
  parts: [
    {
      ref: "C1",
      kind: "capacitor",
      value: "330n",
      rating: { volts: 310, class: "X2" },
      pins: ["L", "A"],
    },
    { ref: "R1", kind: "resistor", value: "1k", pins: ["A", "N"] },
  ],
  nets: { L: { role: "line" }, N: { role: "neutral" } },
};

const whatIf = (body: unknown, as: TestUser | null = owner) =>
  call("POST", `/api/entries/${entryId}/what-if`, { as: as?.as ?? null, json: body });

beforeAll(async () => {
  app = await openTestWebApp();
  // Many runs from one caller here; the limit has its own test below.
  process.env.WHAT_IF_RUN_BURST = "1000";
  owner = await signUp("Wren Owner", "wren@lab.test");
  outsider = await signUp("Odo Outsider", "odo@elsewhere.test");
  const team = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Bench" } })).body
    .team.id;
  const made = await call("POST", `/api/teams/${team}/entries`, {
    as: owner.as,
    json: { record: dropperDoc, message: "first trace" },
  });
  expect(made.status).toBe(201);
  entryId = made.body.entryId;
});
afterAll(async () => {
  await app?.close();
});

describe("what-if input errors", () => {
  it("names an unknown part by its place in the request", async () => {
    const res = await whatIf({ changes: [{ part: "C9", value: "1u" }] });
    expect(res.status).toBe(422);
    expect(res.body.error.path).toBe("changes[0].part");
    expect(res.body.error.message).toContain("C9");
  });

  it("names an unreadable value and a supply out of range, all at once", async () => {
    const res = await whatIf({
      supply: { vrms: -5, hz: 60 },
      changes: [
        { part: "R1", value: "2k2" },
        { part: "C1", value: "lots" },
      ],
    });
    expect(res.status).toBe(422);
    const paths = res.body.error.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(["supply.vrms", "changes[1].value"]);
  });

  it("refuses a value of the wrong unit and a value of the wrong type", async () => {
    const unit = await whatIf({ changes: [{ part: "R1", value: "10uF" }] });
    expect(unit.status).toBe(422);
    expect(unit.body.error.path).toBe("changes[0].value");
    const type = await whatIf({ changes: [{ part: "R1", value: true }] });
    expect(type.status).toBe(422);
    expect(type.body.error.path).toBe("changes[0].value");
  });
});

describe("what-if access", () => {
  it("answers 404 to a caller outside the team, and to nobody, as for an unknown entry", async () => {
    const outside = await whatIf({ supply: { vrms: 120, hz: 60 } }, outsider);
    expect(outside.status).toBe(404);
    const anonymous = await whatIf({ supply: { vrms: 120, hz: 60 } }, null);
    expect(anonymous.status).toBe(404);
    const unknown = await call(
      "POST",
      `/api/entries/00000000-0000-4000-8000-000000000000/what-if`,
      {
        as: owner.as,
        json: {},
      },
    );
    expect(unknown.status).toBe(404);
    expect(outside.body.error).toEqual(unknown.body.error);
  });
});

describe("what-if results and cache", () => {
  it("analyses at the asked supply and answers the same question again from the cache", async () => {
    const first = await whatIf({
      supply: { vrms: 120, hz: 60 },
      changes: [{ part: "C1", value: "220n" }],
    });
    expect(first.status).toBe(200);
    expect(first.body.cached).toBe(false);
    expect(first.body.result.supply).toEqual({ vrms: 120, hz: 60 });
    // Source: closed form, I = V / |R + 1/(jωC)| of the series RC at 120 V 60 Hz with 220 nF.
    const expected = 120 / Math.hypot(1000, 1 / (2 * Math.PI * 60 * 220e-9));
    expect(Math.abs(first.body.result.input.current_rms / expected - 1)).toBeLessThan(0.02);
    // The same changes written in SI and in another order of fields: one question.
    const again = await whatIf({
      changes: [{ value: 2.2e-7, part: "C1" }],
      supply: { hz: 60, vrms: 120 },
    });
    expect(again.status).toBe(200);
    expect(again.body.cached).toBe(true);
    expect(again.body.result).toEqual(first.body.result);
    expect(again.body.input).toEqual({
      supply: { vrms: 120, hz: 60 },
      changes: [{ part: "C1", value: 2.2e-7 }],
    });
    const rows = await app.db.db.execute(sql`select count(*)::int as n from what_if_results`);
    expect((rows.rows[0] as { n: number }).n).toBe(1);
  });

  it("runs off the request thread: /api/health answers while a what-if computes", async () => {
    expect((await call("GET", "/api/health")).status).toBe(200); // warm the route
    let finished = false;
    const running = whatIf({ supply: { vrms: 110, hz: 60 } }).then((r) => {
      finished = true;
      return r;
    });
    const t0 = performance.now();
    const health = await call("GET", "/api/health");
    const healthMs = performance.now() - t0;
    expect(health.status).toBe(200);
    expect(finished).toBe(false);
    expect(healthMs).toBeLessThan(2000);
    expect((await running).status).toBe(200);
  });

  it("stops at the analysis budget and does not cache a run the clock cut short", async () => {
    process.env.ANALYSIS_BUDGET_MS = "1";
    try {
      const res = await whatIf({ supply: { vrms: 200, hz: 50 } });
      if (res.status === 200) {
        expect(res.body.result.status).toBe("not-solved");
        expect(res.body.result.solver_code).toBe("time-budget");
      } else {
        expect(res.status).toBe(503);
        expect(res.body.error.code).toBe("what-if-budget");
      }
      const rows = await app.db.db.execute(
        sql`select count(*)::int as n from what_if_results where input->'supply'->>'vrms' = '200'`,
      );
      expect((rows.rows[0] as { n: number }).n).toBe(0);
    } finally {
      delete process.env.ANALYSIS_BUDGET_MS;
    }
  });

  it("limits computed runs per caller, and still answers cached ones past the limit", async () => {
    process.env.WHAT_IF_RUN_BURST = "0";
    process.env.WHAT_IF_RUNS_PER_MINUTE = "1";
    try {
      const fresh = await whatIf({ supply: { vrms: 100, hz: 60 } });
      expect(fresh.status).toBe(429);
      expect(fresh.headers.get("retry-after")).not.toBeNull();
      const cached = await whatIf({
        supply: { vrms: 120, hz: 60 },
        changes: [{ part: "C1", value: "220n" }],
      });
      expect(cached.status).toBe(200);
      expect(cached.body.cached).toBe(true);
    } finally {
      process.env.WHAT_IF_RUN_BURST = "1000";
      delete process.env.WHAT_IF_RUNS_PER_MINUTE;
    }
  });
});
