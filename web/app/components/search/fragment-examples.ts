/**
 * A small example fragment in each format the fragment box takes: a dropper capacitor with its
 * bleeder resistor across it, feeding a rectifier diode. Values are left out on purpose; the
 * search matches by kinds and connections.
 */
import type { FragmentFormat } from "../../client/api-types";

export const FRAGMENT_EXAMPLES: Record<FragmentFormat, string> = {
  deck: ["Dropper with bleeder", "C1 X Y", "R1 X Y", "D1 Y Z", ".end"].join("\n"),
  csv: ["ref,kind,pins", "C1,capacitor,X Y", "R1,resistor,X Y", "D1,diode,anode=Y cathode=Z"].join(
    "\n",
  ),
  record: [
    "record: 1",
    "title: Dropper with bleeder",
    "parts:",
    "  - { ref: C1, kind: capacitor, pins: [X, Y] }",
    "  - { ref: R1, kind: resistor, pins: [X, Y] }",
    "  - { ref: D1, kind: diode, pins: { anode: Y, cathode: Z } }",
  ].join("\n"),
};

/** What each format is called in the picker. */
export const FORMAT_NAMES: Record<FragmentFormat, string> = {
  deck: "netlist deck",
  csv: "CSV parts list",
  record: "teardown record (YAML)",
};
