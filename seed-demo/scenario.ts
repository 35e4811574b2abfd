/**
 * The invented demo scenario: a small product-safety lab of our own invention, its members, and
 * a year of gadgets it opened. Nothing here describes a real lab, person, brand or product;
 * the e-mail addresses use the reserved `.example` domain. Each entry is a list of record files
 * under records/ (the last is the current revision) with comments by the lab's members.
 */

export const DEMO_TEAM = {
  name: "Fernhollow Product Safety Lab (demo)",
  slug: "fernhollow-demo",
} as const;

/**
 * The demo members' shared password. It is printed by `npm start` and written in the README on
 * purpose: the demo team holds only invented data, and a newcomer needs a way in.
 */
export const DEMO_PASSWORD = "fernhollow-demo-lab";

export type MemberKey = "maren" | "dev" | "juno" | "arlo";

/** The lab's members: each a real account that signs in with DEMO_PASSWORD. */
export const DEMO_MEMBERS: ReadonlyArray<{
  key: MemberKey;
  name: string;
  email: string;
  role: "owner" | "editor" | "viewer";
}> = [
  { key: "maren", name: "Maren Oakhollow", email: "maren@fernhollow.example", role: "owner" },
  { key: "dev", name: "Dev Pallister", email: "dev@fernhollow.example", role: "editor" },
  { key: "juno", name: "Juno Rask", email: "juno@fernhollow.example", role: "editor" },
  { key: "arlo", name: "Arlo Vennick", email: "arlo@fernhollow.example", role: "viewer" },
];

/** The member whose sign-in `npm start` prints. */
export const DEMO_SIGN_IN: MemberKey = "maren";

/** One revision: a record file (relative to records/), who saved it, why, and when. */
export interface DemoRevision {
  file: string;
  author: MemberKey;
  message: string;
  /** ISO date the revision was saved, within the lab's year. */
  at: string;
}

/** A comment on an entry, or on one part of it. */
export interface DemoComment {
  author: MemberKey;
  body: string;
  partRef?: string;
  at: string;
}

/** One demo entry: its revisions oldest first, who may read it, and the talk about it. */
export interface DemoEntry {
  slug: string;
  visibility: "team" | "public";
  revisions: readonly DemoRevision[];
  comments: readonly DemoComment[];
}

const rev = (file: string, author: MemberKey, at: string, message: string): DemoRevision => ({
  file,
  author,
  at,
  message,
});
const say = (author: MemberKey, at: string, body: string, partRef?: string): DemoComment =>
  partRef === undefined ? { author, at, body } : { author, at, body, partRef };

/** The demo entries, in the order the lab opened the gadgets. */
export const DEMO_ENTRIES: readonly DemoEntry[] = [
  {
    slug: "glowmoth-night-light",
    visibility: "public",
    revisions: [
      rev("glowmoth-night-light.yaml", "maren", "2026-01-12", "First trace from both sides"),
    ],
    comments: [
      say(
        "dev",
        "2026-01-13",
        "R1 is a quarter-watt carbon film straight across the dropper: it sees the full mains peak.",
        "R1",
      ),
      say(
        "maren",
        "2026-01-14",
        "The LED rail reads lower than predicted. Worth checking C1 out of circuit before we blame the meter.",
      ),
      say(
        "arlo",
        "2026-01-20",
        "Measured C1 on the bridge after desoldering: 178 nF. The 334 marking is optimistic, or it has lost capacitance.",
        "C1",
      ),
    ],
  },
  {
    slug: "puffwick-fragrance-warmer",
    visibility: "public",
    revisions: [
      rev(
        "puffwick-fragrance-warmer.yaml",
        "juno",
        "2026-01-28",
        "Traced after the heater failed open",
      ),
    ],
    comments: [
      say(
        "juno",
        "2026-01-29",
        "No fuse anywhere; the heater failing open was the only thing that stopped it.",
      ),
      say(
        "maren",
        "2026-02-02",
        "470 k across a 1 µF dropper discharges too slowly for the pins. Noted for the report.",
      ),
    ],
  },
  {
    slug: "breezel-desk-ionizer",
    visibility: "team",
    revisions: [
      rev(
        "breezel-desk-ionizer.yaml",
        "dev",
        "2026-02-16",
        "HV stage traced with the board discharged",
      ),
    ],
    comments: [
      say(
        "dev",
        "2026-02-16",
        "Discharged C1 through a 10 k probe before touching anything. It held about 280 V.",
      ),
      say(
        "juno",
        "2026-02-18",
        "Input power reads twice the prediction. The corona leakage is a guess; E1 is what to question.",
        "E1",
      ),
    ],
  },
  {
    slug: "dimmbo-lamp-dimmer",
    visibility: "public",
    revisions: [rev("dimmbo-lamp-dimmer.yaml", "arlo", "2026-03-03", "Pot measured at mid travel")],
    comments: [
      say(
        "arlo",
        "2026-03-03",
        "First trace of my own. The lamp was a 100 W bulb from the drawer.",
      ),
      say(
        "maren",
        "2026-03-05",
        "The meter says 48 W and the trace says nearly 100. The hot lamp resistance is the weak figure here.",
        "LP1",
      ),
    ],
  },
  {
    slug: "tockly-wall-clock-supply",
    visibility: "team",
    revisions: [
      rev(
        "tockly-wall-clock-supply.yaml",
        "juno",
        "2026-03-19",
        "Adaptor board only; movement not opened",
      ),
    ],
    comments: [
      say(
        "juno",
        "2026-03-19",
        "A proper transformer for once. The 9 V rail reaches the battery door but it is isolated.",
      ),
      say(
        "dev",
        "2026-03-21",
        "Agrees with the prediction within the meter's error. Nothing to add.",
      ),
    ],
  },
  {
    slug: "snugglet-hand-warmer",
    visibility: "team",
    revisions: [
      rev(
        "snugglet-hand-warmer.yaml",
        "maren",
        "2026-04-07",
        "Market-stall sample, side plate tied to the return",
      ),
    ],
    comments: [
      say(
        "maren",
        "2026-04-07",
        "The metal side plate is tied to the heater return through R1. With the plug reversed it is on the line side of the heater.",
        "R1",
      ),
      say(
        "dev",
        "2026-04-08",
        "0.9 mm from L to the side plate. Withdrawn from the sample shelf and tagged.",
      ),
      say(
        "arlo",
        "2026-04-10",
        "Photographed the label for the incident file; no maker's name on it at all.",
      ),
    ],
  },
  {
    slug: "lumora-led-bulb-l24a",
    visibility: "public",
    revisions: [
      rev(
        "lumora-led-bulb-l24a.yaml",
        "dev",
        "2026-04-22",
        "Driver board L24A traced; LED board rung out",
      ),
    ],
    comments: [
      say(
        "dev",
        "2026-04-22",
        "Only a 10 Ω fusible resistor ahead of the bridge: a plug-in at the crest is well over the diodes' surge rating.",
        "RF1",
      ),
      say("juno", "2026-04-24", "Sixteen lamps from the same box: all of them board L24A."),
    ],
  },
  {
    slug: "lumora-led-bulb-l24c",
    visibility: "team",
    revisions: [
      rev(
        "history/lumora-led-bulb-l24c.r1.yaml",
        "juno",
        "2026-05-06",
        "Batch L24C driver, first pass",
      ),
      rev(
        "lumora-led-bulb-l24c.yaml",
        "juno",
        "2026-05-08",
        "Found R3 under the glue across the reservoir",
      ),
    ],
    comments: [
      say(
        "juno",
        "2026-05-06",
        "New layout and new designators. Compare with L24A: the dropper is 564 now, the fusible resistor 22 Ω.",
      ),
      say(
        "maren",
        "2026-05-07",
        "The input current is too high for a 560 nF dropper. Measure C1 off the board before we call it a misprint.",
        "C1",
      ),
      say(
        "juno",
        "2026-05-08",
        "There was a 150 k bleeder hidden under the glue blob across C2. Added as R3.",
        "R3",
      ),
      say(
        "dev",
        "2026-05-12",
        "C1 measured 671 nF out of circuit. The hint was right: a 684 body with a 564 print.",
      ),
    ],
  },
  {
    slug: "glowmoth-night-light-batch2",
    visibility: "team",
    revisions: [
      rev(
        "glowmoth-night-light-batch2.yaml",
        "arlo",
        "2026-05-27",
        "Batch 2 traced against batch 1",
      ),
    ],
    comments: [
      say(
        "arlo",
        "2026-05-27",
        "Only two LEDs now; the third pad is bridged with solder. C1 went from 334 to 224.",
      ),
      say(
        "maren",
        "2026-05-28",
        "Same quarter-watt bleeder straight across the mains as batch 1. Still over its voltage.",
        "R1",
      ),
    ],
  },
  {
    slug: "thermbrook-heater-controller",
    visibility: "team",
    revisions: [
      rev(
        "history/thermbrook-heater-controller.r1.yaml",
        "dev",
        "2026-06-15",
        "Controller traced; element from the rating plate",
      ),
      rev(
        "thermbrook-heater-controller.yaml",
        "dev",
        "2026-06-18",
        "Element is a 1.1 kW spare, not the rated 1.5 kW",
      ),
    ],
    comments: [
      say(
        "dev",
        "2026-06-15",
        "Power and current both read low against the trace. The element is the first suspect.",
        "HE1",
      ),
      say(
        "juno",
        "2026-06-17",
        "Measured the element cold and warmed: about 47 Ω hot. Someone fitted a 1.1 kW spare.",
        "HE1",
      ),
      say(
        "maren",
        "2026-06-18",
        "Good catch. The snubber resistor runs warm at this angle; worth a note in the report.",
        "R3",
      ),
    ],
  },
  {
    slug: "zaptrel-bug-zapper",
    visibility: "public",
    revisions: [
      rev(
        "history/zaptrel-bug-zapper.r1.yaml",
        "juno",
        "2026-07-02",
        "Multiplier traced; capacitor values from the faded print",
      ),
      rev(
        "history/zaptrel-bug-zapper.r2.yaml",
        "juno",
        "2026-07-03",
        "Capacitors are 473, bleeder is 100 M",
      ),
      rev("zaptrel-bug-zapper.yaml", "dev", "2026-07-09", "Added the line-to-neutral spacing"),
    ],
    comments: [
      say(
        "juno",
        "2026-07-02",
        "Discharged the grid with the insulated probe twice; it recovers a little after the first.",
      ),
      say(
        "juno",
        "2026-07-03",
        "The first pass read the capacitors as 103; under the loupe they are 473. Fixed in the second revision.",
      ),
      say(
        "arlo",
        "2026-07-05",
        "The grid sits behind the outer mesh and a cage. Finger probe could not reach it.",
      ),
    ],
  },
  {
    slug: "whirlby-fan-speed-control",
    visibility: "team",
    revisions: [
      rev("whirlby-fan-speed-control.yaml", "arlo", "2026-07-28", "Traced at a third of travel"),
    ],
    comments: [
      say(
        "arlo",
        "2026-07-28",
        "The fan stalls at low speed when the kitchen kettle is on. The trigger margin explains it.",
      ),
      say(
        "dev",
        "2026-07-30",
        "The minimum-speed trimmer is the knob to turn for that; it was set at the edge.",
        "VR2",
      ),
    ],
  },
  {
    slug: "tickwell-timer-socket",
    visibility: "team",
    revisions: [
      rev(
        "tickwell-timer-socket.yaml",
        "maren",
        "2026-08-19",
        "Relay supply traced with the relay on",
      ),
    ],
    comments: [
      say(
        "maren",
        "2026-08-19",
        "The LCD frame and the buttons sit on the 12 V rail, which is not isolated. The front is one plastic moulding, so they are out of reach.",
      ),
      say(
        "juno",
        "2026-08-20",
        "No fuse: the flameproof resistor is the only thing that opens.",
        "R3",
      ),
    ],
  },
  {
    slug: "dingsby-door-chime",
    visibility: "team",
    revisions: [
      rev("dingsby-door-chime.yaml", "juno", "2026-09-08", "Chime traced with the button held"),
    ],
    comments: [
      say(
        "juno",
        "2026-09-08",
        "Bell transformer with a thermal link wound in. Plenty of distance to the bell wire.",
      ),
      say("arlo", "2026-09-09", "Agrees with the prediction. A quiet one for the collection."),
    ],
  },
  {
    slug: "voltplum-battery-charger",
    visibility: "team",
    revisions: [
      rev(
        "voltplum-battery-charger.yaml",
        "dev",
        "2026-09-30",
        "Opened after a customer complaint of a tingle",
      ),
    ],
    comments: [
      say("dev", "2026-09-30", "The battery springs are live. The tingle complaint is real."),
      say(
        "maren",
        "2026-10-01",
        "Quarantined. C1 is a 250 V DC film with no class in series with the mains.",
        "C1",
      ),
      say("juno", "2026-10-02", "0.8 mm between the line track and the battery spring track."),
    ],
  },
  {
    slug: "mossquell-mat-heater",
    visibility: "team",
    revisions: [
      rev("mossquell-mat-heater.yaml", "arlo", "2026-10-21", "Heater pair and pilot traced"),
    ],
    comments: [
      say("arlo", "2026-10-21", "R3 is browned and the board under it is darkened.", "R3"),
      say(
        "dev",
        "2026-10-22",
        "It reads low on power once the plate is hot. Metal-oxide parts drift up with heat, so R1 and R2 hot are higher than their cold reading.",
        "R1",
      ),
    ],
  },
  {
    slug: "plugmint-smart-plug-supply",
    visibility: "team",
    revisions: [
      rev(
        "plugmint-smart-plug-supply.yaml",
        "maren",
        "2026-11-10",
        "Supply traced, relay on, no load",
      ),
    ],
    comments: [
      say(
        "maren",
        "2026-11-10",
        "A 1.5 µF dropper for a radio and a relay. The bleeder pair is too slow for it.",
      ),
      say(
        "juno",
        "2026-11-11",
        "The surge resistor runs at half its rating. It is the hottest part on the board.",
        "R3",
      ),
    ],
  },
];
