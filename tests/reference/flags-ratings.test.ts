/**
 * Default ratings and limits behind the flags, against reference-values.md §8 and §9.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, assessRisks } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";
import { testCircuit } from "../support/circuits/all-test-circuits.js";

function flagsOf(rec: ReturnType<typeof record>) {
  const a = analyzeCircuit(rec, {});
  if (!a.ok) throw new Error(a.error.message);
  return assessRisks(rec, a.value, { samples: 4 }).flags;
}

/** A resistor straight across the fused mains (325 V peak) with the given rating. */
function acrossMains(rating: Record<string, string | number>) {
  return record([
    part("F1", "fuse", ["L", "L1"], 1),
    part("R1", "resistor", ["L1", "N"], 1e6, { rating }),
  ]);
}

describe("resistor limiting element voltage by package (reference-values.md §8)", () => {
  const limit = (rating: Record<string, string | number>) =>
    flagsOf(acrossMains(rating)).find((f) => f.code === "overstress-voltage")?.evidence.limit_v ??
    null;

  it("is 250 V for a CFR-25 1/4 W carbon film (FOUND, Yageo CFR), so 325 V peak exceeds it", () => {
    expect(limit({ package: "CFR-25" })).toBe(250);
    expect(limit({ watts: 0.25 })).toBe(250);
  });

  it("is 200 V for a 1206 chip and 150 V for an 0805 (FOUND, Yageo RC)", () => {
    expect(limit({ package: "1206" })).toBe(200);
    expect(limit({ package: "0805" })).toBe(150);
  });

  it("is 350 V for a 1/2 W CFR-50 (FOUND, Yageo CFR), which 325 V peak does not exceed but passes 80 %", () => {
    const f = flagsOf(acrossMains({ package: "CFR-50" })).find(
      (x) => x.code === "overstress-voltage",
    )!;
    expect(f.evidence.limit_v).toBe(350);
    expect(f.severity).toBe("warning");
  });
});

describe("the rectifier surge default (reference-values.md §8)", () => {
  it("is 30 A I_FSM for a 1N400x-class diode without a surge rating (FOUND, vendor datasheets)", () => {
    const rec = testCircuit("night-light-dropper");
    // No surge resistor: the bridge sees the crest through the fuse and the dropper alone.
    rec.parts = rec.parts
      .filter((p) => p.ref !== "R1")
      .map((p) => ({
        ...p,
        pins: Object.fromEntries(Object.entries(p.pins).map(([k, v]) => [k, v === "A" ? "L1" : v])),
      }));
    const f = flagsOf(rec).find((x) => x.code === "no-surge-limit")!;
    expect(f.evidence.limit_a).toBe(30);
    expect(f.evidence.rating_source).toContain("default");
  });
});

describe("ozone limits (reference-values.md §9)", () => {
  it("cite OSHA PEL 0.1 ppm and FDA 21 CFR 801.415 0.05 ppm (both FOUND)", () => {
    const rec = testCircuit("night-light-dropper");
    const tagged = { ...rec, device: { ...rec.device, category: "ionizer" } };
    const f = flagsOf(tagged).find((x) => x.code === "ozone")!;
    const limits = f.evidence.limits as Array<{ limit: string; ppm: number; mark: string }>;
    expect(limits.find((l) => l.limit.startsWith("OSHA PEL"))).toMatchObject({
      ppm: 0.1,
      mark: "FOUND",
    });
    expect(limits.find((l) => l.limit.startsWith("FDA 21 CFR 801.415"))).toMatchObject({
      ppm: 0.05,
      mark: "FOUND",
    });
  });
});
