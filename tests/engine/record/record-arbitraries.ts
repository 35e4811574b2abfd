/**
 * fast-check generators of raw records (the file's shape) for round-trip and robustness tests:
 * valid ones built from the kinds' pin table, and mutations of them.
 */
import fc from "fast-check";
import { KINDS, type KnownKind } from "@teardown/engine";

const NETS = ["L", "N", "A", "B", "P", "M", "G", "HV", "0", "CASE"];
const net = fc.constantFrom(...NETS);
const text = fc.string({ unit: "grapheme", maxLength: 30 });

/** A positive value in one of the notations a person writes. */
export const valueText = fc.oneof(
  fc.constantFrom(
    "4R7",
    "1k3",
    "2M2",
    "4n7",
    "0R1",
    "R47",
    "330n",
    "4.7u",
    "24.1m",
    "1.2k",
    "2.2e-7",
    "100",
    "1G5",
  ),
  fc.double({ min: 1e-12, max: 1e9, noNaN: true }).map((v) => String(v)),
  fc.double({ min: 1e-12, max: 1e9, noNaN: true }),
);

/**
 * A positive value that any valued kind can have: at most 1e4 in its unit (a capacitor, a zener
 * voltage or a fuse rating of 1e9 is refused as impossible, see record/plausibility.ts).
 */
export const smallValueText = fc.oneof(
  fc.constantFrom(
    "4R7",
    "1k3",
    "4n7",
    "0R1",
    "R47",
    "330n",
    "4.7u",
    "24.1m",
    "1.2k",
    "2.2e-7",
    "100",
  ),
  fc.double({ min: 1e-12, max: 1e4, noNaN: true }).map((v) => String(v)),
  fc.double({ min: 1e-12, max: 1e4, noNaN: true }),
);

function partArb(ref: string): fc.Arbitrary<Record<string, unknown>> {
  const kinds = Object.keys(KINDS) as KnownKind[];
  return fc.constantFrom<string>(...kinds, "widget").chain((kind) => {
    const info = kind in KINDS ? KINDS[kind as KnownKind] : null;
    const pinCount =
      info === null || info.variadic
        ? fc.integer({ min: 1, max: 4 })
        : fc.constant(info.pins.length);
    return fc
      .record(
        {
          pins: pinCount.chain((n) => fc.array(net, { minLength: n, maxLength: n })),
          value: info?.unit
            ? kind === "resistor"
              ? valueText
              : smallValueText
            : fc.constant(undefined),
          tolerance: fc.constantFrom(undefined, "5%", "10%", "J", "0.2"),
          rating: fc.option(
            fc.record(
              { volts: fc.constantFrom(310, "250V", "1k"), class: fc.constantFrom("X2", "Y1") },
              { requiredKeys: [] },
            ),
            { nil: undefined },
          ),
          marking: fc.option(text, { nil: undefined }),
          note: fc.option(text, { nil: undefined }),
          model: fc.option(
            fc.dictionary(
              fc.constantFrom("vgt", "igt", "lp", "k", "r"),
              // each is possible for every key drawn (k must lie in (0, 1])
              fc.constantFrom("50u", 0.7, "3m", 1),
            ),
            { nil: undefined },
          ),
          polarised:
            kind === "capacitor"
              ? fc.option(fc.boolean(), { nil: undefined })
              : fc.constant(undefined),
          closed:
            kind === "switch"
              ? fc.option(fc.boolean(), { nil: undefined })
              : fc.constant(undefined),
        },
        { requiredKeys: ["pins"] },
      )
      .map((fields) => {
        const out: Record<string, unknown> = { ref, kind };
        for (const [k, v] of Object.entries(fields)) if (v !== undefined) out[k] = v;
        return out;
      });
  });
}

/** A valid raw record: parts with distinct refs, measurements and spacings on its own nets. */
export const validRawRecord: fc.Arbitrary<Record<string, unknown>> = fc
  .record({
    title: fc.string({ minLength: 1, maxLength: 60 }).filter((t) => /\S/.test(t)),
    summary: fc.option(text, { nil: undefined }),
    supply: fc.option(
      fc.record({ vrms: fc.constantFrom(230, 120, "240V"), hz: fc.constantFrom(50, 60) }),
      { nil: undefined },
    ),
    tags: fc.array(text, { maxLength: 3 }),
    partCount: fc.integer({ min: 1, max: 6 }),
  })
  .chain(({ title, summary, supply, tags, partCount }) =>
    fc
      .tuple(...Array.from({ length: partCount }, (_, i) => partArb(`P${i + 1}`)))
      .chain((parts) => {
        const used = [...new Set(parts.flatMap((p) => p.pins as string[]))];
        const usedNet = fc.constantFrom(...used);
        return fc
          .record({
            nets: fc.dictionary(
              usedNet,
              fc.record(
                {
                  role: fc.constantFrom("line", "neutral", "earth", "output"),
                  accessible: fc.boolean(),
                },
                { requiredKeys: [] },
              ),
              { maxKeys: 3 },
            ),
            measurements: fc.array(
              fc.oneof(
                fc.record({
                  what: fc.constant("input.current_rms"),
                  value: fc.constantFrom("24.1m", 0.02),
                  uncertainty: fc.constantFrom("2%", "0.5m"),
                }),
                fc.record({
                  what: fc.constant("voltage.dc"),
                  value: fc.constantFrom(-5, "310V"),
                  between: fc.tuple(usedNet, usedNet),
                }),
                fc.record({
                  what: fc.constant("part.power"),
                  value: fc.constantFrom("1.2", 0.5),
                  part: fc.constantFrom(...parts.map((p) => p.ref as string)),
                  supply: fc.constant({ vrms: 120, hz: 60 }),
                }),
              ),
              { maxLength: 3 },
            ),
            spacings: fc.array(
              fc.record(
                {
                  between: fc.tuple(usedNet, usedNet),
                  creepage_mm: fc.double({ min: 0, max: 20, noNaN: true }),
                  slot: fc.boolean(),
                  pollution_degree: fc.constantFrom(1, 2, 3),
                },
                { requiredKeys: ["between"] },
              ),
              { maxLength: 2 },
            ),
          })
          .map(({ nets, measurements, spacings }) => {
            const raw: Record<string, unknown> = {
              record: 1,
              title,
              parts,
              nets,
              measurements,
              board: { spacings },
            };
            if (summary !== undefined) raw.summary = summary;
            raw.device = supply === undefined ? { tags } : { rated_supply: supply, tags };
            return raw;
          });
      }),
  );
