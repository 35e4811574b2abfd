/**
 * Every flag code fires in a test circuit and stays silent in a near-identical one.
 */
import { describe, expect, it } from "vitest";
import type { Part, TeardownRecord } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { testCircuit } from "../../support/circuits/all-test-circuits.js";
import {
  assess,
  codes,
  evNum,
  evText,
  dropperHeater,
  stepUp,
  thyristorHeater,
  xCapacitorInput,
} from "./flag-circuits.js";

function replacePart(rec: TeardownRecord, ref: string, next: Part | null): TeardownRecord {
  return { ...rec, parts: rec.parts.flatMap((p) => (p.ref === ref ? (next ? [next] : []) : [p])) };
}

describe("accessible-mains", () => {
  const plate = (link: Part) =>
    record([...dropperHeater({ fuse: true, cls: "X2", bleeder: 330e3 }).parts, link], {
      CASE: { accessible: true },
    });

  it("fires when a touchable plate is tied to neutral through a resistor, naming the path", () => {
    const r = assess(plate(part("RC", "resistor", ["N", "CASE"], 10e3)));
    const f = r.flags.find((x) => x.code === "accessible-mains")!;
    expect(f.severity).toBe("danger");
    expect(evText(f, "conducting path")).toBe("CASE – RC – N");
    expect(evNum(f, "resistance of the path")).toBe(10e3);
  });

  it("stays silent when the plate is coupled only through a Y1 capacitor", () => {
    const r = assess(
      plate(part("CY", "capacitor", ["N", "CASE"], 1e-9, { rating: { class: "Y1" } })),
    );
    expect(codes(r)).not.toContain("accessible-mains");
    expect(codes(r)).not.toContain("capacitor-class");
  });

  it("does not pass from a transformer's primary to its secondary", () => {
    const rec = stepUp({ ratio: 1, dischargeLoad: false });
    const isolated = {
      ...replacePart(rec, "RG", null),
      nets: { ...rec.nets, RET: { role: null, accessible: true, note: null } },
    };
    delete (isolated.nets as Record<string, unknown>).RG;
    expect(codes(assess(isolated))).not.toContain("accessible-mains");
  });
});

describe("bleeder-missing and bleeder-slow", () => {
  it("calls the bleeder missing when nothing discharges the X capacitor", () => {
    const f = assess(xCapacitorInput(null)).flags.find((x) => x.code === "bleeder-missing")!;
    expect(f.severity).toBe("danger");
    expect(evNum(f, "pin voltage after the delay")).toBeGreaterThan(0.95 * 325.27);
  });

  it("calls a 1 MΩ bleeder on 0.47 µF slow: 38.7 V at 1 s against 34 V, though τ = 0.47 s", () => {
    const r = assess(xCapacitorInput(1e6));
    const f = r.flags.find((x) => x.code === "bleeder-slow")!;
    // Closed form (DERIVED): 325.27·e^(−1/0.47) = 38.74 V.
    expect(evNum(f, "pin voltage after the delay")).toBeCloseTo(38.74, 0);
    expect(evNum(f, "equivalent time constant")).toBeCloseTo(0.47, 2);
    expect(evText(f, "time constant above its limit")).toBe("no");
    expect(codes(r)).not.toContain("bleeder-missing");
  });

  it("stays silent with a 470 kΩ bleeder", () => {
    const r = assess(xCapacitorInput(470e3));
    expect(codes(r)).not.toContain("bleeder-slow");
    expect(codes(r)).not.toContain("bleeder-missing");
  });

  it("stays silent below 0.1 µF, where the rule does not apply", () => {
    expect(codes(assess(xCapacitorInput(null, 47e-9)))).not.toContain("bleeder-missing");
  });

  it("tells a dropper without a bleeder from one with a fast bleeder", () => {
    expect(codes(assess(dropperHeater({ fuse: true, cls: "X2", bleeder: null })))).toContain(
      "bleeder-missing",
    );
    const fast = codes(assess(dropperHeater({ fuse: true, cls: "X2", bleeder: 220e3 })));
    expect(fast).not.toContain("bleeder-missing");
    expect(fast).not.toContain("bleeder-slow");
  });
});

describe("no-fuse", () => {
  it("fires without a fuse in the supply path and not with one", () => {
    expect(codes(assess(dropperHeater({ fuse: false, cls: "X2", bleeder: 220e3 })))).toContain(
      "no-fuse",
    );
    expect(codes(assess(dropperHeater({ fuse: true, cls: "X2", bleeder: 220e3 })))).not.toContain(
      "no-fuse",
    );
  });
});

describe("no-surge-limit", () => {
  it("fires when a dropper feeds the bridge with no surge resistor, and the diode's peak passes 30 A", () => {
    const rec = testCircuit("night-light-dropper");
    const bare = replacePart(rec, "R1", null);
    bare.parts = bare.parts.map((p) => ({
      ...p,
      pins: Object.fromEntries(Object.entries(p.pins).map(([k, v]) => [k, v === "A" ? "L1" : v])),
    }));
    const r = assess(bare);
    const f = r.flags.find((x) => x.code === "no-surge-limit")!;
    expect(evNum(f, "peak current at switch-on")).toBeGreaterThan(30);
    expect(evNum(f, "peak surge rating")).toBe(30);
  });

  it("stays silent with the 100 Ω surge resistor in place: the crest peak is about 325 V / 100 Ω", () => {
    expect(codes(assess(testCircuit("night-light-dropper")))).not.toContain("no-surge-limit");
    // With a 1 A surge rating on D1 the flag shows the peak it was judged on. Closed form: both
    // capacitors start discharged, so at the crest only R1 (and two diode drops, and the fuse's
    // small resistance) limit the current: just under 230·√2 / 100 Ω = 3.253 A.
    const rec = testCircuit("night-light-dropper");
    rec.parts = rec.parts.map((p) => (p.ref === "D1" ? { ...p, rating: { surge_amps: 1 } } : p));
    const f = assess(rec).flags.find((x) => x.code === "no-surge-limit" && x.parts[0] === "D1")!;
    const peak = evNum(f, "peak current at switch-on");
    expect(peak).toBeLessThanOrEqual((230 * Math.SQRT2) / 100);
    expect(peak).toBeGreaterThan(((230 * Math.SQRT2 - 2 * 1.1) / 100) * 0.97);
    expect(evText(f, "surge rating taken from")).toBe("the record");
  });
});

describe("capacitor-class", () => {
  it("fires for an unrated dropper and not for an X2 one", () => {
    const unrated = assess(dropperHeater({ fuse: true, cls: null, bleeder: 220e3 })).flags.filter(
      (f) => f.code === "capacitor-class",
    );
    expect(unrated.map((f) => f.parts)).toEqual([["C1"]]);
    expect(evText(unrated[0]!, "position")).toContain("series");
    expect(codes(assess(dropperHeater({ fuse: true, cls: "X2", bleeder: 220e3 })))).not.toContain(
      "capacitor-class",
    );
  });

  it("reads the class from the marking when the rating has none", () => {
    const rec = dropperHeater({ fuse: true, cls: null, bleeder: 220e3 });
    rec.parts = rec.parts.map((p) => (p.ref === "C1" ? { ...p, marking: "105K 275V~ X2" } : p));
    expect(codes(assess(rec))).not.toContain("capacitor-class");
  });

  it("asks for a Y rating on a capacitor bridging to a touchable plate", () => {
    const base = dropperHeater({ fuse: true, cls: "X2", bleeder: 220e3 });
    const withCap = (extra: Partial<Part>) =>
      record(
        [
          ...base.parts,
          part("CY", "capacitor", ["N", "CASE"], 2.2e-9, extra),
          part("RC", "resistor", ["CASE", "CASE2"], 1),
        ],
        {
          CASE: { accessible: true },
        },
      );
    const bad = assess(withCap({})).flags.find(
      (f) => f.code === "capacitor-class" && f.parts[0] === "CY",
    )!;
    expect(bad.severity).toBe("danger");
    expect(
      assess(withCap({ rating: { class: "Y2" } })).flags.filter(
        (f) => f.code === "capacitor-class",
      ),
    ).toEqual([]);
  });
});

describe("overstress-voltage and overstress-power", () => {
  const withRating = (ref: string, rating: Part["rating"]) => {
    const rec = testCircuit("night-light-dropper");
    rec.parts = rec.parts.map((p) => (p.ref === ref ? { ...p, rating } : p));
    return rec;
  };

  it("flags a 4 V reservoir on a 5.3 V rail and not a 16 V one", () => {
    const f = assess(withRating("C2", { volts: 4 })).flags.find(
      (x) => x.code === "overstress-voltage" && x.parts[0] === "C2",
    )!;
    expect(f.severity).toBe("danger");
    expect(evText(f, "basis of the DC rating")).toBe("peak");
    expect(f.message).toContain("peak");
    expect(
      assess(withRating("C2", { volts: 16 })).flags.some(
        (x) => x.code === "overstress-voltage" && x.parts[0] === "C2",
      ),
    ).toBe(false);
  });

  it("compares an X2 rating as RMS: a 310 V~ part across 230 V passes", () => {
    const r = assess(testCircuit("night-light-dropper"));
    expect(r.flags.some((x) => x.code === "overstress-voltage" && x.parts[0] === "C1")).toBe(false);
  });

  it("uses the package's limiting element voltage when none is given, and says so", () => {
    const r = assess(withRating("R2", { package: "0805" }));
    const f = r.flags.find((x) => x.code === "overstress-voltage" && x.parts[0] === "R2")!;
    expect(evNum(f, "limiting element voltage")).toBe(150);
    expect(evText(f, "limiting element voltage taken from")).toContain("0805");
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: "R2", field: "rating.volts", value: 150 }),
    );
  });

  it("warns above half the power rating and calls danger above it", () => {
    // R1 carries the dropper's 33.9 mA RMS: 100 Ω × (33.9 mA)² = 0.115 W.
    const at = (watts: number) =>
      assess(withRating("R1", { watts })).flags.find(
        (x) => x.code === "overstress-power" && x.parts[0] === "R1",
      );
    expect(at(0.5)).toBeUndefined();
    expect(at(0.2)!.severity).toBe("warning");
    expect(at(0.1)!.severity).toBe("danger");
    expect(evNum(at(0.1)!, "mean dissipation")).toBeCloseTo(0.1146, 3);
  });
});

describe("spacing-short", () => {
  const spaced = (mm: number) => {
    const rec = testCircuit("night-light-dropper");
    return {
      ...rec,
      board: {
        spacings: [
          {
            between: ["L1", "N"] as [string, string],
            creepage_mm: mm,
            clearance_mm: mm,
            slot: false,
            material_group: "IIIa" as const,
            pollution_degree: 2 as const,
          },
        ],
      },
    };
  };

  it("flags 0.8 mm between line and neutral and passes 3.0 mm", () => {
    const f = assess(spaced(0.8)).flags.find((x) => x.code === "spacing-short")!;
    expect(evNum(f, "creepage required")).toBe(1.0);
    expect(evNum(f, "clearance required")).toBe(1.5);
    expect(evNum(f, "creepage table row (RMS)")).toBe(250);
    expect(codes(assess(spaced(3.0)))).not.toContain("spacing-short");
  });

  it("asks for reinforced distances to a touchable net behind a transformer", () => {
    const rec = stepUp({ ratio: 1, dischargeLoad: false });
    const iso = replacePart(rec, "RG", null);
    const withSpacing = {
      ...iso,
      nets: { ...iso.nets, RET: { role: null, accessible: true, note: null } },
      board: {
        spacings: [
          {
            between: ["L1", "RET"] as [string, string],
            creepage_mm: 3.0,
            clearance_mm: 2.0,
            slot: false,
            material_group: "IIIa" as const,
            pollution_degree: 2 as const,
          },
        ],
      },
    };
    const f = assess(withSpacing).flags.find((x) => x.code === "spacing-short")!;
    expect(evText(f, "insulation")).toBe("reinforced");
    expect(evNum(f, "clearance required")).toBe(3.0);
    expect(f.severity).toBe("danger");
  });
});

describe("no-trigger and trigger-marginal", () => {
  it("says a thyristor that never fires does not trigger", () => {
    expect(codes(assess(thyristorHeater(1e6)))).toContain("no-trigger");
    expect(codes(assess(thyristorHeater(100e3)))).not.toContain("no-trigger");
  });

  it("calls a trigger marginal when it stops firing within 10 % below the supply", () => {
    const f = assess(thyristorHeater(390e3)).flags.find((x) => x.code === "trigger-marginal")!;
    expect(evNum(f, "lowest supply that still fires it (RMS)")).toBeGreaterThan(207);
    expect(codes(assess(thyristorHeater(100e3)))).not.toContain("trigger-marginal");
  });
});

describe("high-voltage-output and ozone", () => {
  it("notes a step-up output above 1 kV, and ozone for its discharge load", () => {
    const r = assess(stepUp({ ratio: 0.1, dischargeLoad: true }));
    expect(r.flags.find((x) => x.code === "high-voltage-output")!.nets).toEqual(["HV"]);
    const oz = r.flags.find((x) => x.code === "ozone")!;
    expect(oz.severity).toBe("info");
    expect(oz.message).toContain("0.1 ppm");
  });

  it("stays quiet at a 1:1 ratio into a resistor, and notes ozone from the tags alone", () => {
    expect(codes(assess(stepUp({ ratio: 1, dischargeLoad: false })))).not.toContain(
      "high-voltage-output",
    );
    expect(codes(assess(stepUp({ ratio: 1, dischargeLoad: false })))).not.toContain("ozone");
    expect(codes(assess(stepUp({ ratio: 1, dischargeLoad: false, tags: ["ionizer"] })))).toContain(
      "ozone",
    );
  });
});

describe("every flag", () => {
  // Which published document each rule stands on, written here independently of the table.
  const EXPECTED: Record<string, { id: string; names: string[] }> = {
    "no-fuse": { id: "common-practice", names: ["common practice"] },
    "bleeder-missing": {
      id: "capacitor-discharge",
      names: ["IEC 60335-1", "22.5", "34 V", "IEC 60950-1", "2.1.1.7"],
    },
    "capacitor-class": { id: "iec-60384-14-x", names: ["IEC 60384-14", "X2"] },
    "no-surge-limit": { id: "rectifier-surge", names: ["1N4001", "I_FSM", "30 A"] },
  };

  it("cites its published document by id, with a caution and labelled evidence with units", () => {
    const r = assess(dropperHeater({ fuse: false, cls: null, bleeder: null }));
    expect(codes(r)).toEqual(
      expect.arrayContaining(["no-fuse", "bleeder-missing", "capacitor-class"]),
    );
    for (const f of r.flags) {
      const want = EXPECTED[f.code];
      if (want !== undefined) {
        expect(f.source_id).toBe(want.id);
        for (const n of want.names) expect(f.source).toContain(n);
      }
      expect(f.caution).toMatch(/estimate|measure|live|charged|check/i);
      for (const e of f.evidence) {
        expect(e.label).toMatch(/^[a-z0-9 ()'–,/.-]+$/i);
        expect(e.label).not.toContain("_");
        if (typeof e.value === "number") expect(Number.isFinite(e.value)).toBe(true);
      }
    }
    const missing = r.flags.find((f) => f.code === "bleeder-missing")!;
    expect(missing.evidence).toContainEqual({
      label: "capacitance at the plug pins",
      value: expect.closeTo(1e-6, 7),
      unit: "F",
    });
  });
});
