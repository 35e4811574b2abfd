"use client";
// Owners: a one-time invitation link with a role and an expiry, shown once to copy and send.
import { useMutation } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { sendJson } from "../../client/http";
import type { NewInvite } from "../../client/api-types";

/** Expiry choices, in hours (the API allows 1 to 720). */
const EXPIRY_HOURS = [
  { hours: 24, label: "1 day" },
  { hours: 168, label: "7 days" },
  { hours: 720, label: "30 days" },
];

/** The invite form and the link it made. */
export function InviteForm(props: { teamId: string }) {
  const [copied, setCopied] = useState(false);
  const create = useMutation({
    mutationFn: (v: { role: string; expiresInHours: number }) =>
      sendJson<{ invite: NewInvite }>(`/api/teams/${props.teamId}/invites`, v),
    onSuccess: () => setCopied(false),
  });
  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const d = new FormData(ev.currentTarget);
    create.mutate({
      role: String(d.get("inviteRole")),
      expiresInHours: Number(d.get("inviteHours")),
    });
  }
  const invite = create.data?.invite;
  return (
    <div className="stack">
      <form className="row" onSubmit={onSubmit}>
        <label>
          <span>Role</span>
          <select name="inviteRole" defaultValue="editor">
            <option value="viewer">viewer</option>
            <option value="editor">editor</option>
            <option value="owner">owner</option>
          </select>
        </label>
        <label>
          <span>Valid for</span>
          <select name="inviteHours" defaultValue="168">
            {EXPIRY_HOURS.map((e) => (
              <option key={e.hours} value={e.hours}>
                {e.label}
              </option>
            ))}
          </select>
        </label>
        <button type="submit" disabled={create.isPending}>
          Create invite link
        </button>
      </form>
      {create.isError && (
        <p className="error-text" role="alert">
          {create.error.message}
        </p>
      )}
      {invite && (
        <div className="notice">
          <p>
            Send this link to the person you invite ({invite.role}). It works once, until{" "}
            {new Date(invite.expiresAt).toLocaleString()}.
          </p>
          <div className="row">
            <code className="secret" data-testid="invite-link">
              {invite.url}
            </code>
            <button
              type="button"
              onClick={() =>
                navigator.clipboard.writeText(invite.url).then(
                  () => setCopied(true),
                  () => setCopied(false),
                )
              }
            >
              {copied ? "Copied" : "Copy"}
            </button>
          </div>
        </div>
      )}
      <p className="muted small">
        Each link lets one person join. Create a new one for each person.
      </p>
    </div>
  );
}
