"use client";
/** Editor actions on the entry: archive or unarchive, and team-only or public visibility. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { failureText, sendJson } from "../../../client/http";
import { entryKey } from "../entry-queries";
import type { EntryState } from "../../../client/api-types";
import css from "../entry.module.css";

/** Archive and visibility buttons (shown to editors and owners). */
export function EntryActions({ state }: { state: EntryState }) {
  const client = useQueryClient();
  const { entry } = state;
  const change = useMutation({
    mutationFn: (body: { archived?: boolean; visibility?: "team" | "public" }) =>
      sendJson(`/api/entries/${entry.id}`, body, "PATCH"),
    onSuccess: () => client.invalidateQueries({ queryKey: entryKey(entry.id) }),
  });
  return (
    <span className={css.row}>
      <button
        type="button"
        className={css.quiet}
        disabled={change.isPending}
        onClick={() =>
          change.mutate({ visibility: entry.visibility === "public" ? "team" : "public" })
        }
      >
        {entry.visibility === "public" ? "Make team-only" : "Make public"}
      </button>
      <button
        type="button"
        className={css.quiet}
        disabled={change.isPending}
        onClick={() => change.mutate({ archived: !entry.archived })}
      >
        {entry.archived ? "Unarchive" : "Archive"}
      </button>
      {change.isError ? <span className={css.danger}>{failureText(change.error)}</span> : null}
    </span>
  );
}
