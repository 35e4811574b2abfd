/**
 * Reading the stored analysis result defensively: the result grows with the engine, so every
 * field may be missing, null or of an older shape; these helpers never throw.
 */

export type Obj = Record<string, unknown>;

/** An object, or an empty one. */
export function obj(x: unknown): Obj {
  return x !== null && typeof x === "object" && !Array.isArray(x) ? (x as Obj) : {};
}

/** An array, or an empty one. */
export function arr(x: unknown): unknown[] {
  return Array.isArray(x) ? x : [];
}

/** A string, or null. */
export function str(x: unknown): string | null {
  return typeof x === "string" ? x : null;
}

/** A list of strings (anything else dropped). */
export function strings(x: unknown): string[] {
  return arr(x).filter((s): s is string => typeof s === "string");
}

/** True when the result has the field at all (so "not computed" can be told from "none"). */
export function has(o: Obj, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(o, key) && o[key] !== null && o[key] !== undefined;
}

/** The unit of a measurement kind (`input.power` is W). */
export function measurementUnit(what: string): string {
  if (what === "input.power_factor") return "";
  if (what === "input.apparent_power") return "VA";
  if (what.endsWith("power")) return "W";
  if (what.includes("current")) return "A";
  if (what.startsWith("voltage.")) return "V";
  return "";
}
