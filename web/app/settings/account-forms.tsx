"use client";
// Settings: change the password, and sign out of every session on every device.
import { useState, type FormEvent } from "react";
import { sendJson } from "../client/http";

/** The shortest password the server accepts (web/lib/auth.ts, MIN_PASSWORD_CHARS). */
const MIN_PASSWORD_CHARS = 10;

/** Current and new password; optionally signs out the other sessions too. */
export function ChangePasswordForm() {
  const [status, setStatus] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const form = ev.currentTarget;
    const d = new FormData(form);
    const currentPassword = String(d.get("currentPassword") ?? "");
    const newPassword = String(d.get("newPassword") ?? "");
    if (newPassword.length < MIN_PASSWORD_CHARS) {
      setStatus({
        ok: false,
        text: `The new password needs at least ${MIN_PASSWORD_CHARS} characters.`,
      });
      return;
    }
    if (newPassword !== String(d.get("repeatPassword") ?? "")) {
      setStatus({ ok: false, text: "The two new passwords differ." });
      return;
    }
    setBusy(true);
    setStatus(null);
    try {
      await sendJson("/api/auth/change-password", {
        currentPassword,
        newPassword,
        revokeOtherSessions: d.get("revokeOtherSessions") === "on",
      });
      form.reset();
      setStatus({ ok: true, text: "Password changed." });
    } catch (err) {
      setStatus({ ok: false, text: err instanceof Error ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  }
  return (
    <form className="stack" onSubmit={onSubmit}>
      <label>
        <span>Current password</span>
        <input name="currentPassword" type="password" autoComplete="current-password" required />
      </label>
      <label>
        <span>New password</span>
        <input
          name="newPassword"
          type="password"
          autoComplete="new-password"
          required
          minLength={MIN_PASSWORD_CHARS}
        />
      </label>
      <label>
        <span>New password again</span>
        <input name="repeatPassword" type="password" autoComplete="new-password" required />
      </label>
      <label className="inline">
        <input name="revokeOtherSessions" type="checkbox" defaultChecked /> Sign out my other
        sessions
      </label>
      {status && (
        <p className={status.ok ? "ok-text" : "error-text"} role={status.ok ? "status" : "alert"}>
          {status.text}
        </p>
      )}
      <button type="submit" disabled={busy}>
        Change password
      </button>
    </form>
  );
}

/** Ends every session of this account, this one included, then goes to the sign-in page. */
export function SignOutEverywhere() {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function onClick() {
    if (!window.confirm("Sign out of every device, this one included?")) return;
    setBusy(true);
    setError(null);
    try {
      await sendJson("/api/auth/revoke-sessions", {});
      window.location.assign("/sign-in");
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
      setBusy(false);
    }
  }
  return (
    <div className="stack">
      <p className="muted">
        Ends every session of this account on every device, this one included. API tokens stay
        valid.
      </p>
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      <button type="button" className="danger" onClick={onClick} disabled={busy}>
        Sign out everywhere
      </button>
    </div>
  );
}
