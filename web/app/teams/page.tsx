import Link from "next/link";
import { database } from "@/lib/database";
import { listTeams } from "@/lib/teams";
import { requirePageCaller } from "../components/current-caller";
import { CreateTeamForm } from "./create-team-form";

export const metadata = { title: "Teams · Teardown Ledger" };
export const dynamic = "force-dynamic";

/** /teams: the caller's teams, and a form to start a new one. */
export default async function TeamsPage() {
  const caller = await requirePageCaller("/teams");
  const teams = await listTeams(database().db, caller);
  return (
    <>
      <h1>Your teams</h1>
      {teams.length === 0 ? (
        <p className="muted">
          You are not on a team yet. Start one below, or open an invite link a team owner sent you.
        </p>
      ) : (
        <ul className="team-list" data-testid="team-list">
          {teams.map((t) => (
            <li key={t.id}>
              <Link href={`/teams/${t.id}`}>{t.name}</Link>
              <span className={`role role-${t.role}`}>{t.role}</span>
            </li>
          ))}
        </ul>
      )}
      <section className="card narrow">
        <h2>Start a team</h2>
        <CreateTeamForm />
      </section>
    </>
  );
}
