import Link from "next/link";
import { notFound } from "next/navigation";
import { ApiError } from "@/lib/api-error";
import { database } from "@/lib/database";
import { getTeam } from "@/lib/teams";
import { requirePageCaller } from "../../components/current-caller";
import { EntryBrowser } from "../../components/entry-browser";
import { InviteForm } from "./invite-form";
import { TeamArchivePanel } from "./team-archive-panel";
import { MembersPanel } from "./members-panel";
import type { TeamMemberRow as Member } from "../../client/api-types";

export const metadata = { title: "Team · Teardown Ledger" };
export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** /teams/[teamId]: the team's workspace: its entries, its members and, for owners, invites. */
export default async function TeamPage(props: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await props.params;
  const caller = await requirePageCaller(`/teams/${teamId}`);
  if (!UUID.test(teamId)) notFound();
  let team;
  try {
    team = await getTeam(database().db, caller, teamId);
  } catch (err) {
    // Not a member looks exactly like no such team.
    if (err instanceof ApiError && err.status === 404) notFound();
    throw err;
  }
  const members: Member[] = team.members.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() }));
  const canEdit = team.role !== "viewer";
  return (
    <>
      <p className="crumbs">
        <Link href="/teams">Teams</Link> / {team.name}
      </p>
      <div className="title-row">
        <h1>{team.name}</h1>
        <span className={`role role-${team.role}`}>you: {team.role}</span>
        {team.role === "owner" && (
          <Link href={`/teams/${team.id}/audit`} className="button-link">
            Audit log
          </Link>
        )}
        {canEdit && (
          <Link href={`/entries/new?team=${team.id}`} className="button-link primary">
            New entry
          </Link>
        )}
      </div>
      <section>
        <h2>Entries</h2>
        <EntryBrowser
          endpoint={`/api/teams/${team.id}/entries`}
          showArchived
          label="Team entries"
        />
      </section>
      <div className="columns">
        <section className="card">
          <h2>Members</h2>
          <MembersPanel
            teamId={team.id}
            myUserId={caller.userId}
            myRole={team.role}
            initialMembers={members}
          />
        </section>
        {team.role === "owner" && (
          <section className="card">
            <h2>Invite someone</h2>
            <InviteForm teamId={team.id} />
          </section>
        )}
        {team.role === "owner" && (
          <section className="card">
            <h2>Move the team</h2>
            <TeamArchivePanel teamId={team.id} />
          </section>
        )}
      </div>
    </>
  );
}
