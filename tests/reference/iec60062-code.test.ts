/**
 * The letter-and-digit code where the letter stands for the decimal point.
 * Published document: IEC 60062:2016 "Marking codes for resistors and capacitors", clause 4
 * (letter and digit code for resistance and capacitance values) and clause 5 (tolerance code
 * letters); clause numbers from memory, the standard's listing FOUND at
 * https://www.ove.at/webshop/artikel/b4df090c1d-iec-60062-2016.html. Worked examples of the
 * code FOUND at https://en.wikipedia.org/wiki/RKM_code and https://wikisum.wiki/wiki/RKM_code.
 */
import { describe, expect, it } from "vitest";
import { parseTolerance, parseValue } from "@teardown/engine";

function ohms(text: string): number {
  const r = parseValue(text, { unit: "Ω" });
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

function farads(text: string): number {
  const r = parseValue(text, { unit: "F" });
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

describe("IEC 60062 resistance code", () => {
  it("4R7 is 4.7 Ω (FOUND, RKM code page)", () => expect(ohms("4R7")).toBe(4.7));
  it("R47 is 0.47 Ω (FOUND, RKM code page)", () => expect(ohms("R47")).toBe(0.47));
  it("470R is 470 Ω (FOUND, RKM code page)", () => expect(ohms("470R")).toBe(470));
  it("1k3 and 1K3 are 1.3 kΩ (IEC 60062:2016 clause 4, letter K for 10³; lowercase k is common practice)", () => {
    expect(ohms("1k3")).toBe(1300);
    expect(ohms("1K3")).toBe(1300);
  });
  it("47K3 is 47.3 kΩ (FOUND, RKM code page)", () => expect(ohms("47K3")).toBe(47300));
  it("2M2 is 2 200 000 Ω (IEC 60062:2016 clause 4, letter M for 10⁶; the 4M7 example FOUND)", () =>
    expect(ohms("2M2")).toBe(2_200_000));
  it("0R1 is 0.1 Ω (common practice; the standard form R10 too)", () => {
    expect(ohms("0R1")).toBe(0.1);
    expect(ohms("R10")).toBe(0.1);
  });
  it("4L7 is 4.7 mΩ (L FOUND, tickerdossier DIN 40825 page)", () =>
    expect(ohms("4L7")).toBe(0.0047));
  it("1G5 is 1.5 GΩ (G FOUND)", () => expect(ohms("1G5")).toBe(1.5e9));
});

describe("IEC 60062 capacitance code", () => {
  it("4n7 is 4.7 nF (FOUND, wikisum RKM page)", () => expect(farads("4n7")).toBe(4.7e-9));
  it("4p7 is 4.7 pF and 2p2 is 2.2 pF (FOUND)", () => {
    expect(farads("4p7")).toBe(4.7e-12);
    expect(farads("2p2")).toBe(2.2e-12);
  });
  it("1µ0 and 4u7 are 1 µF and 4.7 µF (FOUND; u is the ASCII fallback)", () => {
    expect(farads("1µ0")).toBe(1e-6);
    expect(farads("4u7")).toBe(4.7e-6);
  });
  it("2m2 is 2.2 mF: lowercase m is milli, unlike the resistor's M (FOUND)", () =>
    expect(farads("2m2")).toBe(2.2e-3));
});

describe("IEC 60062 tolerance letters", () => {
  it("F G J K M are ±1, 2, 5, 10, 20 % (IEC 60062:2016 clause 5 tolerance letters, FOUND in reproductions)", () => {
    const read = ["F", "G", "J", "K", "M"].map((l) => parseTolerance(l));
    expect(read.map((r) => (r.ok ? r.value : null))).toEqual([0.01, 0.02, 0.05, 0.1, 0.2]);
  });
});
