/**
 * What the netlist-deck and CSV readers share: they build a raw record object (the same shape
 * a record file holds), remember the source line and column of each field they fill, and hand
 * both to the record validation, so that every reader's errors look alike and point at the
 * line in the file the person uploaded.
 */
import {
  formatPath,
  ProblemList,
  type LineColumn,
  type PathSegment,
  type SourceLocator,
} from "../record/input-errors.js";
import { validateRawRecord } from "../record/validate-record.js";
import type { NetRole, ParseResult } from "../record/types.js";

/** Net-role directives both readers accept (`.line L` in a deck, `# line: L` in a CSV). */
export const ROLE_DIRECTIVES: Readonly<Record<string, NetRole | "accessible">> = {
  line: "line",
  neutral: "neutral",
  earth: "earth",
  output: "output",
  accessible: "accessible",
};

/** Writes text as one word that tokenizeLine reads back unchanged. */
export function quoteWord(text: string): string {
  if (text !== "" && !/[\s"\\]/.test(text)) return text;
  return `"${text.replace(/\\/g, "\\\\").replace(/"/g, '\\"').replace(/\n/g, "\\n").replace(/\r/g, "\\r")}"`;
}

/** A word of the source with its 1-based place. */
export interface SourceToken extends LineColumn {
  text: string;
  line: number;
  column: number;
}

/** Collects a raw record and the source place of each field path. */
export class RawRecordBuilder {
  title: string | null = null;
  readonly parts: Record<string, unknown>[] = [];
  readonly nets: Record<string, { role?: NetRole; accessible?: boolean }> = {};
  supply: { vrms: number; hz: number } | null = null;
  private readonly places = new Map<string, LineColumn>();
  /** Fields the reader could not fill and has already reported; "missing" is not said again. */
  private readonly reported = new Set<string>();
  readonly problems: ProblemList;

  constructor() {
    this.problems = new ProblemList(this.locator());
  }

  /** Remembers where a field came from. */
  place(path: readonly PathSegment[], at: LineColumn): void {
    this.places.set(formatPath(path), { line: at.line, column: at.column });
  }

  /** A syntax problem at a place in the source (not tied to a record field). */
  errorAt(at: LineColumn, code: string, message: string): void {
    this.problems.errorAt(at, `line ${at.line ?? "?"}`, code, message);
  }

  /** Notes that a field was left out because its source was already reported as bad. */
  markReported(path: readonly PathSegment[]): void {
    this.reported.add(formatPath(path));
  }

  /** A non-fatal note at a place in the source. */
  warnAt(at: LineColumn, code: string, message: string): void {
    this.problems.warnAt(at, `line ${at.line ?? "?"}`, code, message);
  }

  /** Applies a role directive to the named nets; false when the directive is not one. */
  applyRoleDirective(name: string, nets: readonly SourceToken[]): boolean {
    const role = ROLE_DIRECTIVES[name.toLowerCase()];
    if (role === undefined) return false;
    for (const net of nets) {
      const info = (this.nets[net.text] ??= {});
      if (role === "accessible") info.accessible = true;
      else info.role = role;
      this.place(["nets", net.text], net);
    }
    return true;
  }

  /** Adds a part (a raw part object) that starts at a token; returns its index. */
  addPart(rawPart: Record<string, unknown>, at: LineColumn): number {
    this.parts.push(rawPart);
    const index = this.parts.length - 1;
    this.place(["parts", index], at);
    return index;
  }

  /** The raw record built so far. */
  raw(): Record<string, unknown> {
    const out: Record<string, unknown> = { record: 1, title: this.title ?? "", parts: this.parts };
    if (this.supply !== null) out.device = { rated_supply: { ...this.supply } };
    if (Object.keys(this.nets).length > 0) out.nets = this.nets;
    return out;
  }

  /** Validates the built record through the record path, with this builder's problems. */
  finish(): ParseResult {
    const result = validateRawRecord(this.raw(), this.locator(), this.problems);
    if (result.ok) return result;
    return {
      ok: false,
      errors: result.errors.filter(
        (e) => !(e.code === "missing-field" && this.reported.has(e.path)),
      ),
    };
  }

  private locator(): SourceLocator {
    return {
      place: (path) => {
        // the deepest remembered prefix of the path: a field, else its part, else nothing
        for (let n = path.length; n >= 0; n--) {
          const found = this.places.get(formatPath(path.slice(0, n)));
          if (found !== undefined) return found;
        }
        return { line: null, column: null };
      },
    };
  }
}

/**
 * Splits a line into words, keeping "double quoted" runs together (with backslash escapes
 * inside the quotes); places are 1-based.
 */
export function tokenizeLine(
  text: string,
  line: number,
  firstColumn = 1,
): { tokens: SourceToken[]; unclosedQuoteAt: number | null } {
  const tokens: SourceToken[] = [];
  let i = 0;
  while (i < text.length) {
    if (/\s/.test(text[i]!)) {
      i++;
      continue;
    }
    const start = i;
    let word = "";
    while (i < text.length && !/\s/.test(text[i]!)) {
      if (text[i] === '"') {
        const quoteAt = i;
        i++;
        while (i < text.length && text[i] !== '"') {
          // inside quotes: \" is a quote, \\ a backslash, \n and \r line breaks
          if (text[i] === "\\" && i + 1 < text.length) {
            const next = text[i + 1]!;
            word += next === "n" ? "\n" : next === "r" ? "\r" : next;
            i += 2;
          } else {
            word += text[i];
            i++;
          }
        }
        if (i >= text.length) return { tokens, unclosedQuoteAt: firstColumn + quoteAt };
        i++;
      } else {
        word += text[i];
        i++;
      }
    }
    tokens.push({ text: word, line, column: firstColumn + start });
  }
  return { tokens, unclosedQuoteAt: null };
}
