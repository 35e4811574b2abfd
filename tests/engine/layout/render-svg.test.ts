import { describe, expect, it } from "vitest";
import {
  layoutSchematic,
  renderSchematicSvg,
  type SchematicLayout,
  type TeardownRecord,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { allLayoutCircuits } from "./circuit-set.js";

const circuits = await allLayoutCircuits();

async function svgOf(r: TeardownRecord): Promise<{ svg: string; layout: SchematicLayout }> {
  const result = await layoutSchematic(r);
  if (!result.ok) throw new Error(result.message);
  return { svg: renderSchematicSvg(result.layout), layout: result.layout };
}

/**
 * A small well-formedness check: tags balance and nest, attributes are quoted, the text holds
 * no bare "<" or "&", and there is exactly one root element, <svg>. Returns the problem or null.
 */
function xmlProblem(doc: string): string | null {
  const stack: string[] = [];
  let roots = 0;
  const token = /<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g;
  let at = 0;
  for (let m = token.exec(doc); m !== null; m = token.exec(doc)) {
    const between = doc.slice(at, m.index);
    if (between.includes("<")) return `stray "<" before offset ${m.index}`;
    if (/&(?!(?:amp|lt|gt|quot|apos);)/.test(between)) return `bare "&" before offset ${m.index}`;
    at = m.index + m[0].length;
    const [, closing, name, , selfClosing] = m;
    if (closing) {
      if (stack.pop() !== name) return `</${name}> closes the wrong element`;
    } else {
      if (stack.length === 0) roots++;
      if (!selfClosing) stack.push(name!);
    }
  }
  if (doc.slice(at).trim() !== "") return "text after the root element";
  if (stack.length > 0) return `unclosed <${stack.at(-1)}>`;
  if (roots !== 1 || !doc.startsWith("<svg")) return "not a single <svg> root";
  return null;
}

describe.each(circuits)("the SVG drawing of $name", ({ record: r }) => {
  it("is a well-formed standalone SVG document", async () => {
    const { svg } = await svgOf(r);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
  });

  it("writes every part's ref and draws one symbol group per part", async () => {
    const { svg } = await svgOf(r);
    for (const p of r.parts) {
      expect(svg).toContain(`>${p.ref}</text>`);
      expect(svg).toContain(`data-ref="${p.ref}"`);
    }
    expect(svg.match(/<g data-ref=/g)?.length ?? 0).toBe(r.parts.length);
  });

  it("draws one dot per junction and one polyline per wire section", async () => {
    const { svg, layout } = await svgOf(r);
    expect(svg.match(/<circle data-net=/g)?.length ?? 0).toBe(layout.junctions.length);
    const sections = layout.wires.reduce((n, w) => n + w.sections.length, 0);
    expect(svg.match(/<polyline /g)?.length ?? 0).toBe(sections);
  });
});

describe("renderSchematicSvg", () => {
  it("draws the line conductor dark red and the neutral dark blue", async () => {
    const { svg } = await svgOf(
      record([
        part("R1", "resistor", ["L", "A"]),
        part("R2", "resistor", ["A", "N"]),
        part("R3", "resistor", ["A", "N"]),
      ]),
    );
    expect(svg).toMatch(/<g data-net="L" stroke="#8b1a1a"/);
    expect(svg).toMatch(/<g data-net="N" stroke="#1f3a8a"/);
    expect(svg).toMatch(/<g data-net="A" stroke="#3c3c3c"/);
  });

  it("escapes net names and values that contain markup characters", async () => {
    const r = record([
      part("R1", "resistor", ["L", "A<&>B"], 10, { value_text: `10 "k" & 'more'` }),
      part("R2", "resistor", ["A<&>B", "N"]),
    ]);
    const { svg } = await svgOf(r);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain("A&lt;&amp;&gt;B");
    expect(svg).toContain("10 &quot;k&quot; &amp; &apos;more&apos;");
  });

  it("sizes the document to the layout", async () => {
    const { svg, layout } = await svgOf(record([part("R1", "resistor", ["L", "N"])]));
    expect(
      svg.startsWith(
        `<svg xmlns="http://www.w3.org/2000/svg" width="${layout.width}" height="${layout.height}"`,
      ),
    ).toBe(true);
  });

  it("the well-formedness check itself rejects broken markup", () => {
    expect(xmlProblem("<svg><g></svg>")).not.toBeNull();
    expect(xmlProblem("<svg><text>a & b</text></svg>")).not.toBeNull();
    expect(xmlProblem("<svg></svg><svg></svg>")).not.toBeNull();
    expect(xmlProblem('<svg><rect x="1"/></svg>')).toBeNull();
  });

  it("marks touchable terminals and draws the isolation boundary of an isolated transformer", async () => {
    const r = record(
      [
        part("T1", "transformer", { p1: "L", p2: "N", s1: "S1", s2: "G0" }),
        part("R1", "resistor", ["S1", "G0"], 100),
      ],
      { G0: { accessible: true } },
      {},
    );
    r.device.tags = ["isolated"];
    const { svg, layout } = await svgOf(r);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('data-touchable="G0"');
    const t1 = layout.parts.find((p) => p.ref === "T1")!;
    // The boundary runs through the transformer's middle, between its windings.
    expect(layout.barriers).toEqual([
      { ref: "T1", x: t1.x + t1.width / 2, y1: expect.any(Number), y2: expect.any(Number) },
    ]);
    expect(svg).toMatch(/<line data-isolation="T1"[^>]*stroke-dasharray/);
    r.device.tags = ["non-isolated"];
    expect((await svgOf(r)).layout.barriers).toBeUndefined();
  });

  it("draws a diagonal bridge diode corner to corner of its square box", async () => {
    const r = record([
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("D2", "diode", { anode: "N", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "L" }),
      part("D4", "diode", { anode: "M", cathode: "N" }),
      part("R1", "resistor", ["P", "M"], 1000),
    ]);
    const { svg, layout } = await svgOf(r);
    const d1 = layout.parts.find((p) => p.ref === "D1")!;
    expect(d1.rotation % 90).not.toBe(0);
    // The leads end at +-half the box diagonal from the centre: sqrt(2) * width / 2.
    const half = (d1.width * Math.SQRT2) / 2;
    const group = svg.slice(svg.indexOf('data-ref="D1"'));
    expect(group).toContain(`x1="${-Math.round(half * 100) / 100}"`);
  });
});
