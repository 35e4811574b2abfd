// `npm run analyze -- FILE --supply 120/60 [--set REF=VALUE]...`: a what-if from the command line.
// A bad --set names itself and exits 1; the fan speed control at 120 V / 60 Hz prints that its
// triac does not fire and the suggested gate-feed value, which fires when given with --set.
import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const ROOT = projectRoot();
const FAN = "seed-demo/records/whirlby-fan-speed-control.yaml";

function analyze(...args: string[]) {
  const r = spawnSync(
    process.execPath,
    ["--import", "tsx", path.join(ROOT, "analysis-worker/src/analyze-cli.ts"), ...args],
    { cwd: ROOT, encoding: "utf8", timeout: 120_000 },
  );
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("npm run analyze what-ifs", () => {
  it("names a --set of an unknown part or an unreadable value and exits 1", () => {
    const r = analyze(FAN, "--set", "R9=1k", "--set", "VR1=lots");
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("--set R9=1k: no part R9");
    expect(r.stderr).toContain("--set VR1=lots:");
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it("refuses a --set without REF=VALUE", () => {
    const r = analyze(FAN, "--set", "VR1");
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("--set wants REF=VALUE");
  });

  it("prints the suggestion at 120/60, and the suggested value fires when set", () => {
    const r = analyze(FAN, "--supply", "120/60");
    expect(r.code, r.stderr).toBe(0);
    const m =
      /Q1: fires at the rated supply \(at [\d.]+°\) but not at this one; suggestion: (VR1) = ([\d.]+ kΩ) \(E24\), firing at ([\d.]+)°/.exec(
        r.stdout,
      );
    expect(m, r.stdout).not.toBeNull();
    const value = m![2]!.replace(" kΩ", "k");
    const set = analyze(FAN, "--supply", "120/60", "--set", `VR1=${value}`, "--json");
    expect(set.code, set.stderr).toBe(0);
    const result = JSON.parse(set.stdout) as {
      triggers: Array<{ part: string; fires: boolean; suggestion?: unknown }>;
    };
    const q1 = result.triggers.find((t) => t.part === "Q1")!;
    expect(q1.fires).toBe(true);
    expect(q1.suggestion).toBeUndefined();
  });
});
