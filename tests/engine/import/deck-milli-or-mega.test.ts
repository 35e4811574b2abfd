/**
 * The deck reads `M` as milli (the deck convention); the reader warns where mega is far likelier.
 * Expected readings are the notation's own definition: m = 1e-3, meg = 1e6.
 */
import { describe, expect, it } from "vitest";
import { readDeck, type InputError, type ParseResult, type TeardownRecord } from "@teardown/engine";

/** The record with the reader's warnings beside it. */
function ok(result: ParseResult): TeardownRecord & { warnings: InputError[] } {
  if (!result.ok) throw new Error(JSON.stringify(result.errors, null, 1));
  return Object.assign(result.record, { warnings: result.warnings });
}

const deck = (body: string): string =>
  ["Milli probe", ".supply 230 50", ".line L", ".neutral N", body, ".end"].join("\n");

describe("deck values whose M made them milli", () => {
  it("warns on R1 L A 1M, naming line 5 and suggesting 1meg, and still reads 1 mΩ", () => {
    const r = ok(readDeck(deck("R1 L A 1M\nC1 A N 100n")));
    expect(r.parts.find((p) => p.ref === "R1")!.value).toBe(1e-3);
    const w = r.warnings.filter((x) => x.code === "milli-or-mega");
    expect(w.map((x) => [x.path, x.line])).toEqual([["parts[0].value", 5]]);
    expect(w[0]!.message).toContain("1meg");
  });

  it("warns on every resistor written with m or M, also as a value= word, and not on meg or MEG", () => {
    const r = ok(
      readDeck(deck("R1 L A 2m2\nR2 A B 1meg\nXR3 B C resistor value=470m\nR4 C N 1MEG")),
    );
    const w = r.warnings.filter((x) => x.code === "milli-or-mega");
    expect(w.map((x) => [x.path, x.line])).toEqual([
      ["parts[0].value", 5],
      ["parts[2].value", 7],
    ]);
    expect(r.parts.find((p) => p.ref === "R2")!.value).toBe(1e6);
    expect(r.parts.find((p) => p.ref === "R4")!.value).toBe(1e6);
  });

  it("warns on a non-resistor only when the milli reading is implausible for its kind", () => {
    // 1 mF is a real reservoir capacitor; a 1 mH choke is real; 10 mV is no zener and 2 mH of
    // transformer primary is plausible, but a 1 mA-rated varistor voltage of 0.47 V is not.
    const body = "C1 L A 1M\nL1 A B 1m\nXZ1 B N zener value=10m\nXRV1 L N varistor value=470m";
    const r = ok(readDeck(deck(body)));
    const w = r.warnings.filter((x) => x.code === "milli-or-mega");
    expect(w.map((x) => [x.path, x.line])).toEqual([
      ["parts[2].value", 7],
      ["parts[3].value", 8],
    ]);
  });

  it("warns on a model parameter whose milli reading is implausible (ratio=40m is fine, lp=10m too)", () => {
    const r = ok(
      readDeck(deck("XT1 L N S1 S2 transformer lp=10m ratio=40m\nXD1 S1 S2 diode is=5m")),
    );
    const w = r.warnings.filter((x) => x.code === "milli-or-mega");
    expect(w.map((x) => [x.path, x.line])).toEqual([["parts[1].model.is", 6]]);
  });
});
