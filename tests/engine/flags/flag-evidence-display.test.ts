/**
 * Evidence reads as sentences "label: value unit" in the readable report (the CLI), with SI
 * prefixes on SI units and plain numbers on the trade's own (%, mm, ppm, °).
 */
import { describe, expect, it } from "vitest";
import { evidenceSentence } from "../../../analysis-worker/src/cli/readable-report.js";

describe("an evidence sentence in the readable report", () => {
  it.each([
    [{ label: "time constant", value: 2.2, unit: "s" }, "time constant: 2.2 s"],
    [
      { label: "capacitance at the plug pins", value: 4.7e-7, unit: "F" },
      "capacitance at the plug pins: 470 nF",
    ],
    [
      { label: "pin voltage after the delay", value: 38.7412, unit: "V" },
      "pin voltage after the delay: 38.7 V",
    ],
    [{ label: "creepage required", value: 2.5, unit: "mm" }, "creepage required: 2.5 mm"],
    [{ label: "share of the rating", value: 91.969, unit: "%" }, "share of the rating: 92 %"],
    [{ label: "firing angle", value: 87.46, unit: "°" }, "firing angle: 87.5°"],
    [{ label: "OSHA PEL", value: 0.1, unit: "ppm" }, "OSHA PEL: 0.1 ppm"],
    [{ label: "insulation", value: "reinforced", unit: "" }, "insulation: reinforced"],
    [
      { label: "equivalent time constant", value: null, unit: "s" },
      "equivalent time constant: not computed",
    ],
  ])("%o reads %s", (e, sentence) => {
    expect(evidenceSentence(e)).toBe(sentence);
  });
});
