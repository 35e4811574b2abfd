/**
 * What a user reads of a flag names published documents, never our internal notes or how sure
 * we were of a value: every test circuit and every demo record is analysed, and no flag's
 * source, message, caution or evidence, nor any assumption's wording, contains a file name or
 * a confidence mark. The citations table itself is held to the same words.
 */
import { readFileSync, readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { RiskAssessment, TeardownRecord } from "@teardown/engine";
import {
  CITATIONS,
  FLAG_CODES,
  analyzeCircuit,
  assessRisks,
  readCircuitFile,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { dropperHeater, stepUp, thyristorHeater, xCapacitorInput } from "./flag-circuits.js";
import { latchedOnDc } from "../solver/reference-circuits.js";

/** File names (with the extensions our notes and sources use), note folders and confidence marks. */
const FORBIDDEN = [
  /\.(md|ts|tsx|js|yaml|yml|json)\b/i,
  /shared\//i,
  /reference-values|record-format|engine\.md/i,
  /\b(FOUND|MEMORY|DERIVED)\b/,
];

function leaks(text: string): string[] {
  return FORBIDDEN.filter((re) => re.test(text)).map((re) => `${re} in "${text}"`);
}

/**
 * Solved and assessed under a short clock budget: the words are checked, not the figures, so a
 * slow circuit that runs out of time is skipped rather than slowing the suite.
 */
function assessed(rec: TeardownRecord): RiskAssessment | null {
  const a = analyzeCircuit(rec, { now: Date.now, budgetMs: 5000 });
  if (!a.ok) return null;
  return assessRisks(rec, a.value, { samples: 2, seed: 5, now: Date.now, budgetMs: 5000 });
}

const DEMO_DIR = new URL("../../../seed-demo/records/", import.meta.url);
const demos = readdirSync(DEMO_DIR)
  .filter((f) => f.endsWith(".yaml"))
  .map((f) => {
    const parsed = readCircuitFile(readFileSync(new URL(f, DEMO_DIR), "utf8"), { filename: f });
    if (!parsed.ok) throw new Error(`${f}: ${parsed.errors[0]?.message}`);
    return { name: `demo ${f}`, record: parsed.record };
  });

/** Circuits that raise the flags the plain test circuits do not. */
const flagged = [
  { name: "bare dropper", record: dropperHeater({ fuse: false, cls: null, bleeder: null }) },
  { name: "slow bleeder", record: xCapacitorInput(1e6) },
  { name: "step-up", record: stepUp({ ratio: 0.2, dischargeLoad: false, tags: ["ionizer"] }) },
  { name: "marginal thyristor", record: thyristorHeater(390e3) },
  { name: "dead thyristor", record: thyristorHeater(1e6) },
  { name: "thyristor latched on DC", record: latchedOnDc() },
  {
    name: "milli for mega",
    record: record(
      [
        part("F1", "fuse", ["L", "L1"], 1),
        part("R1", "resistor", ["L1", "A"], 1e-3, { rating: { package: "0805" } }),
        part("HT1", "load", ["A", "N"], null, { model: { r: 0.1 } }),
        part("CY", "capacitor", ["N", "CASE"], 2.2e-9),
        part("RC", "resistor", ["CASE", "L1"], 1e3),
      ],
      { CASE: { accessible: true } },
      {
        board: {
          spacings: [
            {
              between: ["L1", "N"],
              creepage_mm: 0.5,
              clearance_mm: 0.5,
              slot: true,
              material_group: "IIIa",
              pollution_degree: 2,
            },
          ],
        },
      },
    ),
  },
];

describe("words a user reads", () => {
  it("name no file and no confidence mark, in any flag or assumption of any test circuit", () => {
    const seen = new Set<string>();
    let solved = 0;
    const found: string[] = [];
    for (const c of [...ALL_TEST_CIRCUITS, ...demos, ...flagged]) {
      const r = assessed(c.record);
      if (r === null) continue;
      solved++;
      for (const f of r.flags) {
        seen.add(f.code);
        const texts = [
          f.source,
          f.message,
          f.caution,
          ...f.evidence.flatMap((e) => [e.label, String(e.value), e.unit]),
        ];
        found.push(...texts.flatMap(leaks).map((l) => `${c.name} ${f.code}: ${l}`));
        expect(f.source).toBe(CITATIONS[f.source_id].text);
      }
      for (const a of r.assumptions)
        found.push(
          ...[a.field, a.why, String(a.value)].flatMap(leaks).map((l) => `${c.name}: ${l}`),
        );
    }
    expect(found).toEqual([]);
    // The walk covers most of the flag codes, so it is not silently checking nothing.
    expect(solved).toBeGreaterThanOrEqual(20);
    expect([...FLAG_CODES].filter((c) => !seen.has(c))).toEqual([]);
  }, 240_000);

  it("in the citations table: a document with its edition or family, or common practice", () => {
    for (const [id, c] of Object.entries(CITATIONS)) {
      expect(leaks(c.text), id).toEqual([]);
      if (c.kind === "practice") expect(c.text, id).toMatch(/^common practice/);
      if (c.kind === "standard") expect(c.text, id).toMatch(/IEC \d{5}(-\d+)*:\d{4} \(Ed\. \d\)/);
      if (c.kind === "datasheet") expect(c.text, id).toMatch(/datasheet/);
      if (c.kind === "regulation") expect(c.text, id).toMatch(/CFR/);
    }
  });
});
