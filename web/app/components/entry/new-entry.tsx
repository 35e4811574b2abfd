"use client";
/** The new-entry page's two ways in: upload a file, or type the teardown into the form editor. */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { ApiFailure, failureText, sendJson } from "../../client/http";
import { FormEditor } from "./form/form-editor";
import { emptyForm, type FormState } from "./form/form-state";
import type { PlacedProblem } from "./form/place-errors";
import { useTeam } from "./entry-queries";
import { UploadForm } from "./upload-form";
import css from "./entry.module.css";

/** Both ways of creating an entry on a team. */
export function NewEntry({ teamId }: { teamId: string }) {
  const router = useRouter();
  const team = useTeam(teamId);
  const [state, setState] = useState<FormState>(emptyForm);
  const [message, setMessage] = useState("");
  const [serverProblems, setServerProblems] = useState<PlacedProblem[]>([]);
  const create = useMutation({
    mutationFn: (body: { record: Record<string, unknown>; message: string }) =>
      sendJson<{ entryId: string }>(`/api/teams/${teamId}/entries`, body),
    onSuccess: (created) => router.push(`/entries/${created.entryId}`),
    onError: (err) =>
      setServerProblems(err instanceof ApiFailure && err.body.errors ? err.body.errors : []),
  });
  return (
    <>
      <h1>New entry</h1>
      <p className="muted">
        On team <a href={`/teams/${teamId}`}>{team.data?.name ?? `${teamId.slice(0, 8)}…`}</a>
        {team.isSuccess && team.data.role === "viewer"
          ? " (your role there is viewer: creating entries needs editor)"
          : ""}
      </p>
      <section className={css.section}>
        <div className={css.sectionHead}>
          <h2>Upload a file</h2>
        </div>
        <UploadForm teamId={teamId} />
      </section>
      <section className={css.section}>
        <div className={css.sectionHead}>
          <h2>Form editor</h2>
          <span className={css.hint}>
            Values take SI prefixes (330n, 4.7k) or the letter code (4k7, 1R5).
          </span>
        </div>
        <FormEditor
          id="form-editor"
          state={state}
          onChange={setState}
          submitLabel="Create entry"
          message={message}
          onMessage={setMessage}
          busy={create.isPending}
          serverProblems={serverProblems}
          onSubmit={(record, msg) => {
            setServerProblems([]);
            create.mutate({ record, message: msg });
          }}
        >
          {create.isError ? (
            <div className={css.errorBox} role="alert">
              {failureText(create.error)}
            </div>
          ) : null}
        </FormEditor>
      </section>
    </>
  );
}
