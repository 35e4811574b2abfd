"use client";
// The header's "Sign out": ends this session through better-auth, then reloads as signed out.
import { useState } from "react";
import { sendJson } from "../client/http";

/** A button that signs the current session out and goes home. */
export function SignOutButton() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function signOut() {
    setBusy(true);
    setError(null);
    try {
      await sendJson("/api/auth/sign-out", {});
      // A full load, so every server-rendered part (the header too) sees the cookie gone.
      window.location.assign("/");
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
      setBusy(false);
    }
  }
  return (
    <>
      <button type="button" className="link-button" onClick={signOut} disabled={busy}>
        Sign out
      </button>
      {error && <span className="error-text">{error}</span>}
    </>
  );
}
