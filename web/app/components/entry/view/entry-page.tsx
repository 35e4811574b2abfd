"use client";
/**
 * The entry page: title, team, revision and state; the analysis (polled until it is done);
 * photos, comments, revisions and exports. Data comes from the HTTP API through TanStack Query.
 */
import { useState } from "react";
import { ApiFailure, failureText } from "../../../client/http";
import { useEntry, useTeam } from "../entry-queries";
import type { EntryState } from "../../../client/api-types";
import { when } from "../si-units";
import { AnalysisPanel } from "./analysis-panel";
import { CommentsSection } from "./comments-section";
import { EntryActions } from "./entry-actions";
import { PhotosSection } from "./photos-section";
import { arr, obj } from "./result-access";
import { RevisionsSection } from "./revisions-section";
import css from "../entry.module.css";

const EXPORTS = ["record.yaml", "record.json", "analysis.json", "schematic.svg"] as const;

/** The whole entry page for one entry id. */
export function EntryPage({ entryId, initial }: { entryId: string; initial?: EntryState | null }) {
  const query = useEntry(entryId, initial);
  const state = query.data;
  const isMember = state?.role !== null && state?.role !== undefined;
  const team = useTeam(state?.entry.teamId, isMember);
  const [commentPart, setCommentPart] = useState("");

  if (query.isPending) return <p className="muted">Loading the entry…</p>;
  if (query.isError || state === undefined) {
    const signedOut =
      query.error instanceof ApiFailure &&
      (query.error.status === 401 || query.error.status === 404);
    return (
      <>
        <h1>Entry not available</h1>
        <p>{failureText(query.error)}</p>
        {signedOut ? (
          <p>
            If it belongs to your team, <a href={`/sign-in?next=/entries/${entryId}`}>sign in</a>{" "}
            first.
          </p>
        ) : null}
      </>
    );
  }
  const { entry, revision, role } = state;
  const canEdit = role === "editor" || role === "owner";
  const parts = arr(revision.record.parts).map((p) => String(obj(p).ref));
  const pickPart = (ref: string) => {
    setCommentPart(ref);
    document.getElementById("comments")?.scrollIntoView({ behavior: "smooth", block: "start" });
  };
  return (
    <article data-entry-id={entry.id}>
      <div className={css.spread}>
        <div>
          <h1>{entry.title}</h1>
          <p className={css.meta}>
            {isMember ? (
              <>
                Team <a href={`/teams/${entry.teamId}`}>{team.data?.name ?? "…"}</a>
              </>
            ) : (
              <span>Shared publicly by its team</span>
            )}
            {" · "}
            <span data-testid="revision-number">revision {revision.number}</span>
            {revision.message ? ` (“${revision.message}”)` : ""} · {when(revision.createdAt)}
            {entry.category ? ` · ${entry.category}` : ""} ·{" "}
            {entry.visibility === "public" ? "public" : "team only"}
            {entry.archived ? (
              <>
                {" · "}
                <strong className={css.danger}>archived</strong>
              </>
            ) : null}
          </p>
        </div>
        <div className={css.row}>
          {canEdit ? (
            <a
              href={`/entries/${entry.id}/edit`}
              className={css.button}
              style={{ textDecoration: "none" }}
            >
              Edit
            </a>
          ) : null}
          {canEdit ? <EntryActions state={state} /> : null}
        </div>
      </div>

      <AnalysisPanel state={state} {...(isMember ? { onComment: pickPart } : {})} />

      <section className={css.section} id="photos">
        <div className={css.sectionHead}>
          <h2>Photos</h2>
        </div>
        <PhotosSection entryId={entry.id} canEdit={canEdit} />
      </section>

      <section className={css.section} id="comments">
        <div className={css.sectionHead}>
          <h2>Comments</h2>
          <span className={css.hint}>
            on the entry or on one part; @name mentions a team member
          </span>
        </div>
        <CommentsSection
          entryId={entry.id}
          parts={parts}
          members={team.data?.members ?? []}
          partRef={commentPart}
          onPartRef={setCommentPart}
          enabled={isMember}
        />
      </section>

      <section className={css.section} id="revisions">
        <div className={css.sectionHead}>
          <h2>Revisions</h2>
        </div>
        <RevisionsSection entryId={entry.id} />
      </section>

      <section className={css.section} id="exports">
        <div className={css.sectionHead}>
          <h2>Export</h2>
          <span className={css.hint}>
            of revision {revision.number}; the analysis and schematic once the analysis is done
          </span>
        </div>
        <p className={css.row}>
          {EXPORTS.map((file) => (
            <a
              key={file}
              href={`/api/entries/${entry.id}/export/${file}?revision=${revision.number}`}
              download
            >
              {file}
            </a>
          ))}
        </p>
      </section>
    </article>
  );
}
