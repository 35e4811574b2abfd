/** Plain aligned text tables for the command line. */

/** Renders rows under a header, each column padded to its widest cell. */
export function textTable(header: string[], rows: Array<Array<string | number | null>>): string {
  const cells = [header, ...rows.map((r) => r.map((c) => (c === null ? "—" : String(c))))];
  const widths = header.map((_, i) => Math.max(...cells.map((r) => (r[i] ?? "").length)));
  const line = (r: string[]) =>
    r
      .map((c, i) => c.padEnd(widths[i]!))
      .join("  ")
      .trimEnd();
  return [
    line(cells[0]!),
    widths.map((w) => "-".repeat(w)).join("  "),
    ...cells.slice(1).map(line),
  ].join("\n");
}

/** A number in engineering notation with a unit, for tables (`24.1 mA`). */
export function eng(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return `0 ${unit}`;
  const prefixes: Array<[number, string]> = [
    [1e9, "G"],
    [1e6, "M"],
    [1e3, "k"],
    [1, ""],
    [1e-3, "m"],
    [1e-6, "µ"],
    [1e-9, "n"],
    [1e-12, "p"],
  ];
  const abs = Math.abs(value);
  const [scale, prefix] = prefixes.find(([s]) => abs >= s) ?? prefixes[prefixes.length - 1]!;
  return `${Number((value / scale).toPrecision(digits))} ${prefix}${unit}`;
}
