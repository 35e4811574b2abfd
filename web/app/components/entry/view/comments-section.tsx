"use client";
/**
 * Comments on the entry and on single parts, with @mentions of team members: the list (all,
 * entry only, or one part), and a form with a part picker and member suggestions for `@`.
 */
import { useMemo, useState, type ReactNode } from "react";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { failureText, sendJson } from "../../../client/http";
import { useComments } from "../entry-queries";
import type { TeamMember } from "../../../client/api-types";
import { when } from "../si-units";
import css from "../entry.module.css";

/** The member handle a mention uses: the email's local part (the API also takes the full email or the name without spaces). */
export function mentionHandle(m: TeamMember): string {
  return m.email.split("@")[0]!;
}

function renderBody(body: string, mentioned: TeamMember[]): ReactNode[] {
  const handles = new Set(
    mentioned.flatMap((m) => [
      m.email.toLowerCase(),
      mentionHandle(m).toLowerCase(),
      m.name.replace(/\s+/g, "").toLowerCase(),
    ]),
  );
  return body.split(/(@[A-Za-z0-9._%+-]+(?:@[A-Za-z0-9.-]+\.[A-Za-z]{2,})?)/g).map((chunk, i) =>
    chunk.startsWith("@") && handles.has(chunk.slice(1).replace(/[.]+$/, "").toLowerCase()) ? (
      <span key={i} className={css.mention}>
        {chunk}
      </span>
    ) : (
      <span key={i}>{chunk}</span>
    ),
  );
}

/** The comments section; `partRef`/`onPartRef` let the part table's "Comment" action pick the part. */
export function CommentsSection({
  entryId,
  parts,
  members,
  partRef,
  onPartRef,
  enabled,
}: {
  entryId: string;
  parts: string[];
  members: TeamMember[];
  partRef: string;
  onPartRef: (ref: string) => void;
  enabled: boolean;
}) {
  const comments = useComments(entryId, enabled);
  const client = useQueryClient();
  const [body, setBody] = useState("");
  const [filter, setFilter] = useState<string>("all");
  const add = useMutation({
    mutationFn: (input: { body: string; partRef?: string }) =>
      sendJson(`/api/entries/${entryId}/comments`, input),
    onSuccess: (_, sent) => {
      // Only clear what was sent: the person may have started the next comment already.
      setBody((b) => (b === sent.body ? "" : b));
      return client.invalidateQueries({ queryKey: ["entry", entryId, "comments"] });
    },
  });
  // Suggest members while the last word being typed starts with "@".
  const typing = /(?:^|\s)@([A-Za-z0-9._%+-]*)$/.exec(body)?.[1];
  const suggestions = useMemo(
    () =>
      typing === undefined
        ? []
        : members
            .filter((m) => `${m.name} ${m.email}`.toLowerCase().includes(typing.toLowerCase()))
            .slice(0, 6),
    [typing, members],
  );
  if (!enabled)
    return (
      <p className="muted">
        Comments are for team members; sign in with a team account to read and write them.
      </p>
    );
  const list = (comments.data ?? []).filter(
    (c) => filter === "all" || (filter === "" ? c.partRef === null : c.partRef === filter),
  );
  const byId = new Map(members.map((m) => [m.userId, m]));
  return (
    <div data-testid="comments">
      <div className={css.row}>
        <label className={css.meta}>
          Show{" "}
          <select
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            aria-label="which comments"
          >
            <option value="all">all comments</option>
            <option value="">on the entry</option>
            {parts.map((p) => (
              <option key={p} value={p}>
                on {p}
              </option>
            ))}
          </select>
        </label>
      </div>
      {comments.isError ? <p className={css.missing}>{failureText(comments.error)}</p> : null}
      {list.length === 0 && comments.isSuccess ? <p className="muted">No comments yet.</p> : null}
      {list.map((c) => (
        <div key={c.id} className={css.comment} data-comment-part={c.partRef ?? ""}>
          <div className={css.meta}>
            <strong>{c.authorName ?? "someone"}</strong> · {when(c.createdAt)}
            {c.partRef ? <span className={css.partTag}>on {c.partRef}</span> : null}
          </div>
          <div style={{ whiteSpace: "pre-wrap" }}>
            {renderBody(
              c.body,
              c.mentions.map((id) => byId.get(id)).filter((m): m is TeamMember => m !== undefined),
            )}
          </div>
        </div>
      ))}
      <form
        id="comment-form"
        style={{ marginTop: "0.8rem" }}
        onSubmit={(e) => {
          e.preventDefault();
          if (body.trim() === "") return;
          add.mutate(partRef === "" ? { body } : { body, partRef });
        }}
      >
        <div className={css.row}>
          <label className={css.meta}>
            About{" "}
            <select name="commentPart" value={partRef} onChange={(e) => onPartRef(e.target.value)}>
              <option value="">the whole entry</option>
              {parts.map((p) => (
                <option key={p} value={p}>
                  part {p}
                </option>
              ))}
            </select>
          </label>
        </div>
        <textarea
          name="commentBody"
          value={body}
          onChange={(e) => setBody(e.target.value)}
          rows={3}
          style={{ width: "100%", font: "inherit", marginTop: "0.4rem" }}
          placeholder="Write a comment; @name mentions a team member"
          aria-label="comment"
        />
        {suggestions.length > 0 ? (
          <div className={css.row} aria-label="mention suggestions">
            {suggestions.map((m) => (
              <button
                key={m.userId}
                type="button"
                className={css.quiet}
                onClick={() =>
                  setBody((b) => b.replace(/@([A-Za-z0-9._%+-]*)$/, `@${mentionHandle(m)} `))
                }
              >
                @{mentionHandle(m)} <span className={css.meta}>{m.name}</span>
              </button>
            ))}
          </div>
        ) : null}
        <div className={css.row} style={{ marginTop: "0.4rem" }}>
          <button type="submit" className={css.button} disabled={add.isPending}>
            Add comment
          </button>
          {add.isError ? <span className={css.danger}>{failureText(add.error)}</span> : null}
        </div>
      </form>
    </div>
  );
}
