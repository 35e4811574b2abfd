"use client";
/** Both boards' stored schematics side by side, with the comparison's marks on each. */
import { useMemo } from "react";
import type { CompareSide, EntryComparison } from "../../client/api-types";
import { markedSchematicSvg, type PartMark } from "./schematic-marks";
import css from "./compare.module.css";

function marksFor(c: EntryComparison, side: "A" | "B"): Map<string, PartMark> {
  const marks = new Map<string, PartMark>();
  c.parts.pairs.forEach((p, i) =>
    marks.set(side === "A" ? p.a : p.b, { pair: i + 1, differs: p.differs, onlyHere: false }),
  );
  for (const ref of side === "A" ? c.parts.onlyA : c.parts.onlyB)
    marks.set(ref, { pair: null, differs: false, onlyHere: true });
  return marks;
}

function Board({ c, side }: { c: EntryComparison; side: "A" | "B" }) {
  const s: CompareSide = side === "A" ? c.a : c.b;
  const svg = useMemo(() => markedSchematicSvg(s.layout, marksFor(c, side), side), [c, s, side]);
  return (
    <div className={css.side} data-testid={`compare-board-${side}`}>
      <h2>
        {side}: <a href={`/entries/${s.entry.id}`}>{s.entry.title}</a>{" "}
        <span className={css.hint}>revision {s.revision}</span>
      </h2>
      {svg === null ? (
        <p className={css.hint}>Schematic not computed yet.</p>
      ) : (
        // The SVG is the engine's renderer output plus our marks; every name in it is escaped.
        <div className={css.schematic} dangerouslySetInnerHTML={{ __html: svg }} />
      )}
    </div>
  );
}

/** The two schematics and the legend of their marks. */
export function CompareSchematics({ comparison }: { comparison: EntryComparison }) {
  return (
    <section className={css.section} data-testid="compare-schematics">
      <div className={css.legend}>
        <span>
          <strong>#n</strong> the same number marks a matched pair on both boards
        </span>
        <span>
          <strong>dashed outline and ≠</strong> values differ
        </span>
        <span>
          <strong>hatched box, “only A” / “only B”</strong> on one board only
        </span>
      </div>
      <div className={css.sides}>
        <Board c={comparison} side="A" />
        <Board c={comparison} side="B" />
      </div>
    </section>
  );
}
