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
    expect(f.evidence.path).toEqual(["CASE", "RC", "N"]);
    expect(f.evidence.path_resistance_ohms).toBe(10e3);
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
    expect(f.evidence.v_after_delay_v as number).toBeGreaterThan(0.95 * 325.27);
  });

  it("calls a 1 MΩ bleeder on 0.47 µF slow: 38.7 V at 1 s against 34 V, though τ = 0.47 s", () => {
    const r = assess(xCapacitorInput(1e6));
    const f = r.flags.find((x) => x.code === "bleeder-slow")!;
    // Closed form (reference-values.md §1, DERIVED): 325.27·e^(−1/0.47) = 38.74 V.
    expect(f.evidence.v_after_delay_v as number).toBeCloseTo(38.74, 0);
    expect(f.evidence.tau_s as number).toBeCloseTo(0.47, 2);
    expect(f.evidence.exceeds_tau_limit).toBe(false);
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
    expect(f.evidence.peak_a as number).toBeGreaterThan(30);
    expect(f.evidence.limit_a).toBe(30);
  });

  it("stays silent with the 100 Ω surge resistor in place (peak about 325 V / 100 Ω)", () => {
    const r = assess(testCircuit("night-light-dropper"));
    expect(codes(r)).not.toContain("no-surge-limit");
  });
});

describe("capacitor-class", () => {
  it("fires for an unrated dropper and not for an X2 one", () => {
    const unrated = assess(dropperHeater({ fuse: true, cls: null, bleeder: 220e3 })).flags.filter(
      (f) => f.code === "capacitor-class",
    );
    expect(unrated.map((f) => f.parts)).toEqual([["C1"]]);
    expect(unrated[0]!.evidence.position).toContain("series");
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
    expect(f.evidence.basis).toContain("DC");
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
    const f = assess(withRating("R2", { package: "0805" })).flags.find(
      (x) => x.code === "overstress-voltage" && x.parts[0] === "R2",
    )!;
    expect(f.evidence.limit_v).toBe(150);
    expect(f.evidence.rating_source).toContain("0805");
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
    expect(at(0.1)!.evidence.power_w as number).toBeCloseTo(0.1146, 3);
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
    expect(f.evidence.creepage_required_mm).toBe(1.0);
    expect(f.evidence.clearance_required_mm).toBe(1.5);
    expect(f.evidence.creepage_row_vrms_v).toBe(250);
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
    expect(f.evidence.insulation).toBe("reinforced");
    expect(f.evidence.clearance_required_mm).toBe(3.0);
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
    expect(f.evidence.min_supply_vrms_v as number).toBeGreaterThan(207);
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
  it("carries a source, a caution and numbers in its evidence", () => {
    const r = assess(dropperHeater({ fuse: false, cls: null, bleeder: null }));
    expect(r.flags.length).toBeGreaterThan(2);
    for (const f of r.flags) {
      expect(f.source.length).toBeGreaterThan(5);
      expect(f.caution.length).toBeGreaterThan(10);
      expect(Object.keys(f.evidence).length).toBeGreaterThan(0);
    }
  });
});
