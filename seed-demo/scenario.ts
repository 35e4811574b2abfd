/**
 * The invented demo scenario: a small product-safety lab of our own invention and the gadgets
 * it opened. Nothing here describes a real lab, person or product.
 */
export const DEMO_TEAM = {
  name: "Fernhollow Product Safety Lab (demo)",
  slug: "fernhollow-demo",
} as const;
