/**
 * The entry pages' pure helpers: the form editor's round trip through the record format, where
 * the engine's problems land beside fields, re-applying edits after a stale save, and the
 * engineering-notation display. Expectations come from the engine's own reading of the demo
 * records and from hand-worked cases.
 */
import { readFileSync, readdirSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { parseRecord, serializeRecord } from "@teardown/engine";
import {
  documentFromForm,
  formFromDocument,
  newPart,
} from "@/app/components/entry/form/form-state";
import { fieldPaths, placeProblems } from "@/app/components/entry/form/place-errors";
import { mergeEdits } from "@/app/components/entry/form/merge-edits";
import { NOT_COMPUTED, evidenceText, percent, si } from "@/app/components/entry/si-units";

const RECORDS = fileURLToPath(new URL("../../seed-demo/records/", import.meta.url));

/** The stored document of a record file, as the API keeps it (the engine's JSON serialisation). */
function storedDocument(file: string): Record<string, unknown> {
  const read = parseRecord(readFileSync(RECORDS + file, "utf8"), { filename: file });
  if (!read.ok) throw new Error(`demo record ${file} does not read: ${read.errors[0]?.message}`);
  return JSON.parse(serializeRecord(read.record, "json")) as Record<string, unknown>;
}

function readBack(doc: unknown) {
  const read = parseRecord(JSON.stringify(doc, null, 2), { filename: "form.json" });
  if (!read.ok) throw new Error(`${read.errors[0]?.path}: ${read.errors[0]?.message}`);
  return read.record;
}

describe("the form editor's state", () => {
  for (const file of readdirSync(RECORDS).filter((f) => f.endsWith(".yaml"))) {
    it(`gives back the same record for ${file} when nothing is edited`, () => {
      const doc = storedDocument(file);
      expect(readBack(documentFromForm(formFromDocument(doc)))).toEqual(readBack(doc));
    });
  }

  it("writes an edited value as typed, so the engine reads the new value", () => {
    const state = formFromDocument(storedDocument("dimmbo-lamp-dimmer.yaml"));
    const i = state.parts.findIndex((p) => p.kind === "capacitor");
    state.parts[i] = { ...state.parts[i]!, value: "4n7" };
    // IEC 60062 letter code: 4n7 is 4.7 nF.
    expect(readBack(documentFromForm(state)).parts[i]!.value).toBeCloseTo(4.7e-9, 20);
  });

  it("gives a new thyristor the engine's three pin roles in order", () => {
    expect(newPart("thyristor").pins.map((p) => p.role)).toEqual(["anode", "gate", "cathode"]);
  });
});

describe("placing the engine's problems beside fields", () => {
  const state = formFromDocument(storedDocument("dimmbo-lamp-dimmer.yaml"));
  const fields = fieldPaths(state);

  it("puts a rating problem at the rating field of that part", () => {
    const placed = placeProblems([{ path: "parts[1].rating.volts", message: "x" }], fields);
    expect([...placed.at.keys()]).toEqual(["parts[1].rating.volts"]);
  });

  it("puts a pin problem under the part's pins, not under a longer lookalike path", () => {
    const placed = placeProblems([{ path: "parts[1].pins.gate", message: "x" }], fields);
    expect([...placed.at.keys()]).toEqual(["parts[1].pins"]);
  });

  it("keeps parts[1] apart from parts[10]", () => {
    const placed = placeProblems([{ path: "parts[10].value", message: "x" }], fields);
    expect(placed.at.has("parts[1]")).toBe(false);
    expect([...placed.at.keys()]).toEqual(["parts"]);
  });

  it("lists a problem with no field of its own above the form", () => {
    const placed = placeProblems([{ path: "", message: "the file is empty" }], fields);
    expect(placed.unplaced).toHaveLength(1);
  });
});

describe("re-applying edits on a newer revision", () => {
  const base = storedDocument("dimmbo-lamp-dimmer.yaml");
  const withValue = (doc: Record<string, unknown>, ref: string, value: string) => ({
    ...doc,
    parts: (doc.parts as Record<string, unknown>[]).map((p) =>
      p.ref === ref ? { ...p, value } : p,
    ),
  });
  const valueOf = (doc: Record<string, unknown>, ref: string) =>
    (doc.parts as Record<string, unknown>[]).find((p) => p.ref === ref)?.value;

  it("keeps both people's changes when they touched different parts", () => {
    const out = mergeEdits(base, withValue(base, "R1", "4k7"), withValue(base, "C1", "150n"));
    expect(valueOf(out.merged, "R1")).toBe("4k7");
    expect(valueOf(out.merged, "C1")).toBe("150n");
    expect(out.conflicts).toEqual([]);
  });

  it("keeps the editor's version and names the part when both changed it", () => {
    const out = mergeEdits(base, withValue(base, "R1", "4k7"), withValue(base, "R1", "2k2"));
    expect(valueOf(out.merged, "R1")).toBe("4k7");
    expect(out.conflicts).toEqual(["part R1"]);
  });

  it("drops a part the newer revision removed when the editor left it alone", () => {
    const theirs = {
      ...base,
      parts: (base.parts as Record<string, unknown>[]).filter((p) => p.ref !== "C2"),
    };
    const out = mergeEdits(base, withValue(base, "R1", "4k7"), theirs);
    expect(valueOf(out.merged, "C2")).toBeUndefined();
    expect(readBack(out.merged).parts.some((p) => p.ref === "C2")).toBe(false);
  });
});

describe("numbers for people", () => {
  it("writes 0.0241 A as 24.1 mA (hand conversion)", () => expect(si(0.0241, "A")).toBe("24.1 mA"));
  it("carries 0.99996 W to the next prefix instead of 1000 mW", () =>
    expect(si(0.99996, "W")).toBe("1 W"));
  it("writes 330e-9 F as 330 nF", () => expect(si(330e-9, "F")).toBe("330 nF"));
  it("uses the micro sign for 4.7e-6", () => expect(si(4.7e-6, "A")).toBe("4.7 µA"));
  it("says not computed for a missing figure", () => expect(si(undefined, "V")).toBe(NOT_COMPUTED));
  it("writes a THD of 0.031 as 3.1 %", () => expect(percent(0.031)).toBe("3.1 %"));
  it("reads the unit from an evidence key", () =>
    expect(evidenceText("voltage_peak_v", 4320)).toBe("4.32 kV"));
});
