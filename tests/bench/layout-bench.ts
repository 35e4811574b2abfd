/**
 * Layout speed on a 40-part record: a few warm-up runs, then timed runs, printing the median
 * and the 95th percentile. Run with `npx tsx tests/bench/layout-bench.ts`. The target is a
 * median under 300 ms; this is a measurement, not a test, so a slow machine fails nothing.
 */
import { layoutSchematic } from "@teardown/engine";
import { ladderRecord } from "../engine/layout/layout-circuits.js";

const WARM_UP_RUNS = 3;
const TIMED_RUNS = 25;
const TARGET_MEDIAN_MS = 300;

/** The value below which `q` of the sorted samples fall (nearest rank). */
function quantile(sorted: readonly number[], q: number): number {
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[rank]!;
}

const record = ladderRecord(9);
for (let i = 0; i < WARM_UP_RUNS; i++) await layoutSchematic(record);
const times: number[] = [];
for (let i = 0; i < TIMED_RUNS; i++) {
  const start = performance.now();
  const result = await layoutSchematic(record);
  times.push(performance.now() - start);
  if (!result.ok) throw new Error(`layout failed: ${result.message}`);
}
times.sort((a, b) => a - b);
const median = quantile(times, 0.5);
console.log(
  `layoutSchematic, ${record.parts.length} parts, ${TIMED_RUNS} runs after ${WARM_UP_RUNS} warm-up:`,
);
console.log(
  `  median ${median.toFixed(1)} ms, p95 ${quantile(times, 0.95).toFixed(1)} ms, min ${times[0]!.toFixed(1)} ms`,
);
console.log(
  `  target median < ${TARGET_MEDIAN_MS} ms: ${median < TARGET_MEDIAN_MS ? "met" : "NOT met"}`,
);
