"use client";
/**
 * Pan and zoom for a drawing inside a fixed frame, with our own pointer and wheel code (no
 * library needed for one transform): drag to pan, wheel or the buttons to zoom about a point,
 * "fit" to show the whole drawing. A drag that moves less than CLICK_SLOP_PX is a click.
 */
import { useCallback, useEffect, useRef, useState, type RefObject } from "react";

export interface View {
  x: number;
  y: number;
  scale: number;
}

export const MIN_SCALE = 0.2;
export const MAX_SCALE = 6;
const WHEEL_STEP = 1.15;
/** Pointer travel below which a press counts as a click, not a drag. */
export const CLICK_SLOP_PX = 4;

const clampScale = (s: number) => Math.min(MAX_SCALE, Math.max(MIN_SCALE, s));

/** The view that fits a drawing of width × height into a frame of frameW × frameH. */
export function fitView(width: number, height: number, frameW: number, frameH: number): View {
  const scale = clampScale(Math.min(1, frameW / width, frameH / height));
  return { scale, x: (frameW - width * scale) / 2, y: Math.max(0, (frameH - height * scale) / 2) };
}

/** The view after zooming by `factor` about the frame point (px, py), which stays put. */
export function zoomAbout(v: View, factor: number, px: number, py: number): View {
  const scale = clampScale(v.scale * factor);
  const k = scale / v.scale;
  return { scale, x: px - (px - v.x) * k, y: py - (py - v.y) * k };
}

/** Pan/zoom state bound to a frame element; `dragged()` tells a click from the end of a drag. */
export function usePanZoom(
  frame: RefObject<HTMLDivElement | null>,
  width: number,
  height: number,
  frameHeight: number,
) {
  const [view, setView] = useState<View>({ x: 0, y: 0, scale: 1 });
  const drag = useRef<{ id: number; sx: number; sy: number; vx: number; vy: number } | null>(null);
  const moved = useRef(false);

  const fit = useCallback(() => {
    const el = frame.current;
    if (el) setView(fitView(width, height, el.clientWidth, frameHeight));
  }, [frame, width, height, frameHeight]);

  useEffect(fit, [fit]);

  useEffect(() => {
    const el = frame.current;
    if (!el) return;
    // React's onWheel is passive, so the page would scroll too; this listener is not.
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = el.getBoundingClientRect();
      const factor = e.deltaY < 0 ? WHEEL_STEP : 1 / WHEEL_STEP;
      setView((v) => zoomAbout(v, factor, e.clientX - r.left, e.clientY - r.top));
    };
    el.addEventListener("wheel", onWheel, { passive: false });
    return () => el.removeEventListener("wheel", onWheel);
  }, [frame]);

  const handlers = {
    onPointerDown(e: React.PointerEvent<HTMLDivElement>) {
      if (e.button !== 0) return;
      moved.current = false;
      drag.current = { id: e.pointerId, sx: e.clientX, sy: e.clientY, vx: view.x, vy: view.y };
    },
    onPointerMove(e: React.PointerEvent<HTMLDivElement>) {
      const d = drag.current;
      if (!d || d.id !== e.pointerId) return;
      const dx = e.clientX - d.sx;
      const dy = e.clientY - d.sy;
      if (!moved.current && Math.hypot(dx, dy) < CLICK_SLOP_PX) return;
      if (!moved.current) e.currentTarget.setPointerCapture(e.pointerId);
      moved.current = true;
      setView((v) => ({ ...v, x: d.vx + dx, y: d.vy + dy }));
    },
    onPointerUp() {
      drag.current = null;
    },
  };

  const zoomBy = (factor: number) => {
    const el = frame.current;
    const w = el?.clientWidth ?? width;
    setView((v) => zoomAbout(v, factor, w / 2, frameHeight / 2));
  };

  /** Centre the view on a drawing point, keeping the zoom. */
  const centreOn = useCallback(
    (x: number, y: number) => {
      const w = frame.current?.clientWidth ?? width;
      setView((v) => ({ ...v, x: w / 2 - x * v.scale, y: frameHeight / 2 - y * v.scale }));
    },
    [frame, width, frameHeight],
  );

  return { view, handlers, fit, zoomBy, centreOn, dragged: () => moved.current };
}
