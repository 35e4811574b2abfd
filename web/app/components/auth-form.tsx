"use client";
/**
 * The sign-up and sign-in forms: better-auth's email-and-password endpoints, called with the
 * session cookie; on success a full page load to `next`, so the header sees the new session.
 */
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { sendJson } from "../client/http";
import { safeNext } from "../client/safe-next";

/** The shortest password the server accepts (web/lib/auth.ts, MIN_PASSWORD_CHARS). */
const MIN_PASSWORD_CHARS = 10;

/** Sign-up (`mode="sign-up"`) or sign-in form. */
export function AuthForm(props: { mode: "sign-up" | "sign-in"; next: string | null }) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const signUp = props.mode === "sign-up";
  const next = safeNext(props.next);
  const nextQuery = props.next ? `?next=${encodeURIComponent(next)}` : "";

  async function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const d = new FormData(ev.currentTarget);
    const email = String(d.get("email") ?? "").trim();
    const password = String(d.get("password") ?? "");
    const name = String(d.get("name") ?? "").trim();
    if (signUp && password.length < MIN_PASSWORD_CHARS) {
      setError(`The password needs at least ${MIN_PASSWORD_CHARS} characters.`);
      return;
    }
    setBusy(true);
    setError(null);
    try {
      // Sign-up answers a taken email exactly as a new one (no account enumeration) and signs
      // nobody in; signing in next fails with the generic wrong-password message when taken.
      if (signUp) await sendJson("/api/auth/sign-up/email", { name, email, password });
      try {
        await sendJson("/api/auth/sign-in/email", { email, password });
      } catch (err) {
        if (signUp) throw new Error("Could not create an account with this email and password.");
        throw err;
      }
      window.location.assign(next);
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
      setBusy(false);
    }
  }

  return (
    <form className="card narrow stack" onSubmit={onSubmit} noValidate={false}>
      {signUp && (
        <label>
          <span>Name</span>
          <input name="name" autoComplete="name" required maxLength={100} />
        </label>
      )}
      <label>
        <span>Email</span>
        <input name="email" type="email" autoComplete="email" required />
      </label>
      <label>
        <span>Password</span>
        <input
          name="password"
          type="password"
          autoComplete={signUp ? "new-password" : "current-password"}
          required
          minLength={signUp ? MIN_PASSWORD_CHARS : undefined}
        />
        {signUp && <small className="muted">At least {MIN_PASSWORD_CHARS} characters.</small>}
      </label>
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      <button type="submit" className="primary" disabled={busy}>
        {signUp ? "Create account" : "Sign in"}
      </button>
      <p className="muted">
        {signUp ? (
          <>
            Already have an account? <Link href={`/sign-in${nextQuery}`}>Sign in</Link>
          </>
        ) : (
          <>
            New here? <Link href={`/sign-up${nextQuery}`}>Create an account</Link>
          </>
        )}
      </p>
    </form>
  );
}
