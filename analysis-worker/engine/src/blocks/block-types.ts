/**
 * What block recognition returns, and the facts one block finder hands to the next (rectifier
 * outputs, dropper chains). The kinds are the record format's list (docs/analysis-result.md).
 */
import type { PartNode } from "../graph/circuit-graph.js";
import type { SupplyChain } from "./supply-path.js";

/** Block kinds, in the order findBlocks reports them. */
export const BLOCK_KINDS = [
  "fuse",
  "surge-limiter",
  "capacitive-dropper",
  "bleeder",
  "bridge-rectifier",
  "half-wave-rectifier",
  "reverse-protection",
  "smoothing-capacitor",
  "zener-shunt-regulator",
  "voltage-divider",
  "thyristor-trigger",
  "triac-trigger",
  "pulse-transformer",
] as const;
export type BlockKind = (typeof BLOCK_KINDS)[number];

/** A recognised functional block: its kind and the refs of its parts, sorted. */
export interface Block {
  kind: BlockKind;
  parts: string[];
}

/** The DC side of a rectifier: the output net and the net it returns to. */
export interface RectifierRail {
  output: string;
  ret: string;
  /** The nets the rectifier takes its AC from. */
  inputs: string[];
}

/** A capacitive dropper found on a supply chain. */
export interface DropperFound {
  block: Block;
  chain: SupplyChain;
  capacitors: PartNode[];
}

/** A block from a list of part nodes: refs sorted, each once. */
export function makeBlock(kind: BlockKind, parts: readonly PartNode[]): Block {
  return { kind, parts: [...new Set(parts.map((p) => p.ref))].sort() };
}

/** Drop blocks with the same kind and parts, keeping the first. */
export function uniqueBlocks(blocks: readonly Block[]): Block[] {
  const seen = new Set<string>();
  return blocks.filter((b) => {
    const key = `${b.kind}|${b.parts.join(",")}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** Unordered key of a net pair, for rail lookups. */
export function pairKey(a: string, b: string): string {
  return a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`;
}
