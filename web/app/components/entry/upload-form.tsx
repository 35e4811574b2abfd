"use client";
/**
 * Creating an entry from a file: a YAML or JSON record, a netlist deck or a CSV parts list,
 * sent as a multipart upload; a refused file lists every problem by line. An accepted file with
 * warnings (a value read as milli that was likelier mega, a field ignored) shows every warning by
 * line before the person goes on to the entry, so none is lost on the way.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { ApiFailure, failureText, sendForm } from "../../client/http";
import type { ApiProblem } from "../../client/api-types";
import { ProblemList } from "./problem-list";
import css from "./entry.module.css";

const ACCEPT = ".yaml,.yml,.json,.cir,.net,.deck,.csv";

/** The upload form of the new-entry page. */
export function UploadForm({ teamId }: { teamId: string }) {
  const router = useRouter();
  const [text, setText] = useState<string | null>(null);
  const [problems, setProblems] = useState<ApiProblem[] | null>(null);
  const [accepted, setAccepted] = useState<{ entryId: string; warnings: ApiProblem[] } | null>(
    null,
  );
  const create = useMutation({
    mutationFn: async (form: FormData) =>
      sendForm<{ entryId: string; warnings?: ApiProblem[] }>(`/api/teams/${teamId}/entries`, form),
    onSuccess: (created) => {
      const warnings = created.warnings ?? [];
      if (warnings.length === 0) router.push(`/entries/${created.entryId}`);
      else setAccepted({ entryId: created.entryId, warnings });
    },
    onError: (err) =>
      setProblems(
        err instanceof ApiFailure && err.status === 422 && err.body.errors ? err.body.errors : null,
      ),
  });
  return (
    <form
      id="upload-form"
      onSubmit={async (e) => {
        e.preventDefault();
        const el = e.currentTarget;
        const file = (el.elements.namedItem("recordFile") as HTMLInputElement).files?.[0];
        if (!file) return;
        setText(await file.text().catch(() => null));
        const form = new FormData();
        form.set("file", file, file.name);
        const message = (el.elements.namedItem("message") as HTMLInputElement).value;
        if (message.trim() !== "") form.set("message", message);
        setProblems(null);
        setAccepted(null);
        create.mutate(form);
      }}
    >
      <div className={css.row}>
        <label>
          Record file <input type="file" name="recordFile" accept={ACCEPT} required />
        </label>
        <label>
          Message <input name="message" placeholder="first trace" />
        </label>
        <button type="submit" className={css.button} disabled={create.isPending}>
          Create entry
        </button>
      </div>
      <p className={css.hint}>
        A record (.yaml, .yml, .json), a netlist deck with one element per line (.cir, .net, .deck)
        or a CSV parts list (.csv). The record format is described by its{" "}
        <a href="/api/schema/record-v1.schema.json" download data-testid="record-schema-link">
          JSON Schema
        </a>
        .
      </p>
      {accepted !== null ? (
        <>
          <ProblemList
            problems={accepted.warnings}
            text={text}
            warnings
            title={`The entry was created; the reader has ${accepted.warnings.length} warning${accepted.warnings.length === 1 ? "" : "s"} about the file. Check each before trusting the analysis.`}
          />
          <p>
            <a href={`/entries/${accepted.entryId}`} data-testid="open-created-entry">
              Open the entry
            </a>
          </p>
        </>
      ) : null}
      {problems !== null ? (
        <ProblemList
          problems={problems}
          text={text}
          title={`The file was not accepted: ${problems.length} problem${problems.length === 1 ? "" : "s"}.`}
        />
      ) : create.isError ? (
        <div className={css.errorBox} role="alert">
          {failureText(create.error)}
        </div>
      ) : null}
    </form>
  );
}
