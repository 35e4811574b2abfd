/**
 * `npm run bench`: runs every `tests/bench/*-bench.ts` in turn, each as its own `npx tsx`
 * process (so one bench's warm caches and threads do not colour the next), printing its output.
 * Exits non-zero when any bench failed, after running the rest.
 */
import { spawn } from "node:child_process";
import { readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const BENCH_DIR = path.dirname(fileURLToPath(import.meta.url));
const ROOT = path.resolve(BENCH_DIR, "..", "..");

function runBench(file: string): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn("npx", ["tsx", path.join(BENCH_DIR, file)], {
      cwd: ROOT,
      stdio: "inherit",
    });
    child.on("error", (err) => {
      console.error(`${file}: could not start: ${err.message}`);
      resolve(1);
    });
    child.on("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

const benches = readdirSync(BENCH_DIR)
  .filter((f) => f.endsWith("-bench.ts"))
  .sort();
const failed: string[] = [];
for (const file of benches) {
  console.log(`\n== ${file}`);
  const started = performance.now();
  const code = await runBench(file);
  console.log(
    `== ${file}: ${code === 0 ? "finished" : `FAILED (exit ${code})`} in ${((performance.now() - started) / 1000).toFixed(1)} s`,
  );
  if (code !== 0) failed.push(file);
}
console.log(
  `\n${benches.length - failed.length} of ${benches.length} benches finished${failed.length ? `; failed: ${failed.join(", ")}` : ""}`,
);
process.exitCode = failed.length ? 1 : 0;
