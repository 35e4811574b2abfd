/**
 * Small valid record documents (record format version 1, as stored in revisions) for tests
 * that need many revisions: a capacitive-dropper night light whose dropper value varies.
 */

/** A dropper night light; `variant` changes the dropper capacitor so records differ. */
export function nightLightDoc(variant = 0): Record<string, unknown> {
  const dropperNano = 220 + (variant % 50) * 10;
  return {
    record: 1,
    title: `Test night light ${variant}`,
    device: { category: "night light", rated_supply: { vrms: 230, hz: 50 }, tags: ["test"] },
    parts: [
      {
        ref: "C1",
        kind: "capacitor",
        value: `${dropperNano}n`,
        rating: { volts: 310, class: "X2" },
        pins: ["L", "A"],
      },
      { ref: "R1", kind: "resistor", value: "1M", pins: ["L", "A"] },
      { ref: "R2", kind: "resistor", value: "100", pins: ["A", "B"] },
      { ref: "D1", kind: "diode", pins: { anode: "B", cathode: "P" } },
      { ref: "D2", kind: "diode", pins: { anode: "N", cathode: "P" } },
      { ref: "D3", kind: "diode", pins: { anode: "M", cathode: "B" } },
      { ref: "D4", kind: "diode", pins: { anode: "M", cathode: "N" } },
      {
        ref: "C2",
        kind: "capacitor",
        value: "47u",
        polarised: true,
        pins: { plus: "P", minus: "M" },
      },
      { ref: "LED1", kind: "led", pins: { anode: "P", cathode: "M" } },
    ],
    nets: { L: { role: "line" }, N: { role: "neutral" } },
  };
}

/** A document the engine rejects: a value that is no value and a pin role a resistor lacks. */
export function brokenDoc(): Record<string, unknown> {
  const doc = nightLightDoc(0);
  (doc.parts as Array<Record<string, unknown>>)[1] = {
    ref: "R1",
    kind: "resistor",
    value: "lots",
    pins: { gate: "L", b: "A" },
  };
  return doc;
}

/** A long resistor-capacitor ladder of `rungs` sections: valid, and slow to analyse when long. */
export function ladderDoc(rungs: number): Record<string, unknown> {
  const parts: Array<Record<string, unknown>> = [
    { ref: "F1", kind: "fuse", value: "1", pins: ["L", "n0"] },
  ];
  for (let i = 0; i < rungs; i++) {
    parts.push({ ref: `R${i + 1}`, kind: "resistor", value: "10k", pins: [`n${i}`, `n${i + 1}`] });
    parts.push({ ref: `C${i + 1}`, kind: "capacitor", value: "10n", pins: [`n${i + 1}`, "N"] });
  }
  return {
    record: 1,
    title: `Ladder of ${rungs}`,
    device: { category: "test", rated_supply: { vrms: 230, hz: 50 } },
    parts,
    nets: { L: { role: "line" }, N: { role: "neutral" } },
  };
}
