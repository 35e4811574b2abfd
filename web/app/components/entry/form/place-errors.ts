/**
 * Putting the engine's problems beside the fields they name. A problem's path
 * (`parts[1].rating.volts`, `nets.CASE.role`) goes to the field with the longest path that
 * contains it; problems no field owns are listed above the form.
 */
import type { FormState } from "./form-state";

/** A problem as the engine or the API reports it. */
export interface PlacedProblem {
  path: string;
  message: string;
  line?: number | null;
  column?: number | null;
}

/** Problems by field path, and those no field owns. */
export interface ProblemPlaces {
  at: Map<string, PlacedProblem[]>;
  unplaced: PlacedProblem[];
}

/** True when `path` is `field` or lies inside it (`parts[1].pins` holds `parts[1].pins.gate`). */
export function pathWithin(path: string, field: string): boolean {
  if (path === field) return true;
  if (!path.startsWith(field)) return false;
  const next = path.charAt(field.length);
  return next === "." || next === "[";
}

/** The field paths the form shows for a state, so that problems can be placed. */
export function fieldPaths(f: FormState): string[] {
  const out = [
    "title",
    "summary",
    "device",
    "device.category",
    "device.rated_supply.vrms",
    "device.rated_supply.hz",
    "device.tags",
    "parts",
    "nets",
    "measurements",
    "board",
  ];
  f.parts.forEach((_, i) => {
    const p = `parts[${i}]`;
    out.push(
      p,
      `${p}.ref`,
      `${p}.kind`,
      `${p}.value`,
      `${p}.tolerance`,
      `${p}.rating`,
      `${p}.rating.volts`,
      `${p}.rating.amps`,
      `${p}.rating.watts`,
      `${p}.rating.class`,
      `${p}.rating.package`,
      `${p}.rating.surge_amps`,
      `${p}.marking`,
      `${p}.pins`,
      `${p}.model`,
      `${p}.note`,
      `${p}.polarised`,
      `${p}.closed`,
    );
  });
  for (const n of f.nets) {
    const name = n.name.trim();
    if (name === "") continue;
    out.push(`nets.${name}`, `nets.${name}.role`, `nets.${name}.accessible`, `nets.${name}.note`);
  }
  f.measurements.forEach((_, i) => {
    const m = `measurements[${i}]`;
    out.push(
      m,
      `${m}.what`,
      `${m}.value`,
      `${m}.between`,
      `${m}.part`,
      `${m}.supply`,
      `${m}.instrument`,
      `${m}.uncertainty`,
    );
  });
  f.spacings.forEach((_, i) => {
    const s = `board.spacings[${i}]`;
    out.push(
      s,
      `${s}.between`,
      `${s}.creepage_mm`,
      `${s}.clearance_mm`,
      `${s}.slot`,
      `${s}.material_group`,
      `${s}.pollution_degree`,
    );
  });
  return out;
}

/** Each problem at the innermost field containing its path. */
export function placeProblems(
  problems: readonly PlacedProblem[],
  fields: readonly string[],
): ProblemPlaces {
  const at = new Map<string, PlacedProblem[]>();
  const unplaced: PlacedProblem[] = [];
  // Section paths ("parts", "nets", "device") only catch what no finer field does; they are
  // still "placed" so the section can show them.
  for (const problem of problems) {
    let best: string | null = null;
    for (const field of fields)
      if (pathWithin(problem.path, field) && (best === null || field.length > best.length))
        best = field;
    if (best === null) unplaced.push(problem);
    else at.set(best, [...(at.get(best) ?? []), problem]);
  }
  return { at, unplaced };
}
