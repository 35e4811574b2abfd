import { describe, expect, it } from "vitest";
import { matchFragment } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { ALL_TEST_CIRCUITS, testCircuit } from "../../support/circuits/all-test-circuits.js";

/** A dropper capacitor into one AC net of a bridge: the fragment a user might paste. */
const BRIDGE_PLUS_DROPPER = record([
  part("CD", "capacitor", ["IN", "AC1"]),
  part("DA", "diode", { anode: "AC1", cathode: "POS" }),
  part("DB", "diode", { anode: "AC2", cathode: "POS" }),
  part("DC", "diode", { anode: "NEG", cathode: "AC1" }),
  part("DD", "diode", { anode: "NEG", cathode: "AC2" }),
]);

const BRIDGE_ONLY = record([
  part("DA", "diode", { anode: "AC1", cathode: "POS" }),
  part("DB", "diode", { anode: "AC2", cathode: "POS" }),
  part("DC", "diode", { anode: "NEG", cathode: "AC1" }),
  part("DD", "diode", { anode: "NEG", cathode: "AC2" }),
]);

describe("matchFragment", () => {
  it("finds the bridge-plus-dropper fragment in exactly the records that contain it", () => {
    const hits = ALL_TEST_CIRCUITS.filter(
      (c) => matchFragment(BRIDGE_PLUS_DROPPER, c.record).mappings.length > 0,
    ).map((c) => c.name);
    expect(hits.sort()).toEqual(["neutral-side-dropper", "night-light-dropper"]);
  });

  it("maps each fragment part onto the right record part", () => {
    expect(matchFragment(BRIDGE_PLUS_DROPPER, testCircuit("night-light-dropper"))).toEqual({
      mappings: [{ CD: "C1", DA: "D1", DB: "D2", DC: "D3", DD: "D4" }],
      complete: true,
    });
    // In the neutral-side dropper the capacitor feeds the AC net that D2 and D4 sit on.
    expect(matchFragment(BRIDGE_PLUS_DROPPER, testCircuit("neutral-side-dropper"))).toEqual({
      mappings: [{ CD: "C1", DA: "D2", DB: "D1", DC: "D4", DD: "D3" }],
      complete: true,
    });
  });

  it("returns both mappings of a bare bridge, one per swap of its AC nets", () => {
    const result = matchFragment(BRIDGE_ONLY, testCircuit("fused-transformer-supply"));
    expect(result.complete).toBe(true);
    expect(result.mappings).toEqual([
      { DA: "D1", DB: "D2", DC: "D3", DD: "D4" },
      { DA: "D2", DB: "D1", DC: "D4", DD: "D3" },
    ]);
  });

  it("lets a resistor's ends swap but counts each placement once", () => {
    const fragment = record([part("RX", "resistor", ["U", "V"])]);
    const result = matchFragment(fragment, testCircuit("night-light-dropper"));
    expect(result.mappings.map((m) => m["RX"]).sort()).toEqual(["R1", "R2", "R3"]);
  });

  it("keeps diode polarity and kind: a diode fragment never lands on a zener or an LED", () => {
    const fragment = record([
      part("DX", "diode", { anode: "U", cathode: "V" }),
      part("CX", "capacitor", { plus: "V", minus: "W" }, null, { polarised: true }),
    ]);
    // In the half-wave supply D1 feeds the plus pin of C1; the zener Z1 must not be offered.
    expect(matchFragment(fragment, testCircuit("half-wave-resistive")).mappings).toEqual([
      { DX: "D1", CX: "C1" },
    ]);
    const reversed = record([
      part("DX", "diode", { anode: "V", cathode: "U" }),
      part("CX", "capacitor", { plus: "V", minus: "W" }, null, { polarised: true }),
    ]);
    expect(matchFragment(reversed, testCircuit("half-wave-resistive")).mappings).toEqual([]);
  });

  it("maps a fragment net declared line only onto a line net", () => {
    const fragment = record([part("RX", "resistor", ["LIVE", "U"])], { LIVE: { role: "line" } });
    expect(matchFragment(fragment, testCircuit("half-wave-resistive")).mappings).toEqual([
      { RX: "R1" },
    ]);
    expect(matchFragment(fragment, testCircuit("night-light-dropper")).mappings).toEqual([]);
  });

  it("maps fragment nets injectively: two resistors on distinct fragment nets are not one net", () => {
    const fragment = record([
      part("RA", "resistor", ["U", "V"]),
      part("RB", "resistor", ["V", "W"]),
    ]);
    // R2 and R3 of the igniter share G, with ends P and N: two placements (either order).
    const result = matchFragment(fragment, testCircuit("thyristor-igniter"));
    const pairs = result.mappings.map((m) => `${m["RA"]}-${m["RB"]}`).sort();
    expect(pairs).toEqual(["R1-R2", "R2-R1", "R2-R3", "R3-R2"]);
  });

  it("stops at the cap and says so", () => {
    const fragment = record([part("RX", "resistor", ["U", "V"])]);
    const rec = testCircuit("night-light-dropper");
    expect(matchFragment(fragment, rec, { maxMappings: 2 })).toMatchObject({
      complete: false,
      reason: "cap",
    });
    expect(matchFragment(fragment, rec, { maxMappings: 2 }).mappings).toHaveLength(2);
    expect(matchFragment(fragment, rec, { maxMappings: 3 })).toMatchObject({ complete: true });
  });

  it("stops when the clock passed in runs past the budget", () => {
    // 30 resistors in parallel: a three-resistor chain fragment has no placement, but the search
    // must try many; a clock that moves 1 ms per reading runs out of a 5 ms budget.
    const parts = Array.from({ length: 30 }, (_, i) => part(`R${i}`, "resistor", ["A", "B"], 1));
    const rec = record(parts);
    const fragment = record([
      part("X1", "resistor", ["U", "V"]),
      part("X2", "resistor", ["U", "V"]),
      part("X3", "resistor", ["U", "V"]),
    ]);
    let t = 0;
    const result = matchFragment(fragment, rec, { maxMappings: 1e9, budgetMs: 5, now: () => t++ });
    expect(result).toMatchObject({ complete: false, reason: "budget" });
    const unbounded = matchFragment(fragment, rec, { maxMappings: 1e9 });
    expect(unbounded.complete).toBe(true);
    expect(unbounded.mappings).toHaveLength(30 * 29 * 28);
  });

  it("finds nothing for an empty fragment and everything is complete", () => {
    expect(matchFragment(record([]), testCircuit("triac-dimmer"))).toEqual({
      mappings: [],
      complete: true,
    });
  });
});
