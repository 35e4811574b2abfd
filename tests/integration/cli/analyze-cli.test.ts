// `npm run analyze`: a malformed file exits 1 with every error's path and line on stderr and no
// stack trace; a good file prints its parts, blocks and checks, or the result as JSON.
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const ROOT = projectRoot();
const dir = mkdtempSync(path.join(os.tmpdir(), "tl-analyze-"));

function analyze(...args: string[]) {
  const r = spawnSync(
    process.execPath,
    ["--import", "tsx", path.join(ROOT, "analysis-worker/src/analyze-cli.ts"), ...args],
    { cwd: ROOT, encoding: "utf8", timeout: 120_000 },
  );
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("npm run analyze", () => {
  it("exits 1 on a malformed record with every error's path and line", () => {
    const file = path.join(dir, "bad.yaml");
    writeFileSync(
      file,
      [
        "record: 1",
        "title: Broken",
        "parts:",
        "  - ref: C1",
        "    kind: capacitor",
        "    value: 33x",
        "    pins: [L, A]",
        "  - ref: R1",
        "    kind: resistor",
        "    value: 1M",
        "    pins: { gate: L, b: A }",
        "nets:",
        "  L: { role: line }",
        "",
      ].join("\n"),
    );
    const r = analyze(file);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain(`${file}:6:12 parts[0].value:`);
    expect(r.stderr).toContain(`${file}:11:19 parts[1].pins.gate:`);
    expect(r.stderr).toMatch(/parts\[1\]\.pins: pin "a"/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it("exits 1 with line numbers on a malformed netlist deck", () => {
    const file = path.join(dir, "bad.cir");
    writeFileSync(
      file,
      ["Broken deck", ".line L", ".neutral N", "R1 L A 1M", "C1 A N 33q", "R2 A", ".end", ""].join(
        "\n",
      ),
    );
    const r = analyze(file);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(new RegExp(`${file.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}:5:`));
    expect(r.stderr).toMatch(new RegExp(`${file.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}:6:`));
  });

  it("names a file it cannot read", () => {
    const r = analyze(path.join(dir, "missing.yaml"));
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toBe(
      `${path.join(dir, "missing.yaml")}: cannot read the file (ENOENT)`,
    );
  });

  it("prints parts, series, blocks and checks for a good record", () => {
    const r = analyze("seed-demo/records/glowmoth-night-light.yaml");
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/C1\s+capacitor\s+330 nF\s+E6/);
    expect(r.stdout).toMatch(/bridge-rectifier\s+D1, D2, D3, D4/);
    expect(r.stdout).toMatch(/capacitive-dropper\s+C1, R1, R2/);
    expect(r.stdout).toContain("Checks");
  });

  it("prints the result fields as JSON with --json, at the supply --supply names", () => {
    const r = analyze(
      "seed-demo/records/glowmoth-night-light.yaml",
      "--json",
      "--supply",
      "120/60",
    );
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout) as {
      engine: string;
      supply: { vrms: number; hz: number };
      blocks: Array<{ kind: string }>;
    };
    expect(result.supply).toEqual({ vrms: 120, hz: 60 });
    expect(result.blocks.map((b) => b.kind)).toContain("bridge-rectifier");
  });

  it("prints status, gaps and assumptions with --json, and starts the report with the state", () => {
    const file = path.join(dir, "partial.yaml");
    writeFileSync(
      file,
      [
        "record: 1",
        "title: Partial heater",
        "parts:",
        "  - { ref: R1, kind: resistor, value: 23k, pins: [L, N] }",
        "  - { ref: HT1, kind: load, pins: [L, A] }",
        "  - { ref: U1, kind: widget, pins: { a: A, b: N } }",
        "nets:",
        "  L: { role: line }",
        "  N: { role: neutral }",
        "",
      ].join("\n"),
    );
    const r = analyze(file, "--json");
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout) as {
      status: string;
      gaps: Array<{ part?: string; net?: string; reason: string }>;
      assumptions: unknown[];
      input: { current_rms: number };
    };
    expect(result.status).toBe("partial");
    expect(result.gaps.map((g) => g.part ?? g.net)).toEqual(["HT1", "U1", "A"]);
    expect(Array.isArray(result.assumptions)).toBe(true);
    // Only R1 is simulated: 230 V / 23 kΩ = 10 mA by Ohm's law.
    expect(result.input.current_rms).toBeCloseTo(0.01, 5);
    // The reader's warning about the unknown kind names its line.
    expect(r.stderr).toMatch(/partial\.yaml:6:\d+ warning parts\[2\]\.kind/);
    const readable = analyze(file);
    expect(readable.stdout.split("\n")[1]).toBe(
      'analysis partial: 2 parts and 1 net left out (HT1: load without a resistance or capacitance (model.r or model.c); U1: unknown kind "widget"; net A: no simulated part reaches it, so it has no figures)',
    );
  });

  it("refuses a malformed --supply", () => {
    const r = analyze("seed-demo/records/glowmoth-night-light.yaml", "--supply", "120V");
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("--supply wants VRMS/HZ");
  });
});
