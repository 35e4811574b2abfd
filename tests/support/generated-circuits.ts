/**
 * Invented mains-gadget circuits of a chosen size (5 to 60 parts), grown from a seed: a fused
 * supply, then blocks the trade uses (capacitive dropper, bridge or half-wave rectifier,
 * reservoir and zener, LED strings, dividers, an RC-triggered thyristor or triac with its load,
 * a transformer with a rectified secondary) and plain filler parts between existing nets until
 * the count is reached. The same seed and size always give the same record. For layout tests and
 * the layout bench; nothing here is a real product.
 */
import type { Part, TeardownRecord } from "@teardown/engine";
import { part, record } from "./record-factory.js";

/** A small seeded generator (mulberry32), so circuits (and the load bench's think times) repeat exactly. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

class Builder {
  readonly parts: Part[] = [];
  private readonly counters = new Map<string, number>();
  private netCount = 0;
  /** Nets a later block may hang a part between: [upper, lower] pairs of a rail. */
  readonly rails: [string, string][] = [];
  readonly outputs: string[] = [];
  readonly accessible: string[] = [];
  tags: string[] = [];
  constructor(readonly rnd: () => number) {}
  net(prefix = "n"): string {
    this.netCount += 1;
    return `${prefix}${this.netCount}`;
  }
  ref(prefix: string): string {
    const n = (this.counters.get(prefix) ?? 0) + 1;
    this.counters.set(prefix, n);
    return `${prefix}${n}`;
  }
  add(kind: string, prefix: string, pins: string[] | Record<string, string>, extra = {}): void {
    this.parts.push(part(this.ref(prefix), kind, pins, null, extra));
  }
  pick<T>(list: readonly T[]): T {
    return list[Math.floor(this.rnd() * list.length)]!;
  }
}

const VALUES = ["100", "1k", "4k7", "10k", "47k", "100k", "1M"];

/** Dropper into a bridge (or a half-wave diode), reservoir, zener: a low-voltage DC rail. */
function dropperSupply(b: Builder, line: string): void {
  const a = b.net("A");
  b.add("capacitor", "C", [line, a], { value_text: "330n" });
  b.add("resistor", "R", [line, a], { value_text: "1M" });
  const ac = b.net("B");
  b.add("resistor", "R", [a, ac], { value_text: "100" });
  const plus = b.net("P");
  const minus = b.rnd() < 0.5 ? "N" : b.net("M");
  if (minus === "N") {
    b.add("diode", "D", { anode: ac, cathode: plus });
  } else {
    b.add("diode", "D", { anode: ac, cathode: plus });
    b.add("diode", "D", { anode: "N", cathode: plus });
    b.add("diode", "D", { anode: minus, cathode: ac });
    b.add("diode", "D", { anode: minus, cathode: "N" });
  }
  b.add("capacitor", "C", { plus, minus }, { polarised: true, value_text: "47u" });
  b.add("zener", "Z", { anode: minus, cathode: plus }, { value_text: "12V" });
  b.rails.push([plus, minus]);
}

/** A string of LEDs with its series resistor across a rail. */
function ledString(b: Builder, [top, bottom]: [string, string]): void {
  let at = b.net("K");
  b.add("resistor", "R", [top, at], { value_text: b.pick(VALUES) });
  const count = 1 + Math.floor(b.rnd() * 3);
  for (let i = 0; i < count; i++) {
    const next = i === count - 1 ? bottom : b.net("K");
    b.add("led", "LED", { anode: at, cathode: next });
    at = next;
  }
}

/** Two resistors from a rail to its return, the tap becoming a new rail for later blocks. */
function divider(b: Builder, [top, bottom]: [string, string]): void {
  const tap = b.net("V");
  b.add("resistor", "R", [top, tap], { value_text: b.pick(VALUES) });
  b.add("resistor", "R", [tap, bottom], { value_text: b.pick(VALUES) });
  if (b.rnd() < 0.4) b.add("capacitor", "C", [tap, bottom], { value_text: "100n" });
  b.rails.push([tap, bottom]);
  if (b.rnd() < 0.3) b.outputs.push(tap);
}

/** An RC gate network next to a thyristor or triac switching a load from the line. */
function phaseControl(b: Builder, line: string): void {
  const x = b.net("X");
  b.add("load", "LD", [line, x], { value_text: "60W" });
  const y = b.net("Y");
  b.add("resistor", "R", [x, y], { value_text: "220k" });
  b.add("capacitor", "C", [y, "N"], { value_text: "100n" });
  const g = b.net("G");
  b.add("resistor", "R", [y, g], { value_text: "1k" });
  if (b.rnd() < 0.5) b.add("triac", "Q", { mt2: x, mt1: "N", gate: g });
  else b.add("thyristor", "Q", { anode: x, gate: g, cathode: "N" });
}

/** A transformer with a rectified, smoothed secondary; isolated unless tied to neutral. */
function transformerSupply(b: Builder, line: string): void {
  const s1 = b.net("S");
  const s2 = b.net("S");
  b.add("transformer", "T", { p1: line, p2: "N", s1, s2 });
  const plus = b.net("V");
  const minus = b.net("G");
  b.add("diode", "D", { anode: s1, cathode: plus });
  b.add("diode", "D", { anode: s2, cathode: plus });
  b.add("diode", "D", { anode: minus, cathode: s1 });
  b.add("diode", "D", { anode: minus, cathode: s2 });
  b.add("capacitor", "C", { plus, minus }, { polarised: true, value_text: "470u" });
  b.rails.push([plus, minus]);
  b.outputs.push(plus);
  b.accessible.push(minus);
  b.tags = ["isolated"];
}

/** One plain part between two nets a drawing already has. */
function filler(b: Builder): void {
  const [top, bottom] = b.pick(b.rails);
  const kind = b.pick(["resistor", "capacitor", "resistor", "diode"]);
  if (kind === "diode") b.add("diode", "D", { anode: bottom, cathode: top });
  else if (b.rnd() < 0.5) b.add(kind, kind === "resistor" ? "R" : "C", [top, bottom]);
  else {
    const mid = b.net("W");
    b.add(kind, kind === "resistor" ? "R" : "C", [top, mid], { value_text: b.pick(VALUES) });
    b.add("resistor", "R", [mid, bottom], { value_text: b.pick(VALUES) });
    b.rails.push([mid, bottom]);
  }
}

/** A circuit of exactly `parts` parts (5..60), grown from `seed`. */
export function generatedCircuit(parts: number, seed: number): TeardownRecord {
  if (parts < 5 || parts > 60) throw new Error(`parts must be 5..60, got ${parts}`);
  const b = new Builder(seeded(seed * 7919 + parts));
  b.add("fuse", "F", ["L", "L1"], { value_text: "0.5" });
  b.rails.push(["L1", "N"]);
  if (parts >= 12 && b.rnd() < 0.3) b.add("varistor", "RV", ["L1", "N"], { value_text: "275" });
  const blocks: ((b: Builder) => void)[] = [];
  if (parts >= 12) blocks.push((x) => (x.rnd() < 0.3 ? transformerSupply : dropperSupply)(x, "L1"));
  if (parts >= 20) blocks.push((x) => phaseControl(x, "L1"));
  for (const block of blocks) if (b.parts.length + 8 <= parts) block(b);
  while (b.parts.length < parts) {
    const room = parts - b.parts.length;
    const rail = b.pick(b.rails);
    const r = b.rnd();
    if (room >= 4 && r < 0.3 && rail[0] !== "L1") ledString(b, rail);
    else if (room >= 3 && r < 0.55) divider(b, rail);
    else filler(b);
  }
  b.parts.length = parts;
  const used = new Set(b.parts.flatMap((p) => Object.values(p.pins)));
  const nets: Record<string, { role?: "output"; accessible?: boolean }> = {};
  for (const n of b.outputs) if (used.has(n) && n !== "N") nets[n] = { role: "output" };
  for (const n of b.accessible) if (used.has(n)) nets[n] = { ...nets[n], accessible: true };
  const rec = record(b.parts, nets, { title: `generated ${parts}-part circuit #${seed}` });
  rec.device.tags = b.tags;
  return rec;
}

/** The generated set the tests and bench walk: sizes 5..60, a few seeds each. */
export function generatedCircuitSet(): { name: string; record: TeardownRecord }[] {
  const out: { name: string; record: TeardownRecord }[] = [];
  for (const size of [5, 8, 12, 16, 20, 25, 30, 40, 50, 60])
    for (const seed of [1, 2, 3])
      out.push({ name: `generated ${size} parts #${seed}`, record: generatedCircuit(size, seed) });
  return out;
}
