/**
 * A seeded generator of plausible mains gadgets for the search benchmark, built from the block
 * patterns the demo's boards use: a fuse or fusible resistor and a varistor at the inlet; a
 * capacitive dropper with its bleeder, a resistive dropper, or a thyristor/triac control; a bridge
 * or half-wave rectifier; a reservoir capacitor, a zener shunt, a bleeder; and an output (an LED
 * string, a heater, a relay coil with its flyback diode, a fan motor). Values are drawn from the
 * E12 series over plausible decades, refs are numbered per kind, and sizes run 5 to 60 parts.
 * Titles, categories and summaries come from invented word lists (no real brands or products).
 */
import { mulberry32, type TeardownRecord } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

/**
 * Bump whenever a change here changes what the generator produces: the bench keeps its loaded
 * databases under a name carrying this number and reuses them while it is unchanged.
 */
export const GENERATOR_VERSION = 1;

type Rand = () => number;
type Pins = string[] | Record<string, string>;
interface RawPart {
  ref: string;
  kind: string;
  value?: number;
  polarised?: boolean;
  marking?: string;
  pins: Pins;
}

const E12 = [1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];

const CATEGORIES = [
  "night light",
  "led lamp",
  "timer socket",
  "heater control",
  "battery charger",
  "door chime",
  "fan control",
  "lamp dimmer",
  "insect zapper",
  "fragrance warmer",
  "clock supply",
  "mat heater",
];
const SYLLABLES = [
  "bri",
  "qui",
  "fen",
  "mar",
  "tan",
  "or",
  "peb",
  "sor",
  "van",
  "cob",
  "lu",
  "zel",
  "dra",
  "mo",
  "kin",
  "vel",
  "tor",
  "ash",
  "wim",
  "gry",
];

/** An invented word from two or three syllables, the n-th of a fixed list. */
function inventedWord(n: number): string {
  const a = SYLLABLES[n % SYLLABLES.length]!;
  const b = SYLLABLES[Math.floor(n / SYLLABLES.length) % SYLLABLES.length]!;
  const c = n >= 400 ? SYLLABLES[Math.floor(n / 400) % SYLLABLES.length]! : "";
  return a + b + c;
}

/** A Zipf-like pick from 0..n-1 (rank k with weight about 1/k), as words occur in real text. */
export function zipfIndex(r: Rand, n: number): number {
  return Math.min(n - 1, Math.floor(Math.exp(r() * Math.log(n + 1)) - 1));
}

/** Invented makers and summary vocabulary (no real brands). */
const MAKER_COUNT = 400;
const VOCABULARY = 8000;
export const BENCH_VOCABULARY = VOCABULARY;
export { inventedWord };
const ADJECTIVES = [
  "compact",
  "amber",
  "slim",
  "twin",
  "budget",
  "round",
  "square",
  "travel",
  "desk",
  "wall",
];
const SUMMARY_WORDS = [
  "board",
  "traced",
  "both",
  "sides",
  "dropper",
  "capacitor",
  "bleeder",
  "bridge",
  "rectifier",
  "zener",
  "reservoir",
  "LED",
  "string",
  "heater",
  "relay",
  "coil",
  "fuse",
  "varistor",
  "marking",
  "faded",
  "scorched",
  "resistor",
  "cracked",
  "solder",
  "joint",
  "clip",
  "shell",
  "screws",
  "potted",
  "glue",
];
const TAGS = [
  "non-isolated",
  "capacitive dropper",
  "led",
  "heater",
  "relay",
  "triac",
  "thyristor",
  "bridge",
  "half-wave",
];

function pick<T>(r: Rand, list: readonly T[]): T {
  return list[Math.floor(r() * list.length)]!;
}

function value(r: Rand, minExp: number, maxExp: number): number {
  const exp = minExp + Math.floor(r() * (maxExp - minExp + 1));
  return Number((pick(r, E12) * 10 ** exp).toPrecision(3));
}

/** Builds one circuit part by part, numbering refs per prefix and nets as it goes. */
class Board {
  parts: RawPart[] = [];
  blocks = new Set<string>();
  private counts = new Map<string, number>();
  private nets = 0;
  constructor(private r: Rand) {}
  net(): string {
    return `N${++this.nets}`;
  }
  add(prefix: string, kind: string, pins: Pins, extra: Partial<RawPart> = {}): void {
    const n = (this.counts.get(prefix) ?? 0) + 1;
    this.counts.set(prefix, n);
    this.parts.push({ ref: `${prefix}${n}`, kind, pins, ...extra });
  }
  res(a: string, b: string, lo = 1, hi = 6): void {
    this.add("R", "resistor", [a, b], { value: value(this.r, lo, hi) });
  }
}

/**
 * One generated gadget: its record document (record format 1, as stored in a revision), the
 * same circuit as a normalised record (built directly, so 100,000 need no parsing), and the
 * blocks the generator placed.
 */
export interface GeneratedGadget {
  doc: Record<string, unknown>;
  record: TeardownRecord;
  blocks: string[];
  category: string;
}

/** The generator: the same seed gives the same gadgets in the same order. */
export function mainsGadgets(seed: number): () => GeneratedGadget {
  const r = mulberry32(seed);
  let serial = 0;
  return () => {
    serial++;
    const b = new Board(r);
    const target = 5 + Math.floor(r() ** 1.5 * 56);
    let line = "L";
    if (r() < 0.7) {
      b.blocks.add("fuse");
      const fused = b.net();
      b.add("F", "fuse", [line, fused], { value: pick(r, [0.5, 1, 2, 3.15]) });
      line = fused;
    }
    if (r() < 0.3) b.add("RV", "varistor", [line, "N"]);
    const style = r();
    let hi: string;
    let lo: string;
    if (style < 0.55) {
      // Capacitive dropper, bleeder across it, surge resistor, then a rectifier.
      const a = b.net();
      const c = b.net();
      b.blocks.add("surge-limiter").add("capacitive-dropper").add("bleeder");
      b.res(line, a, 1, 2);
      b.add("C", "capacitor", [a, c], { value: value(r, -7, -6), marking: "X2" });
      b.res(a, c, 5, 6);
      ({ hi, lo } = rectifier(b, r, c, "N"));
    } else if (style < 0.75) {
      // Resistive dropper into a half-wave rectifier.
      const a = b.net();
      b.res(line, a, 3, 5);
      ({ hi, lo } = rectifier(b, r, a, "N"));
    } else {
      // Phase control: a triac with an RC gate network and a diac-like trigger diode, and a load.
      const mt = b.net();
      const g = b.net();
      const rc = b.net();
      b.blocks.add("triac-trigger");
      b.add("LD", "load", [line, mt]);
      b.add("Q", "triac", { mt2: mt, mt1: "N", gate: g });
      b.res(mt, rc, 4, 5);
      b.add("C", "capacitor", [rc, "N"], { value: value(r, -8, -7) });
      b.add("D", "diode", { anode: rc, cathode: g });
      hi = rc;
      lo = "N";
    }
    if (r() < 0.8) {
      b.blocks.add("smoothing-capacitor");
      b.add(
        "C",
        "capacitor",
        { plus: hi, minus: lo },
        { polarised: true, value: value(r, -6, -4) },
      );
    }
    if (r() < 0.5) {
      b.blocks.add("zener-shunt-regulator");
      b.add("Z", "zener", { anode: lo, cathode: hi }, { value: value(r, 0, 1) });
    }
    // Outputs until the board reaches its size.
    while (b.parts.length < target) {
      const kind = r();
      if (kind < 0.45) {
        let at = b.net();
        b.res(hi, at, 1, 3);
        const n = 1 + Math.floor(r() * Math.min(12, target - b.parts.length));
        for (let i = 0; i < n; i++) {
          const next = i === n - 1 ? lo : b.net();
          b.add("LED", "led", { anode: at, cathode: next });
          at = next;
        }
      } else if (kind < 0.6) {
        const k = b.net();
        b.add("K", "inductor", [hi, k], { value: value(r, -1, 0) });
        b.add("D", "diode", { anode: k, cathode: hi });
        b.add("Q", "thyristor", { anode: k, cathode: lo, gate: b.net() });
        b.blocks.add("thyristor-trigger");
      } else if (kind < 0.8) {
        b.res(hi, lo, 2, 4);
      } else {
        const m = b.net();
        b.res(hi, m, 3, 5);
        b.add("C", "capacitor", [m, lo], { value: value(r, -9, -7) });
      }
    }
    const category = pick(r, CATEGORIES);
    const maker = inventedWord(zipfIndex(r, MAKER_COUNT));
    // Mostly invented words, Zipf-distributed, with the trade's words mixed in.
    const words = Array.from({ length: 12 + Math.floor(r() * 20) }, () =>
      r() < 0.25 ? pick(r, SUMMARY_WORDS) : inventedWord(zipfIndex(r, VOCABULARY)),
    );
    const title = `${maker} ${pick(r, ADJECTIVES)} ${category} ${serial}`;
    const summary = words.join(" ");
    const supply = r() < 0.8 ? { vrms: 230, hz: 50 } : { vrms: 120, hz: 60 };
    const tags = [...new Set([pick(r, TAGS), pick(r, TAGS)])];
    const doc = {
      record: 1,
      title,
      summary,
      device: { category, rated_supply: supply, tags },
      parts: b.parts,
      nets: { L: { role: "line" }, N: { role: "neutral" } },
    };
    const rec = record(
      b.parts.map((p) =>
        part(p.ref, p.kind, p.pins, p.value ?? null, {
          polarised: p.polarised ?? false,
          marking: p.marking ?? null,
        }),
      ),
      {},
      { title, summary, device: { category, rated_supply: supply, tags } },
    );
    return { doc, record: rec, blocks: [...b.blocks].sort(), category };
  };
}

/** A bridge (usually) or a half-wave rectifier from two AC nets; the DC rail's two ends. */
function rectifier(b: Board, r: Rand, ac1: string, ac2: string): { hi: string; lo: string } {
  const hi = b.net();
  if (r() < 0.7) {
    b.blocks.add("bridge-rectifier");
    const lo = b.net();
    b.add("D", "diode", { anode: ac1, cathode: hi });
    b.add("D", "diode", { anode: ac2, cathode: hi });
    b.add("D", "diode", { anode: lo, cathode: ac1 });
    b.add("D", "diode", { anode: lo, cathode: ac2 });
    return { hi, lo };
  }
  b.blocks.add("half-wave-rectifier");
  b.add("D", "diode", { anode: ac1, cathode: hi });
  return { hi, lo: ac2 };
}

/** Fragments a user might paste, from the same block patterns (rare to common). */
export const BENCH_FRAGMENTS: ReadonlyArray<{ format: "deck" | "record"; text: string }> = [
  { format: "deck", text: "C1 A B\nR1 A B\n" },
  { format: "deck", text: "D1 A P\nD2 B P\nD3 M A\nD4 M B\n" },
  { format: "deck", text: "R1 A B\nC1 B C\n" },
  {
    format: "record",
    text: "parts:\n  - { ref: A, kind: led, pins: { anode: X, cathode: Y } }\n  - { ref: B, kind: led, pins: { anode: Y, cathode: Z } }\n  - { ref: Z1, kind: zener, pins: { anode: W, cathode: X } }\n",
  },
  {
    format: "record",
    text: "parts:\n  - { ref: K1, kind: inductor, pins: [P, K] }\n  - { ref: D1, kind: diode, pins: { anode: K, cathode: P } }\n",
  },
];
