import { Suspense } from "react";
import { currentCaller } from "../components/current-caller";
import { SearchView } from "../components/search/search-view";

export const dynamic = "force-dynamic";

export const metadata = { title: "Search · Teardown Ledger" };

/** /search: words and facts, similar circuits (?similar=ENTRY_ID) and circuit fragments. */
export default async function SearchPage() {
  const caller = await currentCaller();
  return (
    <>
      <h1>Search</h1>
      <p className="muted">
        {caller
          ? "Searches your teams' entries and every public entry."
          : "Searches public entries; sign in to include your teams' entries."}
      </p>
      {/* The view reads the URL's query string, which only the browser has at first render. */}
      <Suspense fallback={<p className="muted">Loading search…</p>}>
        <SearchView />
      </Suspense>
    </>
  );
}
