"use client";
// /teams: a new team with the caller as its owner; then its workspace.
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { ApiFailure, sendJson } from "../client/http";

/** Team name, and an address (slug) that only needs choosing when the derived one is taken. */
export function CreateTeamForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [askSlug, setAskSlug] = useState(false);
  const [busy, setBusy] = useState(false);
  async function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const d = new FormData(ev.currentTarget);
    const name = String(d.get("teamName") ?? "").trim();
    const slug = String(d.get("teamSlug") ?? "").trim();
    if (!name) {
      setError("Give the team a name.");
      return;
    }
    setBusy(true);
    setError(null);
    try {
      const res = await sendJson<{ team: { id: string } }>(
        "/api/teams",
        slug ? { name, slug } : { name },
      );
      router.push(`/teams/${res.team.id}`);
    } catch (err) {
      if (err instanceof ApiFailure && err.status === 409) setAskSlug(true);
      setError(err instanceof Error ? err.message : String(err));
      setBusy(false);
    }
  }
  return (
    <form className="stack" onSubmit={onSubmit}>
      <label>
        <span>Team name</span>
        <input
          name="teamName"
          required
          maxLength={100}
          placeholder="e.g. Compliance lab, bench 3"
        />
      </label>
      {askSlug && (
        <label>
          <span>Team address</span>
          <input
            name="teamSlug"
            pattern="[a-z0-9][a-z0-9\-]{0,62}"
            placeholder="lower-case letters, digits and dashes"
          />
        </label>
      )}
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      <button type="submit" className="primary" disabled={busy}>
        Create team
      </button>
    </form>
  );
}
