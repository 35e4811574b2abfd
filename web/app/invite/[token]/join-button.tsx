"use client";
// /invite/[token]: accepts the invitation for the signed-in user and opens the team.
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiFailure, sendJson } from "../../client/http";

/** What a used or expired link says (410 from the API). */
export const USED_OR_EXPIRED =
  "This invite was used or has expired. Ask the team's owner for a new link.";

/** The "Join team" button. */
export function JoinButton(props: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function join() {
    setBusy(true);
    setError(null);
    try {
      const res = await sendJson<{ membership: { teamId: string } }>(
        `/api/invites/${encodeURIComponent(props.token)}`,
      );
      router.push(`/teams/${res.membership.teamId}`);
    } catch (err) {
      setError(
        err instanceof ApiFailure && err.status === 410
          ? USED_OR_EXPIRED
          : err instanceof Error
            ? err.message
            : String(err),
      );
      setBusy(false);
    }
  }
  return (
    <>
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      <button type="button" className="primary" onClick={join} disabled={busy}>
        Join team
      </button>
    </>
  );
}
