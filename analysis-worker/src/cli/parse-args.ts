/** The analyze command's arguments: FILE [--json] [--layout] [--supply V/HZ] [--set REF=VALUE]... */
import type { PartChange, Supply } from "@teardown/engine";

export interface AnalyzeArgs {
  file: string;
  json: boolean;
  /** Print the schematic layout (the SchematicLayout JSON the app draws) instead of the report. */
  layout: boolean;
  supply: Supply | null;
  /** `--set REF=VALUE`, in the order given: a what-if with these part values. */
  changes: PartChange[];
}

export type ArgsResult = { ok: true; args: AnalyzeArgs } | { ok: false; message: string };

export const USAGE =
  "usage: npm run analyze -- FILE [--json] [--layout] [--supply VRMS/HZ] [--set REF=VALUE]...   (FILE: a record .yaml/.json, a netlist deck, or a .csv parts list)";

/** Reads argv (without node and script); a bad argument is a message, not an exception. */
export function parseAnalyzeArgs(argv: string[]): ArgsResult {
  let file: string | null = null;
  let json = false;
  let layout = false;
  let supply: Supply | null = null;
  const changes: PartChange[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--json") json = true;
    else if (a === "--layout") layout = true;
    else if (a === "--supply" || a.startsWith("--supply=")) {
      const v = a.includes("=") ? a.slice(a.indexOf("=") + 1) : argv[++i];
      const m = /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(v ?? "");
      if (!m)
        return { ok: false, message: `--supply wants VRMS/HZ such as 120/60, got "${v ?? ""}"` };
      supply = { vrms: Number(m[1]), hz: Number(m[2]) };
      if (supply.vrms <= 0 || supply.hz <= 0)
        return { ok: false, message: "--supply values must be positive" };
    } else if (a === "--set" || a.startsWith("--set=")) {
      const v = a.includes("=") && a.startsWith("--set=") ? a.slice("--set=".length) : argv[++i];
      const m = /^([^=\s]+)=(.+)$/.exec(v ?? "");
      if (!m)
        return { ok: false, message: `--set wants REF=VALUE such as R1=22k, got "${v ?? ""}"` };
      changes.push({ part: m[1]!, value: m[2]! });
    } else if (a === "-h" || a === "--help") return { ok: false, message: USAGE };
    else if (a.startsWith("-")) return { ok: false, message: `unknown option ${a}\n${USAGE}` };
    else if (file === null) file = a;
    else return { ok: false, message: `one FILE only (got "${file}" and "${a}")\n${USAGE}` };
  }
  if (!file) return { ok: false, message: USAGE };
  return { ok: true, args: { file, json, layout, supply, changes } };
}
