/**
 * Every hand-made test circuit by name, for tests that run over all of them (blocks, fingerprint
 * properties, layout). Each call of `record()` builds a fresh copy.
 */
import type { TeardownRecord } from "@teardown/engine";
import * as mains from "./mains-circuits.js";
import * as nearMiss from "./near-miss-circuits.js";

/** A named test circuit. */
export interface TestCircuit {
  name: string;
  record: TeardownRecord;
  /** True for the circuits that imitate a block without being one. */
  nearMiss: boolean;
}

const FACTORIES: Array<[string, () => TeardownRecord, boolean]> = [
  ["night-light-dropper", mains.nightLightDropper, false],
  ["thyristor-igniter", mains.thyristorIgniter, false],
  ["triac-dimmer", mains.triacDimmer, false],
  ["half-wave-resistive", mains.halfWaveResistive, false],
  ["fused-transformer-supply", mains.fusedTransformerSupply, false],
  ["varistor-protected-input", mains.varistorProtectedInput, false],
  ["half-wave-dropper", mains.halfWaveDropper, false],
  ["neutral-side-dropper", mains.neutralSideDropper, false],
  ["thyristor-rc-heater", mains.thyristorRcHeater, false],
  ["resistive-led-indicator", mains.resistiveLedIndicator, false],
  ["capacitive-led-indicator", mains.capacitiveLedIndicator, false],
  ["two-diodes-in-series", nearMiss.twoDiodesInSeries, true],
  ["capacitor-across-supply", nearMiss.capacitorAcrossSupply, true],
  ["divider-feeding-nothing", nearMiss.dividerFeedingNothing, true],
  ["resistor-across-supply", nearMiss.resistorAcrossSupply, true],
  ["bridge-with-reversed-diode", nearMiss.bridgeWithReversedDiode, true],
  ["rc-snubber-across-supply", nearMiss.rcSnubberAcrossSupply, true],
];

/** All test circuits, fresh records each time the module is loaded. */
export const ALL_TEST_CIRCUITS: readonly TestCircuit[] = FACTORIES.map(([name, make, nm]) => ({
  name,
  record: make(),
  nearMiss: nm,
}));

/** A fresh copy of one test circuit's record, by name (throws for an unknown name: a test bug). */
export function testCircuit(name: string): TeardownRecord {
  const entry = FACTORIES.find(([n]) => n === name);
  if (entry === undefined) throw new Error(`no test circuit named ${name}`);
  return entry[1]();
}
