/** A measurement kind and where it was taken, in words ("line current (RMS)", "peak voltage A to N"). */
import { strings, str, type Obj } from "./result-access";

const KIND_WORDS: Readonly<Record<string, string>> = {
  "input.current_rms": "line current (RMS)",
  "input.power": "real input power",
  "input.apparent_power": "apparent input power",
  "input.power_factor": "power factor",
  "voltage.dc": "DC voltage",
  "voltage.rms": "RMS voltage",
  "voltage.peak": "peak voltage",
  "part.current_rms": "RMS current",
  "part.power": "dissipation",
};

/** The measurement's name for people, with its nets or part. */
export function measurementName(what: string, m: Obj): string {
  const kind = KIND_WORDS[what] ?? what;
  const between = strings(m.between);
  if (between.length === 2) return `${kind} ${between[0]} to ${between[1]}`;
  const part = str(m.part);
  return part ? `${kind} of ${part}` : kind;
}
