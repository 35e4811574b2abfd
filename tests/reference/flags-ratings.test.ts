/**
 * Default ratings and limits behind the flags, against the published documents:
 * - Yageo CFR series carbon-film resistor datasheet (FOUND, vendor copy): CFR-25 limiting element
 *   voltage 250 V and overload 500 V, CFR-50 350 V / 700 V; Yageo RC series thick-film chip
 *   datasheet (FOUND): 0805 150 V / 300 V, 1206 200 V / 400 V. Both state the limiting element
 *   voltage as "DC or AC RMS", so it is compared with the RMS voltage across the part.
 * - 1N4001–1N4007 datasheets (FOUND, several vendors): I_FSM 30 A, 8.3 ms half-sine.
 * - OSHA 29 CFR 1910.1000 Table Z-1, 0.1 ppm; FDA 21 CFR 801.415, 0.05 ppm (FOUND, copies of the
 *   agency pages).
 * The RMS across a resistor straight on 230 V mains is 230 V (closed form), its peak 325.3 V.
 */
import { describe, expect, it } from "vitest";
import type { Flag } from "@teardown/engine";
import { analyzeCircuit, assessRisks } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";
import { testCircuit } from "../support/circuits/all-test-circuits.js";
import { evNum, evText } from "../engine/flags/flag-circuits.js";

function assessed(rec: ReturnType<typeof record>) {
  const a = analyzeCircuit(rec, {});
  if (!a.ok) throw new Error(a.error.message);
  return assessRisks(rec, a.value, { samples: 4 });
}

/** A 1 MΩ resistor straight across the fused mains (230 V RMS, 325 V peak) with the given rating. */
function acrossMains(rating: Record<string, string | number>) {
  return record([
    part("F1", "fuse", ["L", "L1"], 1),
    part("R1", "resistor", ["L1", "N"], 1e6, { rating }),
  ]);
}

const voltageFlag = (flags: Flag[]) => flags.find((f) => f.code === "overstress-voltage");

describe("resistor limiting element voltage by package, compared with the RMS voltage", () => {
  it("takes 250 V for a 1/4 W carbon-film bleeder on 230 V: a warning at 92 %, not a danger", () => {
    const ratings: Array<Record<string, string | number>> = [
      { package: "CFR-25" },
      { watts: 0.25 },
    ];
    for (const rating of ratings) {
      const r = assessed(acrossMains(rating));
      const f = voltageFlag(r.flags)!;
      expect(f.severity).toBe("warning");
      expect(evNum(f, "limiting element voltage")).toBe(250);
      expect(evNum(f, "RMS voltage across the part")).toBeCloseTo(230, 0);
      expect(evNum(f, "RMS voltage against the limiting element voltage")).toBeCloseTo(92, 0);
      expect(evText(f, "basis of the limiting element voltage")).toBe("RMS");
      // Its peak is judged against the 500 V overload voltage instead: 65 %.
      expect(evNum(f, "overload voltage")).toBe(500);
      expect(evNum(f, "peak voltage against the overload voltage")).toBeCloseTo(65.05, 1);
      expect(f.message).toContain("RMS");
      expect(r.assumptions).toContainEqual(
        expect.objectContaining({ part: "R1", field: "rating.volts", value: 250 }),
      );
    }
  });

  it("takes 200 V for a 1206 chip and 150 V for an 0805: 230 V RMS exceeds both: a danger", () => {
    const chip = voltageFlag(assessed(acrossMains({ package: "1206" })).flags)!;
    expect(evNum(chip, "limiting element voltage")).toBe(200);
    expect(chip.severity).toBe("danger");
    const small = voltageFlag(assessed(acrossMains({ package: "0805" })).flags)!;
    expect(evNum(small, "limiting element voltage")).toBe(150);
    expect(evNum(small, "overload voltage")).toBe(300);
    expect(small.severity).toBe("danger");
  });

  it("takes 350 V for a 1/2 W CFR-50: 230 V RMS is 66 %, so nothing is flagged, and the default is listed", () => {
    const r = assessed(acrossMains({ package: "CFR-50" }));
    expect(voltageFlag(r.flags)).toBeUndefined();
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: "R1", field: "rating.volts", value: 350 }),
    );
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: "R1", field: "rating.overload_volts", value: 700 }),
    );
  });

  it("scales the overload figure of a high-voltage 1/2 W type to its stated rating, by the CFR-50's 700/350", () => {
    // A 100 MΩ bleeder rated 3500 V in a 1/2 W body on 230 V: its 325 V peak is under 5 % of
    // 3500 V × 2 = 7000 V, so the package's 700 V overload row must not raise a danger.
    const r = assessed(acrossMains({ watts: 0.5, volts: 3500 }));
    expect(voltageFlag(r.flags)).toBeUndefined();
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: "R1", field: "rating.overload_volts", value: 7000 }),
    );
  });

  it("compares a stated resistor rating with the RMS too: 240 V stated passes, 220 V stated is a danger", () => {
    expect(voltageFlag(assessed(acrossMains({ volts: 300 })).flags)).toBeUndefined();
    expect(voltageFlag(assessed(acrossMains({ volts: 240 })).flags)!.severity).toBe("warning");
    const f = voltageFlag(assessed(acrossMains({ volts: 220 })).flags)!;
    expect(f.severity).toBe("danger");
    expect(evText(f, "limiting element voltage taken from")).toBe("the record");
  });
});

describe("the rectifier surge default", () => {
  it("is 30 A I_FSM for a 1N400x-class diode without a surge rating, listed as an assumption", () => {
    const rec = testCircuit("night-light-dropper");
    // No surge resistor: the bridge sees the crest through the fuse and the dropper alone.
    rec.parts = rec.parts
      .filter((p) => p.ref !== "R1")
      .map((p) => ({
        ...p,
        pins: Object.fromEntries(Object.entries(p.pins).map(([k, v]) => [k, v === "A" ? "L1" : v])),
      }));
    const r = assessed(rec);
    const f = r.flags.find((x) => x.code === "no-surge-limit")!;
    expect(evNum(f, "peak surge rating")).toBe(30);
    expect(f.source).toContain("I_FSM 30 A");
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: f.parts[0], field: "rating.surge_amps", value: 30 }),
    );
  });
});

describe("ozone limits", () => {
  it("cite OSHA PEL 0.1 ppm and FDA 21 CFR 801.415 0.05 ppm as quantities in ppm", () => {
    const rec = testCircuit("night-light-dropper");
    const tagged = { ...rec, device: { ...rec.device, category: "ionizer" } };
    const f = assessed(tagged).flags.find((x) => x.code === "ozone")!;
    const osha = f.evidence.find((e) => e.label.startsWith("OSHA PEL"))!;
    expect(osha).toMatchObject({ value: 0.1, unit: "ppm" });
    const fda = f.evidence.find((e) => e.label.startsWith("FDA 21 CFR 801.415"))!;
    expect(fda).toMatchObject({ value: 0.05, unit: "ppm" });
    expect(f.source).toContain("29 CFR 1910.1000");
  });
});
