/**
 * The project's own format pages keep up with the code: every field of the stored result, every
 * flag code and every block kind is named in docs/, and the README and contributor guide link
 * only to files that exist in the repository.
 */
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import {
  BLOCK_KINDS,
  FLAG_CODES,
  NotSolvedResultSchema,
  SolvedResultSchema,
} from "@teardown/engine";

const ROOT = projectRoot();
const doc = (name: string) => readFileSync(path.join(ROOT, "docs", name), "utf8");

describe("the format docs", () => {
  it("name every field of the stored result", () => {
    const text = doc("analysis-result.md");
    const fields = new Set([
      ...Object.keys(SolvedResultSchema.shape),
      ...Object.keys(NotSolvedResultSchema.shape),
    ]);
    // `parts[REF]` names the field too.
    for (const f of fields) expect(text, f).toMatch(new RegExp(`\`${f}[\`[]`));
  });

  it("list every flag code with what it rests on", () => {
    const text = doc("flag-codes.md");
    for (const code of FLAG_CODES) expect(text, code).toMatch(new RegExp(`\\| \`${code}\` \\|`));
    expect(text).not.toMatch(/FOUND|MEMORY|DERIVED|reference-values|record-format\.md|engine\.md/);
  });

  it("name every block kind", () => {
    const text = doc("analysis-result.md");
    for (const kind of BLOCK_KINDS) expect(text, kind).toContain(`\`${kind}\``);
  });

  it("README and DEVELOPERS link only to files in the repository", () => {
    for (const file of ["README.md", "DEVELOPERS.md", "docs/README.md"]) {
      const text = readFileSync(path.join(ROOT, file), "utf8");
      expect(text, file).not.toContain("../shared");
      for (const [, target] of text.matchAll(/\]\(([^)#]+)(?:#[^)]*)?\)/g)) {
        if (/^https?:/.test(target!)) continue;
        expect(
          existsSync(path.join(ROOT, path.dirname(file), target!)),
          `${file} → ${target}`,
        ).toBe(true);
      }
    }
  });
});
