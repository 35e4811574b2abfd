/** Plain words for the search facets and their values (the API sends codes and ids). */
import type { Facet } from "./search-url";

/** Each facet's heading. */
export const FACET_TITLES: Record<Facet, string> = {
  team: "Team",
  category: "Category",
  supply: "Rated supply",
  block: "Block kinds",
  flag: "Flag codes",
  mismatch: "Measurements",
};

/** A value as people read it; team ids become names where the visitor knows the team. */
export function facetValueLabel(
  facet: Facet,
  value: string,
  teamNames: ReadonlyMap<string, string>,
): string {
  switch (facet) {
    case "team":
      return teamNames.get(value) ?? `another team (${value.slice(0, 8)})`;
    case "supply": {
      const [volts, hertz] = value.split("/");
      return hertz ? `${volts} V, ${hertz} Hz` : value;
    }
    case "block":
      return value.replace(/-/g, " ");
    case "mismatch":
      return value === "true" ? "has a measurement that disagrees" : "no disagreeing measurement";
    default:
      return value;
  }
}
