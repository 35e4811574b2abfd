// The computed figures of two boards side by side. The differences and ratios are checked by
// hand, and the analysed night-light batches against the capacitive-dropper closed form: with
// the dropper's reactance far above the rest of the path, the line current is I ≈ V·2πf·C, so
// the second batch (220 nF for 330 nF) draws 220/330 of the first's current (textbook dropper
// relation, from memory).
import { describe, expect, it } from "vitest";
import { analyzeRecord, compareBoards, type AnalysisResult } from "@teardown/engine";
import { demoRecord } from "./demo-record.js";

async function analysed(
  slug: string,
): Promise<{ record: ReturnType<typeof demoRecord>; result: AnalysisResult }> {
  const record = demoRecord(slug);
  const out = await analyzeRecord(record, { now: () => 0 });
  if (!out.ok) throw new Error(`${slug}: ${out.message}`);
  return { record, result: out.output.result };
}

describe("figures of the two night-light batches", async () => {
  const a = await analysed("glowmoth-night-light");
  const b = await analysed("glowmoth-night-light-batch2");
  const cmp = compareBoards(a, b);
  const row = (what: string, ref?: string) =>
    cmp.figures.find((f) => f.what === what && (ref === undefined || f.refs?.a === ref))!;

  it("puts the line current side by side with B − A and B / A", () => {
    const current = row("input.current_rms");
    expect(current.unit).toBe("A");
    expect(current.difference).toBeCloseTo(current.b! - current.a!, 15);
    // Closed form: the current scales with the dropper capacitance.
    expect(current.ratio).toBeCloseTo(220 / 330, 1);
    expect(Math.abs(current.ratio! - 220 / 330)).toBeLessThan(0.02);
  });

  it("lists power, power factor and THD of the input as well", () => {
    for (const what of ["input.power", "input.power_factor", "input.thd"])
      expect(row(what), what).toBeDefined();
  });

  it("shows each paired part's dissipation and stress, and the removed LED's on its side only", () => {
    // The dropper carries the whole line current: its RMS current is the input current.
    const dropper = row("part.current_rms", "C1");
    expect(dropper.refs).toEqual({ a: "C1", b: "C1" });
    expect(dropper.ratio).toBeCloseTo(row("input.current_rms").ratio!, 2);
    expect(row("part.voltage_peak", "C1").a).toBeGreaterThan(0);
    const gone = row("part.power", "LED3");
    expect(gone.refs).toEqual({ a: "LED3", b: null });
    expect(gone.b).toBeNull();
    expect(gone.difference).toBeNull();
  });

  it("sorts the flags into one board only and both", () => {
    const all = [...cmp.flags.onlyA, ...cmp.flags.onlyB, ...cmp.flags.both];
    expect(new Set(all).size).toBe(all.length);
    // Both batches have no fuse and the bleeder near its voltage limit (scenario-expectations.ts).
    expect(cmp.flags.both).toEqual(expect.arrayContaining(["no-fuse", "overstress-voltage"]));
  });
});

describe("figures when a board is not analysed", () => {
  it("keeps the rows of the analysed side and leaves difference and ratio empty", async () => {
    const a = await analysed("glowmoth-night-light");
    const cmp = compareBoards(a, {
      record: demoRecord("glowmoth-night-light-batch2"),
      result: null,
    });
    const current = cmp.figures.find((f) => f.what === "input.current_rms")!;
    expect(current.b).toBeNull();
    expect(current.difference).toBeNull();
    expect(current.ratio).toBeNull();
    expect(cmp.flags.onlyB).toEqual([]);
  });
});
