/**
 * AC phasor solves of 100 random RLC networks against mathjs (math.lusolve on the complex
 * nodal admittance matrix built here, independently of the engine's MNA).
 */
import { describe, expect, it } from "vitest";
import * as math from "mathjs";
import type { Part } from "@teardown/engine";
import { GMIN_SIEMENS, solveAcPhasor } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

function generator(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const logUniform = (r: () => number, lo: number, hi: number) => lo * Math.pow(hi / lo, r());

function randomNetwork(seed: number): Part[] {
  const r = generator(seed);
  const nets = ["L", "N", ...Array.from({ length: 2 + Math.floor(r() * 6) }, (_, i) => `X${i}`)];
  const parts: Part[] = [];
  let id = 0;
  const add = (a: string, b: string) => {
    const kind = r();
    id++;
    if (kind < 0.4) parts.push(part(`R${id}`, "resistor", [a, b], logUniform(r, 10, 1e5)));
    else if (kind < 0.7) parts.push(part(`C${id}`, "capacitor", [a, b], logUniform(r, 1e-9, 1e-5)));
    else
      parts.push(
        part(`L${id}`, "inductor", [a, b], logUniform(r, 1e-3, 1), {
          model: { r: logUniform(r, 0.1, 100) },
        }),
      );
  };
  // A spanning chain keeps every net connected to L and N, then random extra branches.
  for (let i = 2; i < nets.length; i++) add(nets[i]!, i === 2 ? "L" : nets[Math.floor(r() * i)]!);
  add("N", nets[2 + Math.floor(r() * (nets.length - 2))]!);
  const extra = 1 + Math.floor(r() * 8);
  for (let k = 0; k < extra; k++) {
    const a = nets[Math.floor(r() * nets.length)]!;
    const b = nets[Math.floor(r() * nets.length)]!;
    if (a !== b) add(a, b);
  }
  return parts;
}

describe("AC phasors against mathjs on random RLC networks", () => {
  it("agrees on every net voltage of 100 random networks", () => {
    const w = 2 * Math.PI * 50;
    const vpk = 230 * Math.SQRT2;
    for (let seed = 1; seed <= 100; seed++) {
      const parts = randomNetwork(seed);
      const res = solveAcPhasor(record(parts));
      if (!res.ok) throw new Error(`seed ${seed}: ${res.error.message}`);
      // Independent nodal analysis: unknowns are the nets other than L (known) and N (reference).
      const unknown = [...new Set(parts.flatMap((p) => Object.values(p.pins)))]
        .filter((n) => n !== "L" && n !== "N")
        .sort();
      const idx = new Map(unknown.map((n, i) => [n, i]));
      const m = unknown.length;
      const y: math.Complex[][] = Array.from({ length: m }, () =>
        Array.from({ length: m }, () => math.complex(0, 0)),
      );
      const b: math.Complex[] = Array.from({ length: m }, () => math.complex(0, 0));
      // The engine's reported gmin from every net to the reference is part of its model.
      for (let i = 0; i < m; i++) y[i]![i] = math.complex(GMIN_SIEMENS, 0);
      for (const p of parts) {
        const [na, nb] = Object.values(p.pins) as [string, string];
        const adm =
          p.kind === "resistor"
            ? math.complex(1 / p.value!, 0)
            : p.kind === "capacitor"
              ? math.complex(0, w * p.value!)
              : (math.divide(1, math.complex(p.model.r!, w * p.value!)) as math.Complex);
        const ia = idx.get(na);
        const ib = idx.get(nb);
        if (ia !== undefined) y[ia]![ia] = math.add(y[ia]![ia]!, adm) as math.Complex;
        if (ib !== undefined) y[ib]![ib] = math.add(y[ib]![ib]!, adm) as math.Complex;
        if (ia !== undefined && ib !== undefined) {
          y[ia]![ib] = math.subtract(y[ia]![ib]!, adm) as math.Complex;
          y[ib]![ia] = math.subtract(y[ib]![ia]!, adm) as math.Complex;
        }
        // A branch to the known line voltage moves Y·V_L to the right-hand side.
        if (ia !== undefined && nb === "L")
          b[ia] = math.add(b[ia]!, math.multiply(adm, vpk)) as math.Complex;
        if (ib !== undefined && na === "L")
          b[ib] = math.add(b[ib]!, math.multiply(adm, vpk)) as math.Complex;
      }
      const sol = math.lusolve(y, b) as unknown as math.Complex[][];
      const scale = Math.max(
        vpk,
        ...sol.map(
          (row) => math.abs(math.complex(row[0]! as unknown as math.Complex)) as unknown as number,
        ),
      );
      unknown.forEach((n, i) => {
        const ref = math.complex(sol[i]![0]! as unknown as math.Complex);
        const got = res.value.nets[n]!;
        // Source: mathjs complex LU solve (independent library).
        expect(Math.abs(got.re - ref.re) / scale).toBeLessThan(1e-7);
        expect(Math.abs(got.im - ref.im) / scale).toBeLessThan(1e-7);
      });
    }
  });
});
