/**
 * Evidence as labelled quantities ("time constant: 2.2 s"): a label in words, a value and its
 * unit. Values are SI numbers in the unit named ("V", "A", "s", "F", "Ω"), except spacings in
 * "mm", shares in "%", angles in "°" and concentrations in "ppm", the units the trade reads them
 * in; words are given with the unit "".
 */
import type { Evidence } from "../record/gaps-and-assumptions.js";

/** One evidence entry; a non-finite number (no decay, no limit) becomes null, shown as unknown. */
export function ev(label: string, value: number | string | null, unit = ""): Evidence {
  return {
    label,
    value: typeof value === "number" && !Number.isFinite(value) ? null : value,
    unit,
  };
}

/** A yes/no fact as evidence. */
export function evYes(label: string, yes: boolean): Evidence {
  return { label, value: yes ? "yes" : "no", unit: "" };
}

/** A share (0.92) as a percentage evidence entry (92 %). */
export function evPercent(label: string, fraction: number): Evidence {
  return ev(label, 100 * fraction, "%");
}

/** The value of the evidence entry with this label (undefined when the flag has none). */
export function evidenceValue(
  flag: { evidence: readonly Evidence[] },
  label: string,
): number | string | null | undefined {
  return flag.evidence.find((e) => e.label === label)?.value;
}
