"use client";
/** The stored schematic layout drawn inline by the engine's own SVG renderer. */
import { useMemo } from "react";
import { renderSchematicSvg, type SchematicLayout } from "@teardown/engine";
import { obj } from "./result-access";
import css from "../entry.module.css";

/** The schematic, or a note when the stored layout cannot be drawn. */
export function SchematicView({ layout }: { layout: unknown }) {
  const svg = useMemo(() => {
    const l = obj(layout);
    if (!Array.isArray(l.parts) || !Array.isArray(l.wires)) return null;
    try {
      return renderSchematicSvg(l as unknown as SchematicLayout);
    } catch {
      // An older or partial layout: show the rest of the page rather than fail it.
      return null;
    }
  }, [layout]);
  if (svg === null) return <p className={css.missing}>Schematic not computed.</p>;
  // The SVG is the engine's own output; every name in it went through its XML escaping.
  return (
    <div
      className={css.schematic}
      data-testid="schematic"
      dangerouslySetInnerHTML={{ __html: svg }}
    />
  );
}
