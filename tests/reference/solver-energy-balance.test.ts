/**
 * Energy balance and Kirchhoff's current law on every reference circuit (both are laws, not
 * tolerances we chose: Tellegen's theorem makes the parts' mean powers add up to the input
 * power, and KCL holds at every net at every time point).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, STORAGE_POWER_TOLERANCE } from "@teardown/engine";
import { allReferenceCircuits } from "../engine/solver/reference-circuits.js";

describe("energy balance and KCL on the reference circuits", () => {
  for (const [name, rec] of Object.entries(allReferenceCircuits())) {
    it(`adds the parts' dissipations up to the input power within 1% for the ${name}`, () => {
      const r = analyzeCircuit(rec, { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const sum = Object.values(r.value.parts).reduce((a, p) => a + p.power, 0);
      // Source: conservation of energy (Tellegen's theorem), a law.
      expect(Math.abs(sum - r.value.input.power)).toBeLessThan(
        0.01 * Math.abs(r.value.input.power) + 1e-9,
      );
      expect(r.value.input.power).toBeGreaterThan(0);
    });

    it(`keeps the KCL residual at every net below a microamp for the ${name}`, () => {
      const r = analyzeCircuit(rec, { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      // Source: Kirchhoff's current law, a law; 1 µA against currents of mA to A.
      expect(r.value.solver.kcl_residual_amps).toBeLessThan(1e-6);
    });

    it(`leaves energy-storing parts with almost no mean power for the ${name}`, () => {
      const r = analyzeCircuit(rec, { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      // Source: closed form, a capacitor's mean power over a period of a periodic state is zero.
      for (const p of rec.parts.filter((q) => q.kind === "capacitor" || q.kind === "inductor")) {
        // The engine's stated bound: a thousandth of the input power.
        expect(Math.abs(r.value.parts[p.ref]!.power)).toBeLessThan(
          STORAGE_POWER_TOLERANCE * Math.max(r.value.input.power, 1e-3),
        );
      }
    });
  }
});
