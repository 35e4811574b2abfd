/**
 * The one table of what each flag stands on: the published document (standard with edition and
 * clause, datasheet family, regulation) or "common practice" for trade facts. Every flag takes
 * its `source_id` and `source` from here, so a reader sees the same words for the same rule.
 *
 * The text is what a user reads: it names the document, never our notes and never how sure we
 * are. How each entry was checked is kept in the comments beside it:
 * - FOUND: read in a reproduction of the document (test-report form, vendor page, forum quote);
 * - MEMORY: recalled, to be checked against a purchased copy before it is relied on.
 */

/** One citation: the document (or "common practice") in words a user reads. */
export interface Citation {
  /** What kind of document it is: a published document, or a trade fact. */
  kind: "standard" | "regulation" | "datasheet" | "practice";
  text: string;
}

/** Every citation by id. */
export const CITATIONS = {
  // Clause 8.1 and 8.1.4 text FOUND (forum quotes of the test text); edition 5 MEMORY.
  "iec-60335-1-access": {
    kind: "standard",
    text: "IEC 60335-1:2010 (Ed. 5), clause 8.1, protection against access to live parts (8.1.4: protective impedance, at most 0.7 mA peak a.c.)",
  },
  // 22.5 test text FOUND (forum quote); 2.1.1.7 text FOUND (forum quote); editions MEMORY.
  "capacitor-discharge": {
    kind: "standard",
    text: "IEC 60335-1:2010 (Ed. 5), clause 22.5: at most 34 V between the plug pins 1 s after unplugging at the voltage peak, where the capacitance exceeds 0.1 µF; IEC 60950-1:2005 (Ed. 2), clause 2.1.1.7: a discharge time constant of at most 1 s for pluggable equipment type A",
  },
  // Subclass table FOUND (several reproductions); edition 4 (2013) MEMORY. Series use of X2 parts:
  // FOUND in a film-capacitor maker's application page; that Y1/Y2 may stand in: MEMORY.
  "iec-60384-14-x": {
    kind: "standard",
    text: "IEC 60384-14:2013 (Ed. 4), subclasses X1, X2 and X3 for capacitors across or in series with the mains; a capacitor in series with the mains is, in common practice, an X2 film part its maker rates for series use",
  },
  "iec-60384-14-y": {
    kind: "standard",
    text: "IEC 60384-14:2013 (Ed. 4), subclasses Y1 to Y4 for capacitors that bridge basic or reinforced insulation",
  },
  // Tables F.1 and F.4 FOUND (catalogue reproductions); F.2 FOUND for 1.5 to 8 kV, smaller rows MEMORY;
  // twice the creepage for reinforced insulation MEMORY; one impulse step up FOUND (isolator datasheet).
  "iec-60664-1-spacing": {
    kind: "standard",
    text: "IEC 60664-1:2007 (Ed. 2), Table F.1 (rated impulse voltage, overvoltage category II), Table F.2 case A (clearances) and Table F.4 (creepage distances); reinforced insulation takes twice the creepage and the clearance of the next impulse step",
  },
  // Limiting element and overload voltages FOUND in both datasheet families; the thresholds are ours.
  "resistor-datasheet-ratings": {
    kind: "datasheet",
    text: "carbon-film (Yageo CFR series) and thick-film chip (Yageo RC series) resistor datasheets: limiting element voltage stated as DC or AC RMS, short-time overload voltage, rated power by package; warning thresholds: common practice",
  },
  "part-rating": {
    kind: "practice",
    text: "common practice: the part's stated rating on the basis it is stated in, with a warning at 80 % of a voltage rating or when a +10 % mains would pass an AC rating",
  },
  "power-derating": {
    kind: "practice",
    text: "common practice: mean dissipation against the rated continuous power, with a warning past 50 % of it",
  },
  // I_FSM 30 A, 8.3 ms half-sine FOUND in several vendors' 1N4001-1N4007 datasheets.
  "rectifier-surge": {
    kind: "datasheet",
    text: "1N4001–1N4007 rectifier datasheets: non-repetitive peak surge current I_FSM 30 A (8.3 ms single half-sine); switching on at the supply crest: common practice",
  },
  // OSHA, NIOSH, FDA, CARB and ACGIH values FOUND (copies of the agency pages); IEC 60335-2-65 MEMORY.
  "ozone-limits": {
    kind: "regulation",
    text: "OSHA 29 CFR 1910.1000 Table Z-1 (0.1 ppm, 8-hour average); NIOSH recommended exposure limit (0.1 ppm ceiling); FDA 21 CFR 801.415 (0.05 ppm); California 17 CCR 94800 ff. with the ANSI/UL 867 test (0.050 ppm); ACGIH TLV for heavy work (0.05 ppm); IEC 60335-2-65, clause 32 (0.05 ppm)",
  },
  "common-practice": { kind: "practice", text: "common practice" },
  "tolerance-analysis": {
    kind: "practice",
    text: "common practice: a tolerance band from random samples of the parts within their tolerances, and each part's sensitivity by small changes of its value",
  },
} as const satisfies Record<string, Citation>;

export type CitationId = keyof typeof CITATIONS;

/** The citation fields of a flag for an id. */
export function cite(id: CitationId): { source_id: CitationId; source: string } {
  return { source_id: id, source: CITATIONS[id].text };
}
