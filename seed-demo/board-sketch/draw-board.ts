/**
 * Draws a board sketch for a demo record: the board outline, one footprint per traced part in
 * record order, its reference designator in silkscreen, the mains entry pads, and a routed
 * slot when the record's spacings mention one. A plain drawing, labelled as such, so nobody
 * mistakes it for a photograph. Deterministic: the same record gives the same bytes.
 */
import { encodePng, type Raster } from "./png-encoder.js";
import { GLYPH_HEIGHT, glyphInk, textWidth } from "./pixel-font.js";

/** What the sketch needs from a record part. */
export interface SketchPart {
  ref: string;
  kind: string;
  polarised?: boolean;
}

/** What the sketch needs from a record. */
export interface SketchRecord {
  parts: SketchPart[];
  hasSlot: boolean;
}

type Rgb = readonly [number, number, number];

const WIDTH_PX = 640;
const HEIGHT_PX = 400;
const MARGIN_PX = 24;
const LABEL_SCALE = 2;

const COLOURS = {
  background: [236, 236, 230],
  board: [52, 104, 74],
  boardEdge: [30, 70, 48],
  silk: [245, 245, 240],
  pad: [196, 170, 96],
  slot: [236, 236, 230],
  note: [90, 90, 90],
} as const satisfies Record<string, Rgb>;

/** Body colour and footprint shape by part kind. */
const BODY: Readonly<Record<string, { colour: Rgb; w: number; h: number; round?: boolean }>> = {
  resistor: { colour: [214, 190, 150], w: 44, h: 14 },
  capacitor: { colour: [60, 96, 170], w: 40, h: 24 },
  inductor: { colour: [60, 60, 60], w: 30, h: 30, round: true },
  diode: { colour: [30, 30, 30], w: 30, h: 12 },
  zener: { colour: [150, 60, 40], w: 26, h: 12 },
  led: { colour: [250, 190, 60], w: 18, h: 18, round: true },
  thyristor: { colour: [25, 25, 25], w: 30, h: 34 },
  triac: { colour: [25, 25, 25], w: 30, h: 34 },
  transformer: { colour: [120, 120, 130], w: 64, h: 52 },
  fuse: { colour: [225, 225, 215], w: 40, h: 12 },
  varistor: { colour: [40, 80, 160], w: 24, h: 24, round: true },
  load: { colour: [170, 120, 60], w: 48, h: 26 },
  switch: { colour: [90, 90, 90], w: 30, h: 22 },
};
const OTHER_BODY = { colour: [110, 110, 110] as Rgb, w: 24, h: 24 };

class Canvas implements Raster {
  readonly rgb: Uint8Array;
  constructor(
    readonly width: number,
    readonly height: number,
    fill: Rgb,
  ) {
    this.rgb = new Uint8Array(width * height * 3);
    this.rect(0, 0, width, height, fill);
  }
  pixel(x: number, y: number, c: Rgb): void {
    if (x < 0 || y < 0 || x >= this.width || y >= this.height) return;
    const i = (Math.floor(y) * this.width + Math.floor(x)) * 3;
    this.rgb[i] = c[0];
    this.rgb[i + 1] = c[1];
    this.rgb[i + 2] = c[2];
  }
  rect(x: number, y: number, w: number, h: number, c: Rgb): void {
    for (let j = Math.round(y); j < Math.round(y + h); j++)
      for (let i = Math.round(x); i < Math.round(x + w); i++) this.pixel(i, j, c);
  }
  frame(x: number, y: number, w: number, h: number, t: number, c: Rgb): void {
    this.rect(x, y, w, t, c);
    this.rect(x, y + h - t, w, t, c);
    this.rect(x, y, t, h, c);
    this.rect(x + w - t, y, t, h, c);
  }
  disc(cx: number, cy: number, r: number, c: Rgb): void {
    for (let j = -r; j <= r; j++)
      for (let i = -r; i <= r; i++) if (i * i + j * j <= r * r) this.pixel(cx + i, cy + j, c);
  }
  text(s: string, x: number, y: number, scale: number, c: Rgb): void {
    [...s].forEach((ch, k) => {
      for (let gy = 0; gy < GLYPH_HEIGHT; gy++)
        for (let gx = 0; gx < 5; gx++)
          if (glyphInk(ch, gx, gy))
            this.rect(x + (k * 6 + gx) * scale, y + gy * scale, scale, scale, c);
    });
  }
}

function drawPart(cv: Canvas, p: SketchPart, cx: number, cy: number): void {
  const body = BODY[p.kind] ?? OTHER_BODY;
  const x = cx - body.w / 2;
  const y = cy - body.h / 2;
  // Pads either side: every part has at least two joints to the board.
  cv.disc(Math.round(x - 6), Math.round(cy), 4, COLOURS.pad);
  cv.disc(Math.round(x + body.w + 6), Math.round(cy), 4, COLOURS.pad);
  if (p.kind === "capacitor" && p.polarised) {
    // An electrolytic seen from above: a can with its minus stripe.
    const r = Math.round(body.h / 2 + 2);
    cv.disc(Math.round(cx), Math.round(cy), r, [40, 40, 70]);
    cv.rect(cx + r / 2, cy - r + 3, 4, 2 * r - 6, [200, 200, 210]);
  } else if ("round" in body && body.round) {
    cv.disc(Math.round(cx), Math.round(cy), Math.round(body.w / 2), body.colour);
  } else {
    cv.rect(x, y, body.w, body.h, body.colour);
  }
  if (p.kind === "diode" || p.kind === "zener")
    cv.rect(x + body.w - 7, y, 3, body.h, [200, 200, 200]);
  if (p.kind === "thyristor" || p.kind === "triac")
    cv.rect(x - 2, y - 10, body.w + 4, 10, [170, 170, 175]);
  if (p.kind === "transformer") cv.rect(x + 8, y + 12, body.w - 16, body.h - 24, [200, 150, 60]);
  if (p.kind === "load") cv.frame(x, y, body.w, body.h, 2, COLOURS.silk);
  const label = p.ref;
  cv.text(label, cx - (textWidth(label) * LABEL_SCALE) / 2, cy + 22, LABEL_SCALE, COLOURS.silk);
}

/** The board sketch of a record as PNG bytes, with its pixel size. */
export function drawBoardSketch(rec: SketchRecord): {
  png: Uint8Array;
  width: number;
  height: number;
} {
  const cv = new Canvas(WIDTH_PX, HEIGHT_PX, COLOURS.background);
  const bx = MARGIN_PX;
  const by = MARGIN_PX;
  const bw = WIDTH_PX - 2 * MARGIN_PX;
  const bh = HEIGHT_PX - 2 * MARGIN_PX - 18;
  cv.rect(bx, by, bw, bh, COLOURS.board);
  cv.frame(bx, by, bw, bh, 3, COLOURS.boardEdge);
  // Mains entry pads on the left edge.
  cv.rect(bx + 10, by + 16, 22, 22, COLOURS.pad);
  cv.rect(bx + 10, by + bh - 38, 22, 22, COLOURS.pad);
  cv.text("L", bx + 40, by + 20, 2, COLOURS.silk);
  cv.text("N", bx + 40, by + bh - 34, 2, COLOURS.silk);
  if (rec.hasSlot) cv.rect(bx + 64, by + 12, 6, bh - 24, COLOURS.slot);

  const n = Math.max(rec.parts.length, 1);
  const areaX = bx + 90;
  const areaW = bw - 110;
  const areaY = by + 20;
  const areaH = bh - 30;
  const cols = Math.max(1, Math.ceil(Math.sqrt((n * areaW) / areaH)));
  const rows = Math.ceil(n / cols);
  rec.parts.forEach((p, k) => {
    const col = k % cols;
    const row = Math.floor(k / cols);
    drawPart(
      cv,
      p,
      areaX + ((col + 0.5) * areaW) / cols,
      areaY + ((row + 0.5) * areaH) / rows - 10,
    );
  });
  cv.text("DRAWN SKETCH - NOT A PHOTOGRAPH", bx, HEIGHT_PX - MARGIN_PX - 8, 1, COLOURS.note);
  return { png: encodePng(cv), width: WIDTH_PX, height: HEIGHT_PX };
}
