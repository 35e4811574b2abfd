import { desc, eq, isNull, and } from "drizzle-orm";
import { schema } from "@teardown/db";
import { database } from "@/lib/database";
import { SafetyCaution } from "./components/safety-caution";

export const dynamic = "force-dynamic";

/** The home page: what this is, and the newest public entries. */
export default async function HomePage() {
  const { db } = database();
  const rows = await db
    .select({ id: schema.entries.id, title: schema.entries.title, category: schema.entries.category, updatedAt: schema.entries.updatedAt, team: schema.teams.name })
    .from(schema.entries)
    .innerJoin(schema.teams, eq(schema.teams.id, schema.entries.teamId))
    .where(and(eq(schema.entries.visibility, "public"), isNull(schema.entries.archivedAt)))
    .orderBy(desc(schema.entries.updatedAt))
    .limit(20);
  return (
    <>
      <section className="intro">
        <h1>Traced teardowns, shared with your team</h1>
        <p>
          Record what you traced on a mains-powered board, its markings and what you measured. Each entry gets a laid-out schematic,
          computed dropper currents, firing angles, per-part stress and risk notes, and a check of your measurements against the traced circuit.
        </p>
        <SafetyCaution />
      </section>
      <section>
        <h2>Public entries</h2>
        {rows.length === 0 ? (
          <p className="muted">No public entries yet.</p>
        ) : (
          <table className="list">
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
                  <td>{r.title}</td>
                  <td>{r.category ?? "—"}</td>
                  <td>{r.team}</td>
                  <td>{r.updatedAt.toISOString().slice(0, 10)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
