import Link from "next/link";
import { notFound } from "next/navigation";
import { ApiError } from "@/lib/api-error";
import { MAX_AUDIT_PAGE, teamAuditLog, type AuditRow } from "@/lib/audit";
import { database } from "@/lib/database";
import { getTeam } from "@/lib/teams";
import { requirePageCaller } from "../../../components/current-caller";

export const metadata = { title: "Audit log · Teardown Ledger" };
export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const PAGE_ROWS = 50;

/** What was acted on, linked when it is an entry of this team. */
function Target({ row }: { row: AuditRow }) {
  if (row.targetType === "entry")
    return <Link href={`/entries/${row.targetId}`}>entry {row.targetId.slice(0, 8)}</Link>;
  return (
    <span>
      {row.targetType.replace(/_/g, " ")} {row.targetId.slice(0, 8)}
    </span>
  );
}

/** The detail object as short `key: value` pairs (values cut, so one odd row cannot flood the page). */
function details(detail: Record<string, unknown>): string {
  return Object.entries(detail)
    .map(([k, v]) => `${k}: ${String(typeof v === "object" ? JSON.stringify(v) : v).slice(0, 80)}`)
    .join(", ");
}

/** /teams/[teamId]/audit: who changed what and when in the team, newest first (owners only). */
export default async function TeamAuditPage(props: {
  params: Promise<{ teamId: string }>;
  searchParams: Promise<{ before?: string }>;
}) {
  const { teamId } = await props.params;
  const { before } = await props.searchParams;
  const caller = await requirePageCaller(`/teams/${teamId}/audit`);
  if (!UUID.test(teamId)) notFound();
  const beforeId =
    typeof before === "string" && /^[1-9][0-9]{0,14}$/.test(before) ? Number(before) : undefined;
  let team;
  let page;
  try {
    team = await getTeam(database().db, caller, teamId);
    if (team.role !== "owner") {
      return (
        <p className="card">
          Only the team&apos;s owners can read its audit log.{" "}
          <Link href={`/teams/${teamId}`}>Back to the team</Link>
        </p>
      );
    }
    page = await teamAuditLog(database().db, caller, teamId, {
      limit: Math.min(PAGE_ROWS, MAX_AUDIT_PAGE),
      before: beforeId,
    });
  } catch (err) {
    // Not a member looks exactly like no such team.
    if (err instanceof ApiError && err.status === 404) notFound();
    throw err;
  }
  return (
    <>
      <p className="crumbs">
        <Link href="/teams">Teams</Link> / <Link href={`/teams/${team.id}`}>{team.name}</Link> /
        audit log
      </p>
      <h1>Audit log</h1>
      <p className="muted">
        Every change to the team, its members, invites and entries, newest first. Each row was
        written in the same transaction as the change it records.
      </p>
      {page.rows.length === 0 ? (
        <p className="muted">Nothing recorded yet.</p>
      ) : (
        <table className="list" aria-label="Audit log">
          <thead>
            <tr>
              <th>When (UTC)</th>
              <th>Who</th>
              <th>What</th>
              <th>On</th>
              <th>Details</th>
            </tr>
          </thead>
          <tbody>
            {page.rows.map((r) => (
              <tr key={r.id}>
                <td>{r.at.toISOString().replace("T", " ").slice(0, 19)}</td>
                <td>{r.actorName ?? "(deleted account)"}</td>
                <td>{r.action}</td>
                <td>
                  <Target row={r} />
                </td>
                <td className="muted">{details(r.detail)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {page.nextBefore !== null && (
        <p>
          <Link href={`/teams/${team.id}/audit?before=${page.nextBefore}`}>Older changes</Link>
        </p>
      )}
    </>
  );
}
