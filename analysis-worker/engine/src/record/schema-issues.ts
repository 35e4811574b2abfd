/**
 * Turning zod's issues into our problems: a plain code, a message a person can act on, and the
 * field path. Unknown fields become warnings (the record format lets writers add fields).
 */
import type { z } from "zod";
import type { PathSegment, ProblemList } from "./input-errors.js";

/** What a JavaScript value is, in the words of a record file. */
export function describeInput(input: unknown): string {
  if (input === null) return "nothing (null)";
  if (Array.isArray(input)) return "a list";
  switch (typeof input) {
    case "string":
      return `text ${JSON.stringify(input.length > 40 ? `${input.slice(0, 40)}…` : input)}`;
    case "number":
      return `the number ${input}`;
    case "boolean":
      return `${input}`;
    case "object":
      return "a map of fields";
    default:
      return typeof input;
  }
}

const TYPE_WORDS: Readonly<Record<string, string>> = {
  string: "text",
  number: "a number",
  boolean: "true or false",
  object: "a map of fields",
  array: "a list",
  record: "a map",
  tuple: "a list",
};

function toPath(path: readonly PropertyKey[]): PathSegment[] {
  return path.map((seg) => (typeof seg === "number" ? seg : String(seg)));
}

function sizeMessage(
  issue: z.core.$ZodIssueTooSmall | z.core.$ZodIssueTooBig,
  small: boolean,
): string {
  const bound = Number(
    small ? (issue as z.core.$ZodIssueTooSmall).minimum : (issue as z.core.$ZodIssueTooBig).maximum,
  );
  const word = small ? "at least" : "at most";
  switch (issue.origin) {
    case "string":
      return small && bound === 1
        ? "must not be empty"
        : `must be ${word} ${bound} characters long`;
    case "array":
      return `must have ${word} ${bound} item${bound === 1 ? "" : "s"}`;
    default:
      return `must be ${word} ${bound}`;
  }
}

/** Reports zod issues (found under `base`) as errors and warnings. */
export function reportSchemaIssues(
  issues: readonly z.core.$ZodIssue[],
  base: readonly PathSegment[],
  problems: ProblemList,
): void {
  for (const issue of issues) {
    const path = [...base, ...toPath(issue.path)];
    const input = (issue as { input?: unknown }).input;
    const field = path.length === 0 ? "the record" : String(path[path.length - 1]);
    switch (issue.code) {
      case "unrecognized_keys":
        for (const key of issue.keys)
          problems.warn([...path, key], "unknown-field", `unknown field "${key}" is ignored`);
        break;
      case "invalid_type":
        if (path.length === 0) {
          problems.error(
            path,
            "not-a-record",
            "a record file holds a map of fields (record: 1, title, parts, ...)",
          );
        } else if (input === undefined) {
          problems.error(path, "missing-field", `${field} is required`);
        } else {
          problems.error(
            path,
            "wrong-type",
            `expected ${TYPE_WORDS[issue.expected] ?? issue.expected}, got ${describeInput(input)}`,
          );
        }
        break;
      case "invalid_union": {
        if (input === undefined) {
          problems.error(path, "missing-field", `${field} is required`);
          break;
        }
        // if exactly one alternative accepted the input's type, its own issues are the useful ones
        const typed = issue.errors.filter(
          (branch) => !branch.some((i) => i.code === "invalid_type" && i.path.length === 0),
        );
        if (typed.length === 1) reportSchemaIssues(typed[0]!, path, problems);
        else problems.error(path, "wrong-type", `${issue.message}; got ${describeInput(input)}`);
        break;
      }
      case "invalid_value":
        if (issue.values.length === 1 && typeof issue.values[0] === "number")
          problems.error(path, "not-allowed", issue.message);
        else
          problems.error(
            path,
            "not-allowed",
            `${describeInput(input)} is not allowed; use one of: ${issue.values.map(String).join(", ")}`,
          );
        break;
      case "too_small":
        problems.error(path, "out-of-range", `${field} ${sizeMessage(issue, true)}`);
        break;
      case "too_big":
        problems.error(path, "out-of-range", `${field} ${sizeMessage(issue, false)}`);
        break;
      case "invalid_format":
        problems.error(
          path,
          "bad-format",
          issue.message.startsWith("Invalid")
            ? `${describeInput(input)} does not have the required form`
            : issue.message,
        );
        break;
      case "invalid_key":
        problems.error(
          path,
          "bad-name",
          `${describeInput(input)} cannot be used as a name here (names are text without spaces)`,
        );
        break;
      case "not_multiple_of":
      case "invalid_element":
      case "custom":
        problems.error(path, "invalid", issue.message);
        break;
      default: {
        // a new zod issue code still gets reported
        const other = issue as { message: string };
        problems.error(path, "invalid", other.message);
      }
    }
  }
}
