import Link from "next/link";
import { ApiError } from "@/lib/api-error";
import { database } from "@/lib/database";
import { inviteInfo } from "@/lib/invites";
import { currentCaller } from "../../components/current-caller";
import { JoinButton, USED_OR_EXPIRED } from "./join-button";

export const metadata = { title: "Invitation · Teardown Ledger" };
export const dynamic = "force-dynamic";

/** /invite/[token]: which team and role a link offers, and the way to accept it. */
export default async function InvitePage(props: { params: Promise<{ token: string }> }) {
  const { token } = await props.params;
  const here = `/invite/${encodeURIComponent(token)}`;
  let info: Awaited<ReturnType<typeof inviteInfo>> | null = null;
  let problem: string | null = null;
  try {
    info = await inviteInfo(database().db, token);
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    problem =
      err.status === 410
        ? USED_OR_EXPIRED
        : "This invite link is not one we know. Check that it was copied whole.";
  }
  const caller = info ? await currentCaller() : null;
  return (
    <section className="card narrow stack">
      <h1>Team invitation</h1>
      {problem || !info ? (
        <p className="error-text" role="alert" data-testid="invite-problem">
          {problem}
        </p>
      ) : (
        <>
          <p>
            You are invited to join <strong data-testid="invite-team">{info.teamName}</strong> as{" "}
            <strong data-testid="invite-role">{info.role}</strong>.
          </p>
          <p className="muted small">
            The link works once and expires{" "}
            {info.expiresAt.toISOString().slice(0, 16).replace("T", " ")} UTC.
          </p>
          {caller ? (
            <>
              <p className="muted">
                Signed in as {caller.name} ({caller.email}).
              </p>
              <JoinButton token={token} />
            </>
          ) : (
            <p className="actions">
              <Link
                href={`/sign-up?next=${encodeURIComponent(here)}`}
                className="button-link primary"
              >
                Create an account to join
              </Link>
              <Link href={`/sign-in?next=${encodeURIComponent(here)}`}>or sign in</Link>
            </p>
          )}
        </>
      )}
    </section>
  );
}
