/**
 * `npm run analyze -- FILE [--json] [--layout] [--supply 120/60] [--set REF=VALUE]...`: the
 * engine on one file, no database. `--layout` prints the schematic layout JSON (what the app
 * draws) instead. `--supply` or `--set` make it a what-if: the record with those part values at
 * that supply, with a gate-feed suggestion for a thyristor or triac that stops firing.
 * Exit 0 on success; 1 on invalid input, with every error (file:line:column path: message) on
 * stderr and never a stack trace.
 */
import { readFileSync } from "node:fs";
import {
  analyzeRecord,
  analyzeWhatIf,
  readCircuitFile,
  type AnalysisResult,
} from "@teardown/engine";
import { parseAnalyzeArgs } from "./cli/parse-args.js";
import { readableReport } from "./cli/readable-report.js";

function fail(lines: string[]): never {
  process.stderr.write(lines.join("\n") + "\n");
  process.exit(1);
}

async function main(): Promise<void> {
  const parsedArgs = parseAnalyzeArgs(process.argv.slice(2));
  if (!parsedArgs.ok) fail([parsedArgs.message]);
  const { file, json, layout, supply, changes } = parsedArgs.args;
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (err) {
    fail([`${file}: cannot read the file (${(err as NodeJS.ErrnoException).code ?? String(err)})`]);
  }
  const parsed = readCircuitFile(text, { filename: file });
  if (!parsed.ok)
    fail([
      `${file}: ${parsed.errors.length} error(s)`,
      ...parsed.errors.map(
        (e) => `${file}:${e.line ?? "?"}:${e.column ?? "?"} ${e.path || "(file)"}: ${e.message}`,
      ),
    ]);
  for (const w of parsed.warnings)
    process.stderr.write(
      `${file}:${w.line ?? "?"}:${w.column ?? "?"} warning ${w.path || "(file)"}: ${w.message}\n`,
    );
  let result: AnalysisResult;
  if (!layout && (supply !== null || changes.length > 0)) {
    const whatIf = await analyzeWhatIf(
      parsed.record,
      { ...(supply ? { supply } : {}), changes },
      { now: () => performance.now() },
    );
    if (!whatIf.ok && whatIf.kind === "input")
      fail(whatIf.errors.map((e) => `${file}: what-if ${cliPlace(e.path, changes)}: ${e.message}`));
    if (!whatIf.ok)
      fail([`${file}: the what-if failed at the ${whatIf.stage} stage: ${whatIf.message}`]);
    result = whatIf.result;
  } else {
    const outcome = await analyzeRecord(parsed.record, { now: () => performance.now() });
    if (!outcome.ok)
      fail([`${file}: the analysis failed at the ${outcome.stage} stage: ${outcome.message}`]);
    if (layout) {
      process.stdout.write(JSON.stringify(outcome.output.layout, null, 2) + "\n");
      return;
    }
    result = outcome.output.result;
  }
  process.stdout.write(
    json ? JSON.stringify(result, null, 2) + "\n" : readableReport(parsed.record, result) + "\n",
  );
}

/** A what-if problem's place as the command line wrote it: `changes[1].value` is the second --set. */
function cliPlace(path: string, changes: ReadonlyArray<{ part: string; value: unknown }>): string {
  const m = /^changes\[(\d+)\]/.exec(path);
  if (m) {
    const c = changes[Number(m[1])];
    return c ? `--set ${c.part}=${String(c.value)}` : "--set";
  }
  return path.startsWith("supply") ? "--supply" : path;
}

main().catch((err: unknown) => {
  // A bug, not bad input: still one line for the user, the detail for a bug report.
  process.stderr.write(
    `analyze: internal error: ${err instanceof Error ? err.message : String(err)}\n`,
  );
  process.exit(2);
});
