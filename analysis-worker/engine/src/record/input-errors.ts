/**
 * Collecting the problems found while reading input, each with its field path and the line and
 * column where that field sits in the source file. Every reader (record file, netlist deck,
 * CSV parts list) reports through the same collector, so their errors look alike.
 */
import type { InputError } from "./types.js";

/** One step of a field path: a key or an index. */
export type PathSegment = string | number;

/** A 1-based line and column in the source text, or nulls when unknown. */
export interface LineColumn {
  line: number | null;
  column: number | null;
}

/** Finds where a field path sits in the source file. */
export interface SourceLocator {
  /** The place of the deepest node on the path that exists in the source. */
  place(path: readonly PathSegment[]): LineColumn;
  /** The source text of a plain numeric scalar at the path (`1e6`, not 1000000), if known. */
  numberText?(path: readonly PathSegment[]): string | null;
}
const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

/** `["parts", 1, "value"]` → `parts[1].value`; odd keys are quoted (`nets["a b"]`). */
export function formatPath(path: readonly PathSegment[]): string {
  let out = "";
  for (const seg of path) {
    if (typeof seg === "number") out += `[${seg}]`;
    else if (IDENTIFIER.test(seg)) out += out === "" ? seg : `.${seg}`;
    else out += `[${JSON.stringify(seg)}]`;
  }
  return out;
}

/** Gathers errors and warnings for one reading; every problem is kept, none stops the run. */
export class ProblemList {
  readonly errors: InputError[] = [];
  readonly warnings: InputError[] = [];

  constructor(private readonly locator: SourceLocator) {}

  /** Adds an error at a field path. */
  error(path: readonly PathSegment[], code: string, message: string): void {
    this.errors.push(this.make(path, code, message));
  }

  /** Adds a warning (non-fatal) at a field path. */
  warn(path: readonly PathSegment[], code: string, message: string): void {
    this.warnings.push(this.make(path, code, message));
  }

  /** Adds an error whose place is already known (a syntax error at a line). */
  errorAt(place: LineColumn, path: string, code: string, message: string): void {
    this.errors.push({ path, code, message, line: place.line, column: place.column });
  }

  /** Adds a warning whose place is already known. */
  warnAt(place: LineColumn, path: string, code: string, message: string): void {
    this.warnings.push({ path, code, message, line: place.line, column: place.column });
  }

  /** The source text of a numeric scalar, when the source keeps it. */
  numberText(path: readonly PathSegment[]): string | null {
    return this.locator.numberText?.(path) ?? null;
  }

  private make(path: readonly PathSegment[], code: string, message: string): InputError {
    let place: LineColumn = { line: null, column: null };
    try {
      place = this.locator.place(path);
    } catch {
      // a locator that cannot place a path still lets the problem be reported
    }
    return { path: formatPath(path), code, message, line: place.line, column: place.column };
  }
}

/** Orders problems by place in the file (unplaced last), keeping the found order otherwise. */
export function sortByPlace(problems: InputError[]): InputError[] {
  const key = (p: InputError): number =>
    (p.line ?? Number.MAX_SAFE_INTEGER) * 1e6 + (p.column ?? 0);
  return problems
    .map((p, i) => ({ p, i }))
    .sort((a, b) => key(a.p) - key(b.p) || a.i - b.i)
    .map(({ p }) => p);
}
