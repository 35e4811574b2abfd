/**
 * Reading a classic element-line netlist deck into a teardown record. Our plain syntax:
 *
 *   Plug-in fragrance warmer          first line: the title
 *   * a comment                       `*` starts a comment line
 *   .supply 230 50                    rated supply: RMS volts, hertz
 *   .line L                           net roles: .line .neutral .earth .output NET...
 *   .accessible CASE                  nets a person can touch
 *   R1 L A 1meg watts=0.25            R C L: ref, two nets, value, then key=value words
 *   C1 L A 330n tol=10% volts=310 class=X2
 *   + marking="334K 310V~"            `+` continues the line above
 *   D1 A P 1N4007                     D: ref, anode, cathode, optional marking, key=value
 *   XQ1 P G M thyristor vgt=0.7 igt=50u    X: ref after the X, nets, kind word, key=value
 *   .end                              the end; lines after it are ignored
 *
 * Values follow the deck convention: suffixes are case-insensitive, `meg` is mega and `m` (or
 * `M`) is milli, so `1M` is one milliohm; a value whose `m`/`M` reads as milli where mega is
 * far likelier (any resistor, or a value outside its kind's plausible range) is warned about
 * at its line (code `milli-or-mega`, see milli-or-mega.ts). `4k7` also works. A polarised capacitor is `C1 P N 10u polarised=true`
 * (nets in plus, minus order). The first letter of an element line gives the kind and is part
 * of the ref (`R1` is resistor R1); on an `X` line the X is dropped (`XQ1` is part Q1).
 */
import { pinRolesFor } from "../graph/kinds.js";
import type { ParseResult } from "../record/types.js";
import { internalFailure, MAX_RECORD_TEXT_CHARS } from "../record/parse-record.js";
import { parseValue } from "../values/parse-value.js";
import { applyParams, splitParam, valueToRecordText } from "./part-params.js";
import { RawRecordBuilder, tokenizeLine, type SourceToken } from "./raw-record-builder.js";

/** Element letters and the kinds they stand for. */
export const DECK_ELEMENT_KINDS: Readonly<Record<string, string>> = {
  R: "resistor",
  C: "capacitor",
  L: "inductor",
  D: "diode",
};

interface LogicalLine {
  tokens: SourceToken[];
}

/** Joins `+` continuation lines onto the line above; drops comments and blank lines. */
function logicalLines(lines: readonly string[], builder: RawRecordBuilder): LogicalLine[] {
  const out: LogicalLine[] = [];
  for (let i = 1; i < lines.length; i++) {
    const text = lines[i]!;
    const lineNo = i + 1;
    const trimmed = text.trim();
    if (trimmed === "" || trimmed.startsWith("*")) continue;
    if (/^\.end\b/i.test(trimmed)) {
      if (lines.slice(i + 1).some((l) => l.trim() !== ""))
        builder.warnAt({ line: lineNo, column: 1 }, "after-end", "lines after .end are ignored");
      break;
    }
    const isContinuation = trimmed.startsWith("+");
    const offset = text.indexOf(trimmed) + (isContinuation ? 1 : 0);
    const body = isContinuation ? trimmed.slice(1) : trimmed;
    const { tokens, unclosedQuoteAt } = tokenizeLine(body, lineNo, offset + 1);
    if (unclosedQuoteAt !== null)
      builder.errorAt(
        { line: lineNo, column: unclosedQuoteAt },
        "unclosed-quote",
        "a quote is opened but not closed on this line",
      );
    if (isContinuation) {
      const last = out[out.length - 1];
      if (last === undefined)
        builder.errorAt(
          { line: lineNo, column: offset },
          "orphan-continuation",
          "a + line continues nothing",
        );
      else last.tokens.push(...tokens);
      continue;
    }
    out.push({ tokens });
  }
  return out;
}

function readDirective(tokens: readonly SourceToken[], builder: RawRecordBuilder): void {
  const head = tokens[0]!;
  const name = head.text.slice(1).toLowerCase();
  const args = tokens.slice(1);
  if (name === "supply") {
    const vrms =
      args[0] === undefined ? null : parseValue(args[0].text, { unit: "V", notation: "deck" });
    const hz =
      args[1] === undefined ? null : parseValue(args[1].text, { unit: "Hz", notation: "deck" });
    if (vrms === null || hz === null || args.length !== 2) {
      builder.errorAt(
        head,
        "bad-directive",
        ".supply takes two numbers: RMS volts and hertz (.supply 230 50)",
      );
    } else if (!vrms.ok) builder.errorAt(args[0]!, vrms.code, vrms.message);
    else if (!hz.ok) builder.errorAt(args[1]!, hz.code, hz.message);
    else {
      builder.supply = { vrms: vrms.value, hz: hz.value };
      builder.place(["device", "rated_supply"], head);
      builder.place(["device", "rated_supply", "vrms"], args[0]!);
      builder.place(["device", "rated_supply", "hz"], args[1]!);
    }
    return;
  }
  if (args.length === 0 && name in { line: 1, neutral: 1, earth: 1, output: 1, accessible: 1 }) {
    builder.errorAt(head, "bad-directive", `.${name} names one or more nets`);
    return;
  }
  if (!builder.applyRoleDirective(name, args)) {
    builder.errorAt(
      head,
      "unknown-directive",
      `unknown directive "${head.text}"; known: .supply .line .neutral .earth .output .accessible .end`,
    );
  }
}

/** Places the pins: list form in the kind's order, each net at its word. */
function addPins(
  rawPart: Record<string, unknown>,
  index: number,
  nets: readonly SourceToken[],
  builder: RawRecordBuilder,
): void {
  rawPart.pins = nets.map((n) => n.text);
  if (nets[0] !== undefined) builder.place(["parts", index, "pins"], nets[0]);
  const roles = pinRolesFor(String(rawPart.kind), rawPart.polarised === true);
  nets.forEach((n, i) => builder.place(["parts", index, "pins", roles?.[i] ?? `p${i + 1}`], n));
}

function readElement(tokens: readonly SourceToken[], builder: RawRecordBuilder): void {
  const head = tokens[0]!;
  const letter = head.text.charAt(0).toUpperCase();
  const rest = tokens.slice(1);
  const firstParam = rest.findIndex((t) => splitParam(t) !== null);
  const positional = firstParam < 0 ? rest : rest.slice(0, firstParam);
  const params: SourceToken[] = [];
  for (const t of firstParam < 0 ? [] : rest.slice(firstParam)) {
    if (splitParam(t) !== null) params.push(t);
    else builder.errorAt(t, "bad-parameter", `"${t.text}": key=value words come last on a line`);
  }
  const bare = positional;
  if (letter === "X") {
    const kindToken = bare[bare.length - 1];
    if (kindToken === undefined || bare.length < 2) {
      builder.errorAt(head, "bad-element", "an X line is: Xref net... kind [key=value...]");
      return;
    }
    const rawPart: Record<string, unknown> = { ref: head.text.slice(1), kind: kindToken.text };
    const index = builder.addPart(rawPart, head);
    builder.place(["parts", index, "ref"], head);
    builder.place(["parts", index, "kind"], kindToken);
    applyParams(rawPart, index, params, "deck", builder);
    const nets = bare.slice(0, -1);
    addPins(rawPart, index, nets, builder);
    return;
  }
  const kind = DECK_ELEMENT_KINDS[letter];
  if (kind === undefined) {
    builder.errorAt(
      head,
      "unknown-element",
      `"${head.text}": an element line starts with R, C, L, D or X (or . for a directive, * for a comment)`,
    );
    return;
  }
  const nets = bare.slice(0, 2);
  if (nets.length < 2) {
    builder.errorAt(
      head,
      "bad-element",
      `a ${kind} line names two nets: ${head.text} NET NET${kind === "diode" ? "" : " VALUE"}`,
    );
    return;
  }
  const rawPart: Record<string, unknown> = { ref: head.text, kind };
  const index = builder.addPart(rawPart, head);
  builder.place(["parts", index, "ref"], head);
  applyParams(rawPart, index, params, "deck", builder);
  addPins(rawPart, index, nets, builder);
  const extra = bare.slice(2);
  if (kind === "diode") {
    if (extra[0] !== undefined) {
      rawPart.marking = extra[0].text;
      builder.place(["parts", index, "marking"], extra[0]);
    }
  } else if (extra[0] === undefined) {
    builder.errorAt(
      head,
      "missing-value",
      `a ${kind} line ends its nets with a value: ${head.text} NET NET VALUE`,
    );
  } else {
    const text = valueToRecordText(extra[0].text, kind, "deck", extra[0], builder, index);
    if (text !== null) rawPart.value = text;
    builder.place(["parts", index, "value"], extra[0]);
  }
  for (const t of extra.slice(1))
    builder.errorAt(t, "extra-word", `unexpected "${t.text}" on a ${kind} line`);
}

function readDeckUnguarded(text: string): ParseResult {
  if (text.length > MAX_RECORD_TEXT_CHARS) {
    return {
      ok: false,
      errors: [
        {
          path: "",
          code: "too-large",
          message: `a deck is at most ${MAX_RECORD_TEXT_CHARS} characters`,
          line: null,
          column: null,
        },
      ],
    };
  }
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  const builder = new RawRecordBuilder();
  builder.title = (lines[0] ?? "").trim();
  builder.place(["title"], { line: 1, column: 1 });
  for (const { tokens } of logicalLines(lines, builder)) {
    if (tokens.length === 0) continue;
    if (tokens[0]!.text.startsWith(".")) readDirective(tokens, builder);
    else readElement(tokens, builder);
  }
  return builder.finish();
}

/** Reads a netlist deck (syntax above) into a validated record; never throws. */
export function readDeck(text: string): ParseResult {
  try {
    return readDeckUnguarded(text);
  } catch (e) {
    return internalFailure(e);
  }
}
