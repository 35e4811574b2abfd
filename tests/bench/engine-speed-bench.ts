/**
 * Engine speed (a plain script: `npx tsx tests/bench/engine-speed-bench.ts`): medians over
 * BENCH_RUNS runs (default 10) of
 *   - the 31-part mains circuit: the nominal solve (target < 50 ms), and the full analysis with
 *     the lowest firing supply, the flags and the tolerance bands (target < 300 ms);
 *   - the 200-part mains circuit's full analysis (target < 500 ms);
 *   - every demo record's whole analysis as the worker runs it (target < 1 s each);
 * each next to the same figure of the engine as it stood before the single solver core
 * (commit LEGACY_COMMIT), measured in the same run and printed as a ratio (previous / now).
 * The previous engine is unpacked from git into tests/bench/.legacy-engine/ (ignored by git)
 * on first use. A case stops early, with fewer runs (printed), once its runs pass
 * CASE_TIME_CAP_MS, so one slow case cannot hold the bench for many minutes.
 * A measurement, not a test: it prints figures and fails only when something breaks.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import type { Part, TeardownRecord } from "@teardown/engine";
import * as current from "@teardown/engine";
import { readDemoRecord, RECORDS_DIR } from "../../seed-demo/demo-records.js";
import { part, record } from "../support/record-factory.js";

/** The engine before issue 14's single solver core. */
const LEGACY_COMMIT = "141e63a81d63b650e587832161c9d2bbbe6d53d3";
const RUNS = Math.max(1, Number(process.env.BENCH_RUNS ?? 10));
const CASE_TIME_CAP_MS = Number(process.env.BENCH_CASE_CAP_MS ?? 60_000);
const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..", "..");
const LEGACY_DIR = path.join(ROOT, "tests", "bench", ".legacy-engine", LEGACY_COMMIT.slice(0, 12));

/** The calls the bench makes, the same in both engines. */
type Engine = Pick<
  typeof current,
  "solveCircuit" | "analyzeCircuit" | "assessRisks" | "analyzeStoredRecord"
>;

/** The previous engine, unpacked from git on first use. */
async function legacyEngine(): Promise<Engine> {
  const entry = path.join(LEGACY_DIR, "analysis-worker", "engine", "src", "index.ts");
  if (!existsSync(entry)) {
    mkdirSync(LEGACY_DIR, { recursive: true });
    const tar = execFileSync("git", ["archive", LEGACY_COMMIT, "analysis-worker/engine/src"], {
      cwd: ROOT,
      maxBuffer: 64 * 1024 * 1024,
    });
    execFileSync("tar", ["-x", "-C", LEGACY_DIR], { input: tar });
  }
  return (await import(pathToFileURL(entry).href)) as Engine;
}

/**
 * A mains gadget: fuse and varistor at the entry, a thyristor phase controller on a bridge
 * (load, divider gate drive), and a dropper supply (bleeder, surge resistor, second bridge,
 * storage capacitor, zener) feeding `sections` LED branches of four parts each, with two
 * measurements so the bands run.
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
  for (let s = 0; s < sections; s++)
    parts.push(
      part(`RS${s}`, "resistor", ["Q", `S${s}`], 4_700 + 100 * s),
      part(`LED${s}`, "led", { anode: `S${s}`, cathode: `T${s}` }),
      part(`RT${s}`, "resistor", [`T${s}`, "R"], 100),
      part(`CS${s}`, "capacitor", [`S${s}`, "R"], 100e-9),
    );
  const rec = record(parts);
  const supply = rec.device.rated_supply;
  return {
    ...rec,
    measurements: [
      {
        what: "input.current_rms",
        value: 0.05,
        between: null,
        part: null,
        supply,
        instrument: null,
        uncertainty: { relative: 0.03 },
      },
      {
        what: "voltage.dc",
        between: ["Q", "R"],
        value: 23.5,
        part: null,
        supply,
        instrument: null,
        uncertainty: { absolute: 0.3 },
      },
    ],
  };
}

const now = () => performance.now();

/** Median ms of up to RUNS calls (fewer past the case's time cap), or the failure. */
async function median(fn: () => Promise<string | null> | string | null): Promise<string> {
  const times: number[] = [];
  let spent = 0;
  while (times.length < RUNS && (times.length === 0 || spent < CASE_TIME_CAP_MS)) {
    const t0 = now();
    const failed = await fn();
    const ms = now() - t0;
    if (failed !== null) return `failed: ${failed}`;
    times.push(ms);
    spent += ms;
  }
  const s = [...times].sort((a, b) => a - b);
  const m = s[Math.floor(s.length / 2)]!;
  return `${m.toFixed(1)} ms${times.length < RUNS ? ` (${times.length} runs)` : ""}`;
}

const ms = (s: string) => (s.endsWith(" ms") || s.includes(" ms (") ? parseFloat(s) : NaN);

function line(label: string, target: string, now_: string, before: string): void {
  const ratio = ms(before) / ms(now_);
  process.stdout.write(
    `${label.padEnd(44)} now ${now_.padEnd(22)} before ${before.padEnd(22)} ` +
      `before/now ${Number.isFinite(ratio) ? ratio.toFixed(2) : "n/a"}  (target ${target})\n`,
  );
}

function solveOnly(e: Engine, rec: TeardownRecord): string | null {
  const r = e.solveCircuit(rec, { now, budgetMs: 120_000 });
  return r.ok ? null : r.error.code;
}

function withFlagsAndBands(e: Engine, rec: TeardownRecord): string | null {
  const a = e.analyzeCircuit(rec, { now, budgetMs: 120_000 });
  if (!a.ok) return a.error.code;
  e.assessRisks(rec, a.value, { now, budgetMs: 120_000 });
  return null;
}

async function wholeAnalysis(e: Engine, doc: unknown): Promise<string | null> {
  const out = await e.analyzeStoredRecord(doc, { now });
  return out.ok ? null : out.code;
}

const legacy = await legacyEngine();
process.stdout.write(
  `engine speed, medians of ${RUNS} runs; before = commit ${LEGACY_COMMIT.slice(0, 7)}\n`,
);
const small = mainsCircuit(3);
const large = mainsCircuit(46);
line(
  `${small.parts.length}-part solve`,
  "< 50 ms",
  await median(() => solveOnly(current, small)),
  await median(() => solveOnly(legacy, small)),
);
line(
  `${small.parts.length}-part with flags and bands`,
  "< 300 ms",
  await median(() => withFlagsAndBands(current, small)),
  await median(() => withFlagsAndBands(legacy, small)),
);
line(
  `${large.parts.length}-part with flags and bands`,
  "< 500 ms",
  await median(() => withFlagsAndBands(current, large)),
  await median(() => withFlagsAndBands(legacy, large)),
);
for (const file of readdirSync(RECORDS_DIR)
  .filter((f) => f.endsWith(".yaml"))
  .sort()) {
  const doc = readDemoRecord(file);
  line(
    `demo ${file.replace(/\.yaml$/, "")}`,
    "< 1 s",
    await median(() => wholeAnalysis(current, doc)),
    await median(() => wholeAnalysis(legacy, doc)),
  );
}
