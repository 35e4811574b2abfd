/**
 * IEC 60664-1 (Ed. 2, 2007) spacing tables, read in reproductions of the published tables:
 * Table F.4 creepage (checked against the document, Wago catalogue reproduction), Table F.1 rated impulse voltage by
 * line-to-neutral voltage (checked against the document, Recom page; values match F.1 from memory) and Table F.2 Case A
 * clearance (checked against the document for 1.5/2.5/4/6 kV; 8 kV FOUND as the reinforced step of 6 kV; smaller rows
 * MEMORY). Reinforced insulation: twice the basic creepage (from memory for 60664-1, FOUND as a
 * general statement) and the clearance of the next higher impulse (checked against the document, TI AMC1411-Q1).
 */

export type MaterialGroup = "I" | "II" | "IIIa" | "IIIb";
export type PollutionDegree = 1 | 2 | 3;

/** One row of Table F.4: RMS working voltage and the creepage (mm) per column. */
interface CreepageRow {
  vrms: number;
  pwbPd1: number;
  pwbPd2: number;
  pd1: number;
  pd2: [number, number, number];
  pd3: [number, number, number];
}

/** Table F.4 rows 125 V to 400 V (checked against the document, complete). */
export const CREEPAGE_TABLE_F4: readonly CreepageRow[] = [
  {
    vrms: 125,
    pwbPd1: 0.16,
    pwbPd2: 0.25,
    pd1: 0.28,
    pd2: [0.75, 1.05, 1.5],
    pd3: [1.9, 2.1, 2.4],
  },
  { vrms: 160, pwbPd1: 0.25, pwbPd2: 0.4, pd1: 0.32, pd2: [0.8, 1.1, 1.6], pd3: [2.0, 2.2, 2.5] },
  { vrms: 200, pwbPd1: 0.4, pwbPd2: 0.63, pd1: 0.42, pd2: [1.0, 1.4, 2.0], pd3: [2.5, 2.8, 3.2] },
  { vrms: 250, pwbPd1: 0.56, pwbPd2: 1.0, pd1: 0.56, pd2: [1.25, 1.8, 2.5], pd3: [3.2, 3.6, 4.0] },
  { vrms: 320, pwbPd1: 0.75, pwbPd2: 1.6, pd1: 0.75, pd2: [1.6, 2.2, 3.2], pd3: [4.0, 4.5, 5.0] },
  { vrms: 400, pwbPd1: 1.0, pwbPd2: 2.0, pd1: 1.0, pd2: [2.0, 2.8, 4.0], pd3: [5.0, 5.6, 6.3] },
];

/** Table F.1: rated impulse (V peak) for overvoltage category II by line-to-neutral voltage (checked against the document). */
export const IMPULSE_OVC_II_F1: ReadonlyArray<{ maxLineToNeutralV: number; impulseV: number }> = [
  { maxLineToNeutralV: 150, impulseV: 1500 },
  { maxLineToNeutralV: 300, impulseV: 2500 },
  { maxLineToNeutralV: 600, impulseV: 4000 },
  { maxLineToNeutralV: 1000, impulseV: 6000 },
];

/** Table F.2 Case A, altitude ≤ 2000 m: clearance (mm) by rated impulse (V); the preferred impulse series. */
export const CLEARANCE_TABLE_F2: ReadonlyArray<{
  impulseV: number;
  mm: number;
  mark: "FOUND" | "MEMORY";
}> = [
  { impulseV: 330, mm: 0.01, mark: "MEMORY" },
  { impulseV: 500, mm: 0.04, mark: "MEMORY" },
  { impulseV: 800, mm: 0.1, mark: "MEMORY" },
  { impulseV: 1500, mm: 0.5, mark: "FOUND" },
  { impulseV: 2500, mm: 1.5, mark: "FOUND" },
  { impulseV: 4000, mm: 3.0, mark: "FOUND" },
  { impulseV: 6000, mm: 5.5, mark: "FOUND" },
  { impulseV: 8000, mm: 8.0, mark: "FOUND" },
];
/** Table F.2 floors: 0.2 mm in pollution degree 2 (from memory) and 0.8 mm in pollution degree 3 (checked against the document). */
export const CLEARANCE_FLOOR_MM: Record<PollutionDegree, number> = { 1: 0, 2: 0.2, 3: 0.8 };

/** The creepage requirement for a working voltage, rounded up to the next table row. */
export function creepageRequired(
  vrms: number,
  group: MaterialGroup,
  pd: PollutionDegree,
): { mm: number; row_vrms: number; column: string; beyond_table: boolean } {
  const row =
    CREEPAGE_TABLE_F4.find((r) => r.vrms >= vrms) ??
    CREEPAGE_TABLE_F4[CREEPAGE_TABLE_F4.length - 1]!;
  const beyond = vrms > row.vrms;
  // Board spacings use the printed-wiring columns where the table has them (PD1 any group,
  // PD2 any group but IIIb); otherwise the general columns.
  const g = group === "I" ? 0 : group === "II" ? 1 : 2;
  if (pd === 1)
    return {
      mm: row.pwbPd1,
      row_vrms: row.vrms,
      column: "printed wiring, pollution degree 1",
      beyond_table: beyond,
    };
  if (pd === 2 && group !== "IIIb")
    return {
      mm: row.pwbPd2,
      row_vrms: row.vrms,
      column: "printed wiring, pollution degree 2",
      beyond_table: beyond,
    };
  if (pd === 2)
    return {
      mm: row.pd2[g]!,
      row_vrms: row.vrms,
      column: `other materials, pollution degree 2, material group ${group}`,
      beyond_table: beyond,
    };
  return {
    mm: row.pd3[g]!,
    row_vrms: row.vrms,
    column: `other materials, pollution degree 3, material group ${group}`,
    beyond_table: beyond,
  };
}

/** Rated impulse (OVC II) for a supply of this line-to-neutral RMS voltage, or the top row when above it. */
export function ratedImpulseOvcII(lineToNeutralVrms: number): number {
  return (
    IMPULSE_OVC_II_F1.find((r) => lineToNeutralVrms <= r.maxLineToNeutralV) ??
    IMPULSE_OVC_II_F1[IMPULSE_OVC_II_F1.length - 1]!
  ).impulseV;
}

/** The next higher impulse in the preferred series (the reinforced step), or the same at the top. */
export function nextImpulseStep(impulseV: number): number {
  const i = CLEARANCE_TABLE_F2.findIndex((r) => r.impulseV >= impulseV);
  if (i < 0) return impulseV;
  return CLEARANCE_TABLE_F2[Math.min(i + 1, CLEARANCE_TABLE_F2.length - 1)]!.impulseV;
}

/** The clearance for an impulse (rounded up to the next row), with the pollution floor. */
export function clearanceRequired(
  impulseV: number,
  pd: PollutionDegree,
): { mm: number; row_impulse_v: number; mark: "FOUND" | "MEMORY"; beyond_table: boolean } {
  const row =
    CLEARANCE_TABLE_F2.find((r) => r.impulseV >= impulseV) ??
    CLEARANCE_TABLE_F2[CLEARANCE_TABLE_F2.length - 1]!;
  const floor = CLEARANCE_FLOOR_MM[pd];
  // Pollution degree 3 raises the 1.5 kV row to 0.8 mm (footnote, FOUND).
  return {
    mm: Math.max(row.mm, floor),
    row_impulse_v: row.impulseV,
    mark: row.mark,
    beyond_table: impulseV > row.impulseV,
  };
}
