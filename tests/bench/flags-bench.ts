/**
 * Risk-assessment benchmark (a plain script: `npx tsx tests/bench/flags-bench.ts`): the median
 * time of `assessRisks` on a 30-part mains circuit (dropper, bridge, reservoir, thyristor trigger,
 * LED branches) with two measurements and two board spacings, after the solver's analysis.
 * Target: < 2 s with the default 40 Monte Carlo samples. A measurement, not a test.
 */
import type { Part, TeardownRecord } from "@teardown/engine";
import { analyzeCircuit, assessRisks } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

const RUNS = 5;
const TARGET_MS = 2000;

/** A dropper supply with a thyristor trigger and `sections` LED branches (4 parts each) on its rail. */
function mainsCircuit(sections: number): TeardownRecord {
  const parts: Part[] = [
    part("F1", "fuse", ["L", "L1"], 0.5),
    part("RV1", "varistor", ["L1", "N"], 470),
    part("C1", "capacitor", ["L1", "A"], 470e-9, { rating: { volts: 310, class: "X2" } }),
    part("R1", "resistor", ["L1", "A"], 1e6),
    part("R2", "resistor", ["A", "B"], 100),
    part("D1", "diode", { anode: "B", cathode: "P" }),
    part("D2", "diode", { anode: "N", cathode: "P" }),
    part("D3", "diode", { anode: "M", cathode: "B" }),
    part("D4", "diode", { anode: "M", cathode: "N" }),
    part("C2", "capacitor", { plus: "P", minus: "M" }, 220e-6, {
      polarised: true,
      rating: { volts: 35 },
    }),
    part("Z1", "zener", { anode: "M", cathode: "P" }, 24),
    part("RA", "resistor", ["P", "G"], 22_000),
    part("RB", "resistor", ["G", "M"], 4_700),
    part("Q1", "thyristor", { anode: "K", gate: "G", cathode: "M" }),
    part("RK", "resistor", ["P", "K"], 2_200),
  ];
  for (let s = 0; s < sections; s++) {
    parts.push(
      part(`RS${s}`, "resistor", ["P", `S${s}`], 47_000 + 1000 * s),
      part(`LED${s}`, "led", { anode: `S${s}`, cathode: `T${s}` }),
      part(`RT${s}`, "resistor", [`T${s}`, "M"], 100),
      part(`CS${s}`, "capacitor", [`S${s}`, "M"], 100e-9),
    );
  }
  const rec = record(parts);
  const supply = rec.device.rated_supply;
  return {
    ...rec,
    measurements: [
      {
        what: "input.current_rms",
        value: 0.03,
        between: null,
        part: null,
        supply,
        instrument: null,
        uncertainty: { relative: 0.03 },
      },
      {
        what: "voltage.dc",
        between: ["P", "M"],
        value: 23.5,
        part: null,
        supply,
        instrument: null,
        uncertainty: { absolute: 0.3 },
      },
    ],
    board: {
      spacings: [
        {
          between: ["L1", "N"],
          creepage_mm: 2.0,
          clearance_mm: 1.8,
          slot: false,
          material_group: "IIIa",
          pollution_degree: 2,
        },
        {
          between: ["A", "P"],
          creepage_mm: 1.5,
          clearance_mm: 1.5,
          slot: false,
          material_group: "IIIa",
          pollution_degree: 2,
        },
      ],
    },
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

const rec = mainsCircuit(4);
const analysis = analyzeCircuit(rec, {});
if (!analysis.ok)
  throw new Error(`analysis failed: ${analysis.error.code} ${analysis.error.message}`);
const times: number[] = [];
let flags = 0;
for (let k = 0; k < RUNS; k++) {
  const t0 = performance.now();
  const out = assessRisks(rec, analysis.value, { now: () => performance.now(), budgetMs: 60_000 });
  times.push(performance.now() - t0);
  flags = out.flags.length;
}
process.stdout.write(
  `assessRisks on a ${rec.parts.length}-part mains circuit (${rec.measurements.length} measurements, ${rec.board.spacings.length} spacings, ${flags} flags): ` +
    `median ${median(times).toFixed(0)} ms over ${RUNS} runs (target < ${TARGET_MS} ms)\n`,
);
