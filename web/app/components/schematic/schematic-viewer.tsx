"use client";
/**
 * The schematic an entry's analysis laid out, drawn by the engine's own SVG renderer, in a frame
 * a person can pan and zoom. Over it sits a second SVG layer of our own: parts named in danger
 * or warning findings get a frame and a text mark (double solid frame and "!!" for danger,
 * dashed frame and "!" for warning, so it reads without colour), and the selected part a heavy
 * frame. Hovering a part lights the wires of its nets; clicking it selects it.
 */
import { useEffect, useMemo, useRef, useState } from "react";
import { renderSchematicSvg, type SchematicLayout } from "@teardown/engine";
import { usePanZoom } from "./pan-zoom";
import css from "./schematic.module.css";

/** Parts to mark, by the worst severity of the findings that name them. */
export type PartMarks = ReadonlyMap<string, "danger" | "warning">;

interface PartBox {
  ref: string;
  x: number;
  y: number;
  width: number;
  height: number;
  nets: string[];
}

const FRAME_MAX_HEIGHT_PX = 460;
const FRAME_MIN_HEIGHT_PX = 220;
const MARK_PAD_PX = 5;

function readLayout(layout: unknown): { svg: string; layout: SchematicLayout } | null {
  const l = layout as SchematicLayout | null;
  if (l === null || typeof l !== "object" || !Array.isArray(l.parts) || !Array.isArray(l.wires))
    return null;
  try {
    return { svg: renderSchematicSvg(l), layout: l };
  } catch {
    // An older or partial layout: the rest of the page still shows.
    return null;
  }
}

function cssEscape(s: string): string {
  return typeof CSS !== "undefined" && CSS.escape ? CSS.escape(s) : s.replace(/["\\]/g, "\\$&");
}

/** The drawing with pan, zoom, hover and selection; `focus` centres on a part when it changes. */
export function SchematicViewer({
  layout,
  marks,
  selectedParts,
  selectedNets,
  onSelectPart,
  focusKey,
}: {
  layout: unknown;
  marks: PartMarks;
  selectedParts: readonly string[];
  selectedNets: readonly string[];
  onSelectPart: (ref: string | null) => void;
  /** Changes whenever the page asks to show the selection (a finding's "show" link). */
  focusKey: number;
}) {
  const drawn = useMemo(() => readLayout(layout), [layout]);
  const frame = useRef<HTMLDivElement | null>(null);
  const drawing = useRef<HTMLDivElement | null>(null);
  const [hover, setHover] = useState<string | null>(null);
  const width = drawn?.layout.width ?? 1;
  const height = drawn?.layout.height ?? 1;
  const frameHeight = Math.max(FRAME_MIN_HEIGHT_PX, Math.min(FRAME_MAX_HEIGHT_PX, height + 16));
  const pz = usePanZoom(frame, width, height, frameHeight);
  const boxes = useMemo(() => {
    const m = new Map<string, PartBox>();
    for (const p of drawn?.layout.parts ?? [])
      m.set(p.ref, { ...p, nets: [...new Set(p.pins.map((pin) => pin.net))] });
    return m;
  }, [drawn]);

  // Light the nets of the hovered part and of the selection, on the engine's own wire groups.
  useEffect(() => {
    const root = drawing.current;
    if (!root) return;
    const lit = new Set<string>(selectedNets);
    for (const ref of hover ? [hover, ...selectedParts] : selectedParts)
      for (const n of boxes.get(ref)?.nets ?? []) lit.add(n);
    root.querySelectorAll(`.${css.lit}`).forEach((el) => el.classList.remove(css.lit!));
    for (const n of lit)
      root
        .querySelectorAll(`[data-net="${cssEscape(n)}"]`)
        .forEach((el) => el.classList.add(css.lit!));
  }, [hover, selectedParts, selectedNets, boxes, drawn]);

  // A finding's "show" link centres the drawing on the first part it names.
  const { centreOn } = pz;
  useEffect(() => {
    if (focusKey === 0) return;
    const b = boxes.get(selectedParts[0] ?? "");
    if (b) centreOn(b.x + b.width / 2, b.y + b.height / 2);
    frame.current?.scrollIntoView({ behavior: "smooth", block: "center" });
    // Only a new request moves the view; selection changes alone do not.
  }, [focusKey]);

  if (drawn === null) return <p className="muted">Schematic not computed.</p>;
  const refAt = (target: EventTarget | null) =>
    (target as Element | null)?.closest?.("[data-ref]")?.getAttribute("data-ref") ?? null;
  const { view } = pz;
  return (
    <div className={css.wrap}>
      <div className={css.tools} role="toolbar" aria-label="schematic view">
        <button type="button" onClick={() => pz.zoomBy(1.25)} aria-label="zoom in">
          +
        </button>
        <button type="button" onClick={() => pz.zoomBy(0.8)} aria-label="zoom out">
          −
        </button>
        <button type="button" onClick={pz.fit}>
          Fit
        </button>
        <span className={css.hint}>
          drag to pan, wheel to zoom; point at a part to light its nets, click it for its figures
        </span>
      </div>
      <div
        ref={frame}
        className={css.frame}
        style={{ height: frameHeight }}
        data-testid="schematic"
        {...pz.handlers}
        onPointerOver={(e) => setHover(refAt(e.target))}
        onPointerLeave={() => setHover(null)}
        onClick={(e) => {
          if (pz.dragged()) return;
          const ref = refAt(e.target);
          if (ref !== null) onSelectPart(ref);
        }}
      >
        <div
          className={css.stage}
          style={{
            width,
            height,
            transform: `translate(${view.x}px, ${view.y}px) scale(${view.scale})`,
          }}
        >
          {/* The engine's own output: every name in it went through its XML escaping. */}
          <div ref={drawing} dangerouslySetInnerHTML={{ __html: drawn.svg }} />
          <svg
            className={css.overlay}
            width={width}
            height={height}
            viewBox={`0 0 ${width} ${height}`}
            aria-hidden="true"
          >
            {[...marks].map(([ref, sev]) => {
              const b = boxes.get(ref);
              if (!b) return null;
              const x = b.x - MARK_PAD_PX;
              const y = b.y - MARK_PAD_PX;
              const w = b.width + 2 * MARK_PAD_PX;
              const h = b.height + 2 * MARK_PAD_PX;
              return (
                <g key={ref} data-mark={sev} data-mark-ref={ref} className={css[sev]}>
                  <rect x={x} y={y} width={w} height={h} rx={3} />
                  {sev === "danger" ? (
                    <rect x={x - 3} y={y - 3} width={w + 6} height={h + 6} rx={4} />
                  ) : null}
                  <text x={x + w + 9} y={y + 9}>
                    {sev === "danger" ? "!!" : "!"}
                  </text>
                </g>
              );
            })}
            {selectedParts.map((ref) => {
              const b = boxes.get(ref);
              if (!b) return null;
              return (
                <rect
                  key={ref}
                  data-selected-ref={ref}
                  className={css.selected}
                  x={b.x - MARK_PAD_PX - 6}
                  y={b.y - MARK_PAD_PX - 6}
                  width={b.width + 2 * MARK_PAD_PX + 12}
                  height={b.height + 2 * MARK_PAD_PX + 12}
                  rx={6}
                />
              );
            })}
          </svg>
        </div>
      </div>
      {marks.size > 0 ? (
        <p className={css.legend}>
          <span className={css.keyDanger}>!!</span> framed twice: a danger finding names the part ·{" "}
          <span className={css.keyWarning}>!</span> dashed frame: a warning finding names it
        </p>
      ) : null}
    </div>
  );
}
