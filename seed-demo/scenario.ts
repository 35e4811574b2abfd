/**
 * The invented demo scenario: a small product-safety lab of our own invention and the gadgets
 * it opened. Nothing here describes a real lab, person or product.
 */
export const DEMO_TEAM = {
  name: "Fernhollow Product Safety Lab (demo)",
  slug: "fernhollow-demo",
} as const;

/** The demo entries: each a record file under records/, and whether it is public. */
export const DEMO_ENTRIES: ReadonlyArray<{
  file: string;
  visibility: "team" | "public";
  message: string;
}> = [
  {
    file: "glowmoth-night-light.yaml",
    visibility: "public",
    message: "First trace from both sides",
  },
  {
    file: "puffwick-fragrance-warmer.yaml",
    visibility: "public",
    message: "Traced after the heater failed open",
  },
  {
    file: "breezel-desk-ionizer.yaml",
    visibility: "team",
    message: "HV stage traced with the board discharged",
  },
  { file: "dimmbo-lamp-dimmer.yaml", visibility: "public", message: "Pot measured at mid travel" },
  {
    file: "tockly-wall-clock-supply.yaml",
    visibility: "team",
    message: "Adaptor board only; movement not opened",
  },
  {
    file: "snugglet-hand-warmer.yaml",
    visibility: "team",
    message: "Market-stall sample, side plate tied to the return",
  },
];
