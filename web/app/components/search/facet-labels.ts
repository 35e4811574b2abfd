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

/**
 * A value as people read it. Team ids become names: the server names the visitor's own teams
 * (the only ones the team facet lists); a team id picked in the URL that is not one of theirs is
 * never shown, not even in part.
 */
export function facetValueLabel(
  facet: Facet,
  value: string,
  teamNames: ReadonlyMap<string, string>,
  label?: string,
): string {
  switch (facet) {
    case "team":
      return label ?? teamNames.get(value) ?? "a team you are not in";
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
