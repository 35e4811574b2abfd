/**
 * Writing a record as a netlist deck in the syntax read-deck.ts reads: title, supply, net
 * roles, then one element line per part. A deck holds the circuit only: measurements, board
 * spacings, the summary and net notes are left out. Values are written in deck notation
 * (`meg` for mega), exactly enough to read back to the same numbers.
 */
import { pinRolesFor } from "../graph/kinds.js";
import type { Part, TeardownRecord } from "../record/types.js";
import { exactValueText } from "../values/format-value.js";
import { DECK_ELEMENT_KINDS } from "./read-deck.js";
import { quoteWord } from "./raw-record-builder.js";

const word = quoteWord;

function param(key: string, value: string): string {
  return `${key}=${word(value)}`;
}

/** The key=value words of a part other than its nets and main value. */
function partParams(part: Part, valueAsParam: boolean): string[] {
  const out: string[] = [];
  if (valueAsParam && part.value !== null)
    out.push(param("value", exactValueText(part.value, "deck")));
  else if (valueAsParam && part.value_text !== null) out.push(param("value", part.value_text));
  if (part.tolerance !== null) out.push(param("tol", String(part.tolerance)));
  for (const key of ["volts", "amps", "watts", "surge_amps"] as const) {
    const v = part.rating[key];
    if (v !== undefined) out.push(param(key, exactValueText(v, "deck")));
  }
  if (part.rating.class !== undefined) out.push(param("class", part.rating.class));
  if (part.rating.package !== undefined) out.push(param("package", part.rating.package));
  if (part.polarised) out.push("polarised=true");
  if (part.kind === "switch") out.push(`closed=${part.closed}`);
  for (const [key, v] of Object.entries(part.model))
    out.push(param(key, exactValueText(v, "deck")));
  if (part.marking !== null) out.push(param("marking", part.marking));
  if (part.note !== null) out.push(param("note", part.note));
  return out;
}

/** Nets in the kind's pin order (or the part's own order for kinds without a table). */
function orderedNets(part: Part): string[] {
  const roles = pinRolesFor(part.kind, part.polarised) ?? Object.keys(part.pins);
  const known =
    roles.every((r) => r in part.pins) && roles.length === Object.keys(part.pins).length;
  return (known ? roles : Object.keys(part.pins)).map((r) => part.pins[r]!);
}

function elementLine(part: Part): string {
  const letter = part.ref.charAt(0).toUpperCase();
  const nets = orderedNets(part).map(word);
  const kindLetterFits = DECK_ELEMENT_KINDS[letter] === part.kind;
  if (kindLetterFits && part.kind === "diode" && part.value === null && part.value_text === null) {
    return [part.ref, ...nets, ...partParams(part, false)].join(" ");
  }
  if (kindLetterFits && part.kind !== "diode" && part.value !== null) {
    return [part.ref, ...nets, exactValueText(part.value, "deck"), ...partParams(part, false)].join(
      " ",
    );
  }
  return [`X${part.ref}`, ...nets, word(part.kind), ...partParams(part, true)].join(" ");
}

/** The record's circuit as a netlist deck (see read-deck.ts for the syntax). */
export function exportDeck(record: TeardownRecord): string {
  const lines: string[] = [record.title.replace(/[\r\n]+/g, " ")];
  const { vrms, hz } = record.device.rated_supply;
  lines.push(`.supply ${exactValueText(vrms, "deck")} ${exactValueText(hz, "deck")}`);
  for (const role of ["line", "neutral", "earth", "output"] as const) {
    const nets = Object.entries(record.nets)
      .filter(([, info]) => info.role === role)
      .map(([name]) => word(name));
    if (nets.length > 0) lines.push(`.${role} ${nets.join(" ")}`);
  }
  const accessible = Object.entries(record.nets)
    .filter(([, info]) => info.accessible)
    .map(([name]) => word(name));
  if (accessible.length > 0) lines.push(`.accessible ${accessible.join(" ")}`);
  for (const part of record.parts) lines.push(elementLine(part));
  lines.push(".end");
  return `${lines.join("\n")}\n`;
}
