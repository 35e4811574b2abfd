/**
 * Solver benchmark (a plain script: `npx tsx tests/bench/solver-bench.ts`): the median time of
 * a full analysis (AC view, periodic steady state, figures, trigger threshold) of a 30-part and
 * a 200-part mains circuit, with the sparse LU and with the dense LU. Targets: < 100 ms and < 1 s.
 */
import type { Part, TeardownRecord } from "@teardown/engine";
import { analyzeCircuit } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

/**
 * A mains gadget: fuse and varistor at the entry, a thyristor phase controller on a bridge
 * (load, divider gate drive), and a dropper supply (bleeder, surge resistor, second bridge,
 * storage capacitor, zener) feeding `sections` LED branches of four parts each.
 */
function mainsCircuit(sections: number): TeardownRecord {
  const parts: Part[] = [
    part("F1", "fuse", ["L", "L1"], 0.5),
    part("RV1", "varistor", ["L1", "N"], 470),
    part("D1", "diode", { anode: "L1", cathode: "P" }),
    part("D2", "diode", { anode: "N", cathode: "P" }),
    part("D3", "diode", { anode: "M", cathode: "L1" }),
    part("D4", "diode", { anode: "M", cathode: "N" }),
    part("RL", "resistor", ["P", "K"], 1_000),
    part("Q1", "thyristor", { anode: "K", gate: "G", cathode: "M" }),
    part("RA", "resistor", ["P", "G"], 150_000),
    part("RB", "resistor", ["G", "M"], 1_000),
    part("C1", "capacitor", ["L1", "A"], 470e-9),
    part("R1", "resistor", ["L1", "A"], 1e6),
    part("R2", "resistor", ["A", "B"], 100),
    part("D5", "diode", { anode: "B", cathode: "Q" }),
    part("D6", "diode", { anode: "N", cathode: "Q" }),
    part("D7", "diode", { anode: "R", cathode: "B" }),
    part("D8", "diode", { anode: "R", cathode: "N" }),
    part("C2", "capacitor", { plus: "Q", minus: "R" }, 220e-6, { polarised: true }),
    part("Z1", "zener", { anode: "R", cathode: "Q" }, 24),
  ];
  for (let s = 0; s < sections; s++) {
    parts.push(
      part(`RS${s}`, "resistor", ["Q", `S${s}`], 4_700 + 100 * s),
      part(`LED${s}`, "led", { anode: `S${s}`, cathode: `T${s}` }),
      part(`RT${s}`, "resistor", [`T${s}`, "R"], 100),
      part(`CS${s}`, "capacitor", [`S${s}`, "R"], 100e-9),
    );
  }
  return record(parts);
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

/** Median milliseconds of `runs` analyses, or the failure's code. */
function time(
  rec: TeardownRecord,
  lu: "sparse" | "dense",
  runs: number,
  minSupply: boolean,
): number | string {
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    const r = analyzeCircuit(rec, {
      lu,
      minSupply,
      now: () => performance.now(),
      budgetMs: 120_000,
    });
    times.push(performance.now() - t0);
    if (!r.ok) return `${r.error.code} after ${times[times.length - 1]!.toFixed(0)} ms`;
  }
  return median(times);
}

const show = (v: number | string) => (typeof v === "number" ? `${v.toFixed(1)} ms` : v);

for (const [label, sections, target] of [
  ["30-part mains circuit", 3, 100],
  ["200-part mains circuit", 46, 1000],
] as const) {
  const rec = mainsCircuit(sections);
  const runs = sections > 10 ? 3 : 5;
  for (const minSupply of [true, false]) {
    const sparse = time(rec, "sparse", runs, minSupply);
    const dense = time(rec, "dense", runs, minSupply);
    const ratio =
      typeof sparse === "number" && typeof dense === "number" ? (dense / sparse).toFixed(2) : "n/a";
    process.stdout.write(
      `${label} (${rec.parts.length} parts), ${minSupply ? "full analysis" : "without the lowest-firing-supply bisection"}: ` +
        `sparse ${show(sparse)} (target < ${target} ms), dense ${show(dense)}, dense/sparse ${ratio}\n`,
    );
  }
}
