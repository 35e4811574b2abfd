import { and, desc, eq, isNull } from "drizzle-orm";
import Link from "next/link";
import { schema } from "@teardown/db";
import { database } from "@/lib/database";
import { currentCaller } from "./components/current-caller";
import { SafetyCaution } from "./components/safety-caution";
import searchCss from "./components/search/search.module.css";

export const dynamic = "force-dynamic";

/** How many public entries the home page lists. */
const PUBLIC_ENTRIES_SHOWN = 20;

/** The home page: what this is, the newest public entries, and a search over what you may read. */
export default async function HomePage() {
  const { db } = database();
  const [rows, caller] = await Promise.all([
    db
      .select({
        id: schema.entries.id,
        title: schema.entries.title,
        category: schema.entries.category,
        updatedAt: schema.entries.updatedAt,
        team: schema.teams.name,
      })
      .from(schema.entries)
      .innerJoin(schema.teams, eq(schema.teams.id, schema.entries.teamId))
      .where(and(eq(schema.entries.visibility, "public"), isNull(schema.entries.archivedAt)))
      .orderBy(desc(schema.entries.updatedAt))
      .limit(PUBLIC_ENTRIES_SHOWN),
    currentCaller(),
  ]);
  return (
    <>
      <section className="intro">
        <h1>Traced teardowns, shared with your team</h1>
        <p className="lead">
          Record what you traced on a mains-powered board, its markings and what you measured. Each
          entry gets a laid-out schematic, computed dropper currents, firing angles, per-part stress
          and risk notes, and a check of your measurements against the traced circuit.
        </p>
        {!caller && (
          <p className="actions">
            <Link href="/sign-up" className="button-link primary">
              Create an account
            </Link>
            <Link href="/sign-in">or sign in</Link>
          </p>
        )}
        <SafetyCaution />
      </section>
      <section>
        <h2>Search</h2>
        <p className="muted">
          {caller
            ? "Searches your teams' entries and every public entry."
            : "Searches public entries; sign in to include your teams' entries."}
        </p>
        {/* A plain GET form: it opens the search page with the words in its URL, even without script. */}
        <form action="/search" method="get" role="search" className={searchCss.searchForm}>
          <label className="grow">
            <span>Words</span>
            <input
              name="q"
              type="search"
              placeholder="title, summary, tags, markings, notes"
              aria-label="Search words"
            />
          </label>
          <button type="submit">Search</button>
        </form>
        <p className="small">
          Or look for a <Link href="/search?view=fragment">circuit fragment</Link> you traced, or
          narrow by <Link href="/search">category, supply, blocks and flags</Link>.
        </p>
      </section>
      <section>
        <h2>Newest public entries</h2>
        {rows.length === 0 ? (
          <p className="muted">No public entries yet.</p>
        ) : (
          <table className="list" data-testid="entry-list">
            <thead>
              <tr>
                <th>Title</th>
                <th>Category</th>
                <th>Team</th>
                <th>Updated</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id}>
                  <td>
                    <Link href={`/entries/${r.id}`}>{r.title}</Link>
                  </td>
                  <td>{r.category ?? "—"}</td>
                  <td>{r.team}</td>
                  <td>
                    <time dateTime={r.updatedAt.toISOString()}>
                      {r.updatedAt.toISOString().slice(0, 10)}
                    </time>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
