/**
 * The stored waveform series (`supply.voltage`, `input.current`, `net.A`, `C1.current`) named in
 * plain words for people ("supply voltage", "line current", "voltage at net A", "current in
 * C1"), with the unit each is plotted in.
 */

/** The unit a series is in: currents in A, powers in W, the rest (voltages) in V. */
export function seriesUnit(name: string): "V" | "A" | "W" {
  if (/power$/i.test(name)) return "W";
  if (/current$/i.test(name)) return "A";
  return "V";
}

/** The plain name of a series. */
export function seriesLabel(name: string): string {
  if (name === "supply.voltage") return "supply voltage";
  if (name === "input.current") return "line current";
  if (name.startsWith("net.")) return `voltage at net ${name.slice(4)}`;
  const dot = name.lastIndexOf(".");
  if (dot > 0) {
    const owner = name.slice(0, dot);
    const what = name.slice(dot + 1);
    if (what === "current") return `current in ${owner}`;
    if (what === "voltage") return `voltage across ${owner}`;
    if (what === "power") return `power in ${owner}`;
  }
  return name;
}

/** How many mains cycles a window of samples spans (the last sample closes the window). */
export function cyclesSpanned(t: readonly number[], hz: number): number | null {
  if (t.length < 2 || !(hz > 0)) return null;
  const dt = (t[t.length - 1]! - t[0]!) / (t.length - 1);
  const span = t[t.length - 1]! - t[0]! + dt;
  return Math.round(span * hz * 10) / 10;
}

/**
 * The instants a thyristor or triac fires inside the window: its angles are counted from the
 * supply's rising zero crossing (positive half) and from the falling one (negative half).
 */
export function firingInstants(
  t: readonly number[],
  supply: readonly number[],
  hz: number,
  angleDeg: number | null,
  negativeDeg: number | null,
): number[] {
  if (t.length < 2 || !(hz > 0)) return [];
  const period = 1 / hz;
  let rising: number | null = null;
  for (let i = 1; i < Math.min(t.length, supply.length); i++) {
    if (supply[i - 1]! <= 0 && supply[i]! > 0) {
      const frac = -supply[i - 1]! / (supply[i]! - supply[i - 1]!);
      rising = t[i - 1]! + frac * (t[i]! - t[i - 1]!);
      break;
    }
  }
  if (rising === null) rising = t[0]!;
  const t0 = t[0]!;
  const t1 = t[t.length - 1]!;
  const offsets: number[] = [];
  if (angleDeg !== null) offsets.push((angleDeg / 360) * period);
  if (negativeDeg !== null) offsets.push(period / 2 + (negativeDeg / 360) * period);
  const out: number[] = [];
  for (const off of offsets) {
    let at = rising + off;
    while (at - period >= t0) at -= period;
    for (; at <= t1; at += period) if (at >= t0) out.push(at);
  }
  return out.sort((a, b) => a - b);
}
