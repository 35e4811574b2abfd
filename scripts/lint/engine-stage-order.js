// Lint rule: the engine's stages flow one way. A file may import its own stage or an earlier
// one, never a later one, so a change in a late stage (flags) cannot break an early one
// (solver), and the solver never depends on how its results are judged.
//
//   record -> values -> graph -> blocks -> solver -> figures -> flags -> analyze
//
// The stages the order does not name sit where their imports put them: `import/` (reading other
// file formats into a record) beside graph, `fingerprint/` and `layout/` beside blocks, and the
// engine's top-level files (analyze.ts, the stored-result shapes) in `analyze`, and `what-if/`
// (a whole analysis re-run at another supply or with changed values) after `analyze`. `index.ts`
// is the front door and re-exports every stage.
// `engine-version.ts` holds one constant that every stage may stamp on its output.
// One choice the order leaves open: reading a record parses its value notation and checks its
// part kinds, so `record/` may use `values/` and the kind table `graph/kinds.ts`; nothing else
// in a stage may reach forward.
// The flags judge solved results and never run a simulation, so flags/ may read the solver's
// types (`import type`) but none of its values: the variants are solved before the flags, in
// figures/risk-variants.ts, and handed to them.
import path from "node:path";

/** Stage ranks: a file may import ranks at or below its own. */
export const STAGE_RANK = {
  record: 0,
  values: 1,
  graph: 2,
  import: 2,
  blocks: 3,
  fingerprint: 3,
  layout: 3,
  solver: 4,
  figures: 5,
  flags: 6,
  analyze: 7,
  "what-if": 8,
  // Comparing two boards reads two finished analyses, so it comes after them.
  compare: 8,
};

/** The written order, for messages. */
const ORDER = "record → values → graph → blocks → solver → figures → flags → analyze";

/** Imports allowed against the order, as [from stage, target path inside src]. */
const ALLOWED_FORWARD = [
  ["record", /^values\//],
  ["record", /^graph\/kinds\.(ts|js)$/],
];

/** Stages that may import only types from an earlier stage, as [from stage, target stage]. */
const TYPES_ONLY = [["flags", "solver"]];

/** True when an import or re-export brings in types alone (`import type`, or every specifier `type`). */
function typesOnly(node) {
  if (node.importKind === "type" || node.exportKind === "type") return true;
  const specs = node.specifiers ?? [];
  return specs.length > 0 && specs.every((s) => s.importKind === "type" || s.exportKind === "type");
}

/** Files every stage may import. */
const SHARED = /^engine-version\.(ts|js)$/;

const ENGINE_SRC = path.join("analysis-worker", "engine", "src");

/** The path of `file` inside the engine's src folder, or null outside it. */
function insideEngine(file) {
  const norm = path.normalize(file);
  const at = norm.lastIndexOf(ENGINE_SRC + path.sep);
  if (at < 0) return null;
  return norm
    .slice(at + ENGINE_SRC.length + 1)
    .split(path.sep)
    .join("/");
}

/** The stage of a path inside src: its first folder, or `analyze` for a top-level file. */
function stageOf(inner) {
  const slash = inner.indexOf("/");
  if (slash < 0) return "analyze";
  const folder = inner.slice(0, slash);
  return folder in STAGE_RANK ? folder : null;
}

export const engineStageOrder = {
  meta: {
    type: "problem",
    docs: { description: "Engine stages import only their own or earlier stages." },
    schema: [],
    messages: {
      wrongWay:
        "{{from}}/ may not import {{to}}/ ({{target}}): engine stages flow one way, " +
        ORDER +
        ". Move the shared piece to the earlier stage or pass the result in.",
      typesOnly:
        "{{from}}/ may import only types from {{to}}/ ({{target}}): the flags judge solved results and never run the solver. Solve the variant in figures/risk-variants.ts and read its result.",
      unknownStage:
        "{{folder}}/ is not an engine stage this rule knows: add it to STAGE_RANK in scripts/lint/engine-stage-order.js.",
    },
  },
  create(context) {
    const filename = context.filename ?? context.getFilename();
    const inner = insideEngine(filename);
    if (inner === null) return {};
    if (inner === "index.ts") return {};
    const from = stageOf(inner);
    const check = (node) => {
      const source = node.source?.value;
      if (typeof source !== "string" || !source.startsWith(".")) return;
      const targetAbs = path.resolve(path.dirname(filename), source);
      const target = insideEngine(targetAbs);
      if (target === null) return;
      if (SHARED.test(target)) return;
      const to = stageOf(target);
      if (from === null || to === null) {
        const folder = (from === null ? inner : target).split("/")[0];
        context.report({ node: node.source, messageId: "unknownStage", data: { folder } });
        return;
      }
      if (TYPES_ONLY.some(([f, t]) => f === from && t === to) && !typesOnly(node)) {
        context.report({ node: node.source, messageId: "typesOnly", data: { from, to, target } });
        return;
      }
      if (STAGE_RANK[to] <= STAGE_RANK[from]) return;
      if (ALLOWED_FORWARD.some(([f, re]) => f === from && re.test(target))) return;
      context.report({ node: node.source, messageId: "wrongWay", data: { from, to, target } });
    };
    return {
      ImportDeclaration: check,
      ExportNamedDeclaration: check,
      ExportAllDeclaration: check,
      ImportExpression: check,
    };
  },
};

export default { rules: { "engine-stage-order": engineStageOrder } };
