/**
 * The raw teardown record, version 1, as written in a file (docs/teardown-record.md): the
 * shape only. Value notation, pin roles and cross references are checked afterwards by
 * validate-record.ts, which also turns this raw shape into the normalised `TeardownRecord`.
 * The committed JSON Schema (schema/record-v1.schema.json) is generated from these schemas.
 */
import { z } from "zod";
import { MEASUREMENT_KINDS, NET_ROLES } from "./types.js";

/** Longest title, in characters (docs/teardown-record.md). */
export const MAX_TITLE_CHARS = 200;
/** Longest net name, part kind word and short text field, in characters. */
export const MAX_NAME_CHARS = 100;
/** Longest free-text field (summary, note), in characters. */
export const MAX_TEXT_CHARS = 100_000;

/** Part references: a letter, then letters, digits or underscores. */
export const REF_PATTERN = /^[A-Za-z][A-Za-z0-9_]*$/;
/** Net names: any run of non-blank characters. */
export const NET_NAME_PATTERN = /^\S+$/;

/** A value in the value notation (`330n`, `4k7`, `2.2e-7`, `310V`) or a plain number. */
export const ValueInput = z
  .union([z.string().max(MAX_NAME_CHARS), z.number()], {
    error: "expected a value such as 4.7k, 330n, 2.2e-7 or 4k7 (text or a number)",
  })
  .meta({
    description:
      "A value: a number, SI prefix (330n), exponent form (2.2e-7) or IEC 60062 code (4k7), optional unit symbol.",
  });

/** A net name; YAML reads `0` or `1` as a number, which is taken as the name "0" or "1". */
export const NetNameInput = z
  .union([z.string().max(MAX_NAME_CHARS).regex(NET_NAME_PATTERN), z.number().int().nonnegative()], {
    error: "expected a net name (text without spaces)",
  })
  .meta({ description: "A net name: text without spaces." });

/** A short text field; YAML reads `104` as a number, which the reader takes as its source text. */
const ShortText = z.string().max(MAX_NAME_CHARS);
const LongText = z.string().max(MAX_TEXT_CHARS);

/** A supply as written: RMS volts and hertz in the value notation. */
export const SupplyInput = z
  .strictObject({
    vrms: ValueInput.meta({ description: "RMS volts" }),
    hz: ValueInput.meta({ description: "frequency, hertz" }),
  })
  .meta({ description: "A mains supply: RMS volts and hertz." });

/** A part's ratings as written. */
export const RatingInput = z
  .strictObject({
    volts: ValueInput.optional(),
    amps: ValueInput.optional(),
    watts: ValueInput.optional(),
    class: ShortText.optional().meta({
      description: "safety class of a capacitor: X1, X2, Y1, Y2, ...",
    }),
    package: ShortText.optional().meta({
      description: "package or power class, e.g. 0805, CFR-25",
    }),
    surge_amps: ValueInput.optional().meta({ description: "non-repetitive surge current, amps" }),
  })
  .meta({ description: "Ratings as printed or taken from a datasheet." });

/** A part's pins: a list in the kind's order, or a role → net map. */
export const PinsInput = z
  .union(
    [
      z.array(NetNameInput).min(1).meta({ description: "net names in the kind's pin order" }),
      z
        .record(z.string().max(MAX_NAME_CHARS).regex(REF_PATTERN), NetNameInput)
        .meta({ description: "pin role -> net name" }),
    ],
    { error: "pins must be a list of net names or a map of pin role to net name" },
  )
  .meta({ description: "Where the part's pins go." });

/** One part as written. */
export const PartInput = z.strictObject({
  ref: z
    .string()
    .max(MAX_NAME_CHARS)
    .regex(REF_PATTERN, { error: "a ref is a letter, then letters, digits or _" }),
  kind: ShortText.min(1).meta({ description: "resistor, capacitor, diode, ... or any other word" }),
  value: ValueInput.nullable().optional(),
  tolerance: ValueInput.nullable().optional().meta({ description: "10%, or a letter F G J K M" }),
  rating: RatingInput.optional(),
  marking: ShortText.nullable().optional().meta({ description: "what is printed on the part" }),
  pins: PinsInput,
  polarised: z.boolean().optional(),
  closed: z.boolean().optional(),
  model: z.record(z.string().max(MAX_NAME_CHARS).regex(REF_PATTERN), ValueInput).optional(),
  note: LongText.nullable().optional(),
});

/** What the record says about one net. */
export const NetInput = z.strictObject({
  role: z.enum(NET_ROLES).nullable().optional(),
  accessible: z.boolean().optional().meta({ description: "a person can touch it in normal use" }),
  note: LongText.nullable().optional(),
});

/** Two net names: [from, to]. */
export const NetPairInput = z.tuple([NetNameInput, NetNameInput]);

/** One measurement as written. */
export const MeasurementInput = z.strictObject({
  what: z.enum(MEASUREMENT_KINDS),
  value: ValueInput,
  between: NetPairInput.optional().meta({ description: "voltage.* only: [from, to]" }),
  part: ShortText.optional().meta({ description: "part.* only: the part's ref" }),
  supply: SupplyInput.optional(),
  instrument: ShortText.nullable().optional(),
  uncertainty: ValueInput.nullable()
    .optional()
    .meta({ description: "relative (2%) or absolute (0.5m)" }),
});

/** One measured creepage/clearance between two nets. */
export const SpacingInput = z.strictObject({
  between: NetPairInput,
  creepage_mm: z.number().nonnegative().nullable().optional(),
  clearance_mm: z.number().nonnegative().nullable().optional(),
  slot: z.boolean().optional(),
  material_group: z.enum(["I", "II", "IIIa", "IIIb"]).optional(),
  pollution_degree: z.union([z.literal(1), z.literal(2), z.literal(3)]).optional(),
});

/** The device as a whole: category, rated supply, tags. */
export const DeviceInput = z.strictObject({
  category: ShortText.nullable().optional(),
  rated_supply: SupplyInput.optional(),
  tags: z.array(ShortText).optional(),
});

/** The whole raw record, version 1. */
export const RecordInput = z
  .strictObject({
    record: z.literal(1, { error: "record must be 1 (this reader knows version 1 of the record)" }),
    title: z
      .string()
      .max(MAX_TITLE_CHARS)
      .regex(/\S/, { error: "the title must not be empty or blank" }),
    summary: LongText.nullable().optional(),
    device: DeviceInput.optional(),
    parts: z.array(PartInput),
    nets: z.record(z.string().max(MAX_NAME_CHARS).regex(NET_NAME_PATTERN), NetInput).optional(),
    measurements: z.array(MeasurementInput).optional(),
    board: z.strictObject({ spacings: z.array(SpacingInput).optional() }).optional(),
  })
  .meta({
    title: "Teardown record, version 1",
    description: "A traced mains-gadget teardown: parts, nets, measurements and board spacings.",
  });

/** Raw (as-written) types of the record and its sections. */
export type RawRecord = z.input<typeof RecordInput>;
export type RawPart = z.input<typeof PartInput>;
export type RawMeasurement = z.input<typeof MeasurementInput>;
export type RawSpacing = z.input<typeof SpacingInput>;
export type RawSupply = z.input<typeof SupplyInput>;
export type RawNet = z.input<typeof NetInput>;
