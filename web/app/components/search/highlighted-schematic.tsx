"use client";
/** An entry's schematic with a fragment's parts marked (frame, tag and heavier symbol). */
import { useMemo } from "react";
import { isDrawableLayout, markedSchematicSvg } from "./schematic-marks";
import css from "./search.module.css";

export function HighlightedSchematic({
  layout,
  matched,
  label,
}: {
  layout: unknown;
  /** Entry ref → fragment ref. */
  matched: Record<string, string>;
  label: string;
}) {
  const svg = useMemo(() => {
    if (!isDrawableLayout(layout)) return null;
    try {
      return markedSchematicSvg(layout, matched);
    } catch {
      // An older or partial layout: the match table above still says where the fragment sits.
      return null;
    }
  }, [layout, matched]);
  if (svg === null) return <p className="muted">This entry has no schematic to mark yet.</p>;
  // The SVG is the engine's output plus our marks; every name in both went through XML escaping.
  return (
    <figure className={css.schematicFigure}>
      <div
        className={css.schematic}
        data-testid="fragment-schematic"
        role="img"
        aria-label={label}
        dangerouslySetInnerHTML={{ __html: svg }}
      />
      <figcaption className="muted small">
        Matched parts are framed with a dashed line and tagged with the fragment&apos;s ref.
      </figcaption>
    </figure>
  );
}
