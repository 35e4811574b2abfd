"use client";
// Settings: personal API tokens for scripts. A new token is shown once; the list never shows one.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { getJson, sendJson } from "../client/http";
import type { TokenInfo } from "../client/api-types";

const TOKENS_KEY = ["api-tokens"];

function day(iso: string | null): string {
  return iso ? iso.slice(0, 10) : "never";
}

/** Create, list and revoke the caller's API tokens. */
export function ApiTokens() {
  const client = useQueryClient();
  const [fresh, setFresh] = useState<{ name: string; token: string } | null>(null);
  const [copied, setCopied] = useState(false);
  const tokens = useQuery({
    queryKey: TOKENS_KEY,
    queryFn: () => getJson<{ tokens: TokenInfo[] }>("/api/tokens"),
  });
  const create = useMutation({
    mutationFn: (name: string) =>
      sendJson<{ token: TokenInfo & { token: string } }>("/api/tokens", { name }),
    onSuccess: (res) => {
      setFresh({ name: res.token.name, token: res.token.token });
      setCopied(false);
      void client.invalidateQueries({ queryKey: TOKENS_KEY });
    },
  });
  const revoke = useMutation({
    mutationFn: (id: string) => sendJson(`/api/tokens/${id}`, undefined, "DELETE"),
    onSuccess: () => void client.invalidateQueries({ queryKey: TOKENS_KEY }),
  });

  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const form = ev.currentTarget;
    const name = String(new FormData(form).get("tokenName") ?? "").trim();
    if (!name) return;
    create.mutate(name, { onSuccess: () => form.reset() });
  }
  async function copy() {
    if (!fresh) return;
    try {
      await navigator.clipboard.writeText(fresh.token);
      setCopied(true);
    } catch {
      setCopied(false);
    }
  }

  return (
    <div className="stack">
      <p className="muted">
        Scripts send a token as <code>Authorization: Bearer tl_…</code>; it acts as you, with your
        roles.
      </p>
      <form className="row" onSubmit={onSubmit}>
        <label className="grow">
          <span>Token name</span>
          <input name="tokenName" placeholder="e.g. lab bench script" maxLength={100} required />
        </label>
        <button type="submit" disabled={create.isPending}>
          Create token
        </button>
      </form>
      {create.isError && (
        <p className="error-text" role="alert">
          {create.error.message}
        </p>
      )}
      {fresh && (
        <div className="notice" data-testid="new-token">
          <p>
            <strong>Your new token “{fresh.name}”.</strong> Copy it now: it is shown only this once
            and cannot be read back later.
          </p>
          <div className="row">
            <code className="secret" data-testid="new-token-value">
              {fresh.token}
            </code>
            <button type="button" onClick={copy}>
              {copied ? "Copied" : "Copy"}
            </button>
            <button type="button" className="quiet" onClick={() => setFresh(null)}>
              Done
            </button>
          </div>
        </div>
      )}
      {tokens.isError ? (
        <p className="error-text">Could not load tokens: {tokens.error.message}</p>
      ) : tokens.isPending ? (
        <p className="muted">Loading tokens…</p>
      ) : tokens.data.tokens.length === 0 ? (
        <p className="muted">No tokens yet.</p>
      ) : (
        <table className="list" data-testid="token-list">
          <thead>
            <tr>
              <th>Name</th>
              <th>Created</th>
              <th>Last used</th>
              <th>State</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {tokens.data.tokens.map((t) => (
              <tr key={t.id} className={t.revokedAt ? "archived" : undefined}>
                <td>{t.name}</td>
                <td>{day(t.createdAt)}</td>
                <td>{day(t.lastUsedAt)}</td>
                <td>{t.revokedAt ? `revoked ${day(t.revokedAt)}` : "active"}</td>
                <td>
                  {!t.revokedAt && (
                    <button
                      type="button"
                      className="danger small"
                      disabled={revoke.isPending}
                      onClick={() => {
                        if (
                          window.confirm(
                            `Revoke “${t.name}”? Scripts using it stop working at once.`,
                          )
                        )
                          revoke.mutate(t.id);
                      }}
                    >
                      Revoke
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {revoke.isError && (
        <p className="error-text" role="alert">
          {revoke.error.message}
        </p>
      )}
    </div>
  );
}
