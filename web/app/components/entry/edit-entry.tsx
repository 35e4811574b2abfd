"use client";
/**
 * The edit page: the form editor prefilled from the current revision, saved as a new revision
 * on that base. When someone else saved first (409), the page shows what they changed, keeps
 * the editor's edits, and offers to re-apply them on the newer revision.
 */
import { useEffect, useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ApiFailure, failureText, getJson, sendJson } from "../../client/http";
import { DiffView } from "./diff-view";
import type { RevisionDiff } from "../../client/api-types";
import { entryKey } from "./entry-queries";
import type { EntryState } from "../../client/api-types";
import { FormEditor } from "./form/form-editor";
import { documentFromForm, formFromDocument, type FormState } from "./form/form-state";
import { mergeEdits } from "./form/merge-edits";
import type { PlacedProblem } from "./form/place-errors";
import css from "./entry.module.css";

interface Stale {
  currentRevision: number;
  changedSince: RevisionDiff | null;
}

function EditForm({ initial }: { initial: EntryState }) {
  const router = useRouter();
  const client = useQueryClient();
  const entryId = initial.entry.id;
  const [state, setState] = useState<FormState>(() => formFromDocument(initial.revision.record));
  const [base, setBase] = useState({
    number: initial.revision.number,
    doc: initial.revision.record as unknown,
  });
  const [message, setMessage] = useState("");
  const [stale, setStale] = useState<Stale | null>(null);
  const [merged, setMerged] = useState<{ revision: number; conflicts: string[] } | null>(null);
  const [serverProblems, setServerProblems] = useState<PlacedProblem[]>([]);
  // The stale notice sits by the save button, far below the top: bring it into view.
  useEffect(() => {
    if (stale !== null)
      document.querySelector('[data-testid="stale-revision"]')?.scrollIntoView({ block: "start" });
  }, [stale]);

  const save = useMutation({
    mutationFn: (body: {
      record: Record<string, unknown>;
      baseRevision: number;
      message: string;
    }) => sendJson<{ revision: number }>(`/api/entries/${entryId}/revisions`, body),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: entryKey(entryId) });
      router.push(`/entries/${entryId}`);
    },
    onError: (err) => {
      if (
        err instanceof ApiFailure &&
        err.status === 409 &&
        typeof err.body.currentRevision === "number"
      ) {
        setStale({
          currentRevision: err.body.currentRevision,
          changedSince: (err.body.changedSince as RevisionDiff | null) ?? null,
        });
        return;
      }
      setServerProblems(err instanceof ApiFailure && err.body.errors ? err.body.errors : []);
    },
  });

  const latest = async () => {
    const now = await getJson<EntryState>(`/api/entries/${entryId}`);
    return { number: now.revision.number, doc: now.revision.record as unknown };
  };
  const reapply = useMutation({
    mutationFn: latest,
    onSuccess: (theirs) => {
      const outcome = mergeEdits(base.doc, documentFromForm(state), theirs.doc);
      setState(formFromDocument(outcome.merged));
      setBase(theirs);
      setStale(null);
      setMerged({ revision: theirs.number, conflicts: outcome.conflicts });
    },
  });
  const overwrite = useMutation({
    mutationFn: latest,
    onSuccess: (theirs) => {
      setBase(theirs);
      setStale(null);
      setMerged(null);
      save.mutate({ record: documentFromForm(state), baseRevision: theirs.number, message });
    },
  });

  return (
    <>
      <p>
        <a href={`/entries/${entryId}`}>← back to the entry</a>
      </p>
      <h1>Edit: {initial.entry.title}</h1>
      <p className="muted">
        Editing on revision <span data-testid="base-revision">{base.number}</span>. Saving makes a
        new revision; the analysis runs again.
      </p>
      <FormEditor
        id="edit-form"
        state={state}
        onChange={setState}
        submitLabel="Save revision"
        message={message}
        onMessage={setMessage}
        busy={save.isPending || reapply.isPending || overwrite.isPending}
        serverProblems={serverProblems}
        onSubmit={(record, msg) => {
          setServerProblems([]);
          save.mutate({ record, baseRevision: base.number, message: msg });
        }}
      >
        {stale !== null ? (
          <div className={css.errorBox} role="alert" data-testid="stale-revision">
            <strong>
              Not saved: someone saved revision {stale.currentRevision} while you were editing
              revision {base.number}.
            </strong>{" "}
            Your edits are still here. What changed since revision {base.number}:
            {stale.changedSince ? (
              <DiffView diff={stale.changedSince} />
            ) : (
              <p className="muted">The changes could not be listed.</p>
            )}
            <div className={css.row}>
              <button
                type="button"
                className={css.button}
                onClick={() => reapply.mutate()}
                disabled={reapply.isPending}
              >
                Re-apply my edits on revision {stale.currentRevision}
              </button>
              <button
                type="button"
                className={css.quiet}
                onClick={() => overwrite.mutate()}
                disabled={overwrite.isPending}
              >
                Save mine as they are, replacing their changes
              </button>
            </div>
            {reapply.isError ? <p className={css.danger}>{failureText(reapply.error)}</p> : null}
          </div>
        ) : null}
        {merged !== null ? (
          <div
            className={merged.conflicts.length > 0 ? css.errorBox : css.okBox}
            role="status"
            data-testid="reapplied"
          >
            Your edits were re-applied on revision {merged.revision}. Check the form, then save.
            {merged.conflicts.length > 0
              ? ` Both of you changed: ${merged.conflicts.join(", ")} — your version was kept there.`
              : ""}
          </div>
        ) : null}
        {save.isError &&
        stale === null &&
        !(save.error instanceof ApiFailure && save.error.status === 409) ? (
          <div className={css.errorBox} role="alert">
            {failureText(save.error)}
          </div>
        ) : null}
      </FormEditor>
    </>
  );
}

/** The edit page for one entry. */
export function EditEntry({ entryId }: { entryId: string }) {
  const query = useQuery({
    queryKey: ["entry", entryId, "edit-base"],
    queryFn: () => getJson<EntryState>(`/api/entries/${entryId}`),
    retry: false,
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });
  if (query.isPending) return <p className="muted">Loading…</p>;
  if (query.isError) return <p className={css.errorBox}>{failureText(query.error)}</p>;
  const role = query.data.role;
  if (role !== "editor" && role !== "owner") {
    return (
      <>
        <h1>Edit: {query.data.entry.title}</h1>
        <p>Editing needs the editor role on the entry&apos;s team.</p>
      </>
    );
  }
  return <EditForm initial={query.data} />;
}
