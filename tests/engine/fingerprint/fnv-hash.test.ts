import { describe, expect, it } from "vitest";
import { fnv1a32 } from "@teardown/engine";

describe("fnv1a32", () => {
  // FNV-1a 32-bit test vectors of the FNV authors' test suite (from memory): "" -> 0x811c9dc5,
  // "a" -> 0xe40c292c, "foobar" -> 0xbf9cf968; shown here as signed 32-bit integers.
  it("gives the published FNV-1a values, as signed 32-bit integers", () => {
    expect(fnv1a32("")).toBe(0x811c9dc5 | 0);
    expect(fnv1a32("a")).toBe(0xe40c292c | 0);
    expect(fnv1a32("foobar")).toBe(0xbf9cf968 | 0);
  });

  it("hashes by hand the same as the definition for a two-octet string", () => {
    // Hand computation of the definition: h = (h ^ octet) * 16777619 mod 2^32, from 2166136261.
    let h = 2166136261n;
    for (const octet of [0x52, 0x31]) h = ((h ^ BigInt(octet)) * 16777619n) % 2n ** 32n;
    expect(fnv1a32("R1")).toBe(Number(BigInt.asIntN(32, h)));
  });

  it("stays inside the Postgres int4 range and hashes non-Latin text by its UTF-8 octets", () => {
    for (const s of ["Ω", "µF", "part:resistor@5", "x".repeat(1000)]) {
      const h = fnv1a32(s);
      expect(Number.isInteger(h)).toBe(true);
      expect(h).toBeGreaterThanOrEqual(-(2 ** 31));
      expect(h).toBeLessThanOrEqual(2 ** 31 - 1);
    }
    expect(fnv1a32("Ω")).not.toBe(fnv1a32("©"));
  });
});
