/**
 * The what-if of a demo RC-fired triac stage (the fan speed control) at 120 V / 60 Hz, checked
 * against a closed-form trigger estimate of the RC network.
 *
 * While the triac is off, its voltage follows the supply v = √2·V·sin θ (the load's drop is a
 * few volts). The chain R (pot, trimmer and fixed resistor in series) charges the capacitor at
 * node Q; the gate resistor R2 and the gate junction hang from Q. The gate reaches igt when the
 * junction is at vgt (the junction is fitted to pass igt at vgt), so Q is then at
 * Vth = vgt + igt·R2. At that first instant Q is rising, so the capacitor takes current and the
 * chain must carry at least igt: (v − Vth)/R ≥ igt. Hence
 *   - it can fire only if √2·V ≥ Vth + igt·R, i.e. R ≤ Rmax = (√2·V − Vth)/igt, and
 *   - it fires no earlier than θmin = asin((Vth + igt·R)/(√2·V)) and no later than 180° − θmin.
 * Source: Kirchhoff's current law at Q with the gate as a fixed junction drop (closed form).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { analyzeWhatIf, E_SERIES, readCircuitFile, type TeardownRecord } from "@teardown/engine";
import { RECORDS_DIR } from "@teardown/seed-demo";

const file = `${RECORDS_DIR}/whirlby-fan-speed-control.yaml`;
const read = readCircuitFile(readFileSync(file, "utf8"), { filename: file });
if (!read.ok) throw new Error(`${file} does not read`);
const fan: TeardownRecord = read.record;
const value = (ref: string) => fan.parts.find((p) => p.ref === ref)!.value!;
const model = fan.parts.find((p) => p.ref === "Q1")!.model;

const at120 = { vrms: 120, hz: 60 };
const vth = model.vgt! + model.igt! * value("R2");
const rMax = (vrms: number) => (Math.SQRT2 * vrms - vth) / model.igt!;
const earliestDeg = (vrms: number, chain: number) =>
  (Math.asin((vth + model.igt! * chain) / (Math.SQRT2 * vrms)) * 180) / Math.PI;
const chainWith = (vr1: number) => vr1 + value("VR2") + value("R1");

describe("what-if of the fan speed control at 120 V / 60 Hz", async () => {
  const out = await analyzeWhatIf(fan, { supply: at120 });
  if (!out.ok || out.result.status === "not-solved") throw new Error(JSON.stringify(out));
  const solved = out.result;
  const trig = solved.triggers.find((t) => t.part === "Q1")!;

  it("says the triac fires at the rated supply but not at 120 V, as the closed form predicts", () => {
    // Source: the closed-form bound in the header: the traced chain is above Rmax at 120 V
    // and below it at 230 V.
    expect(chainWith(value("VR1"))).toBeGreaterThan(rMax(120));
    expect(chainWith(value("VR1"))).toBeLessThan(rMax(230));
    expect(trig.fires).toBe(false);
    expect(trig.rated?.fires).toBe(true);
    expect(
      solved.risk_notes.some((n) =>
        /Q1 fires at the rated .* but does not fire at 120 V 60 Hz/.test(n),
      ),
    ).toBe(true);
  });

  it("suggests an E24 value of the pot at the supply end of the RC chain", () => {
    const s = trig.suggestion!;
    expect(s.part).toBe("VR1");
    expect(s.series).toBe("E24");
    const mantissa = s.value / 10 ** Math.floor(Math.log10(s.value));
    expect(E_SERIES.E24.some((m) => Math.abs(m - mantissa) < 1e-9)).toBe(true);
    expect(s.value).toBeLessThan(value("VR1"));
    // Source: closed form: a value that fires must keep the chain within Rmax at 120 V.
    expect(chainWith(s.value)).toBeLessThanOrEqual(rMax(120));
    expect(s.angle_deg!).toBeLessThanOrEqual(trig.rated!.angle_deg! + 0.01);
  });

  it("fires when the suggestion is applied, within the closed-form window, no later than at rated", async () => {
    const s = trig.suggestion!;
    const applied = await analyzeWhatIf(fan, {
      supply: at120,
      changes: [{ part: s.part, value: s.value }],
    });
    if (!applied.ok || applied.result.status === "not-solved") throw new Error("not solved");
    const t = applied.result.triggers.find((x) => x.part === "Q1")!;
    expect(t.fires).toBe(true);
    expect(t.suggestion).toBeUndefined();
    // Source: the closed-form window [θmin, 180° − θmin] in the header.
    const lo = earliestDeg(120, chainWith(s.value));
    for (const a of [t.angle_deg!, t.angle_negative_deg!]) {
      expect(a).toBeGreaterThanOrEqual(lo);
      expect(a).toBeLessThanOrEqual(180 - lo);
      expect(a).toBeLessThanOrEqual(trig.rated!.angle_deg! + 0.01);
    }
    expect(Math.max(t.angle_deg!, t.angle_negative_deg!)).toBeCloseTo(s.angle_deg!, 1);
  });

  it("takes the largest such value: the next E24 value up fires later than at rated, or not at all", async () => {
    const s = trig.suggestion!;
    const decade = 10 ** Math.floor(Math.log10(s.value));
    const m = E_SERIES.E24.findIndex((x) => Math.abs(x * decade - s.value) < 1e-6 * s.value);
    const next = m + 1 < E_SERIES.E24.length ? E_SERIES.E24[m + 1]! * decade : 10 * decade;
    const up = await analyzeWhatIf(fan, {
      supply: at120,
      changes: [{ part: s.part, value: next }],
    });
    if (!up.ok || up.result.status === "not-solved") throw new Error("not solved");
    const t = up.result.triggers.find((x) => x.part === "Q1")!;
    const latest = t.fires ? Math.max(t.angle_deg ?? 180, t.angle_negative_deg ?? 180) : 180;
    expect(latest).toBeGreaterThan(trig.rated!.angle_deg! + 0.01);
  });
});
