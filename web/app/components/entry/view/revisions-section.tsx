"use client";
/** The entry's history: each revision with number, message, author and date, diffs between neighbours, and a picker for any two. */
import { failureText } from "../../../client/http";
import { useRevisions } from "../entry-queries";
import { when } from "../si-units";
import css from "../entry.module.css";

/** The revisions list. */
export function RevisionsSection({ entryId }: { entryId: string }) {
  const revisions = useRevisions(entryId);
  if (revisions.isError) return <p className={css.missing}>{failureText(revisions.error)}</p>;
  const list = revisions.data?.revisions ?? [];
  return (
    <div data-testid="revisions">
      <table className={css.table}>
        <thead>
          <tr>
            <th>Revision</th>
            <th>Message</th>
            <th>Author</th>
            <th>Date</th>
            <th>Diff</th>
          </tr>
        </thead>
        <tbody>
          {list.map((r) => (
            <tr key={r.number} data-revision={r.number}>
              <td>{r.number}</td>
              <td>{r.message || <span className={css.missing}>no message</span>}</td>
              <td>{r.authorName ?? "—"}</td>
              <td>{when(r.createdAt)}</td>
              <td>
                {r.number > 1 ? (
                  <a href={`/entries/${entryId}/diff?from=${r.number - 1}&to=${r.number}`}>
                    changes from {r.number - 1}
                  </a>
                ) : (
                  "first"
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {list.length > 1 ? (
        <form
          method="get"
          action={`/entries/${entryId}/diff`}
          className={css.row}
          style={{ marginTop: "0.6rem" }}
        >
          <span className={css.meta}>Compare revision</span>
          <select
            name="from"
            defaultValue={String(list[list.length - 1]!.number)}
            aria-label="from revision"
          >
            {list.map((r) => (
              <option key={r.number} value={r.number}>
                {r.number}
              </option>
            ))}
          </select>
          <span className={css.meta}>with</span>
          <select name="to" defaultValue={String(list[0]!.number)} aria-label="to revision">
            {list.map((r) => (
              <option key={r.number} value={r.number}>
                {r.number}
              </option>
            ))}
          </select>
          <button type="submit" className={css.quiet}>
            Show diff
          </button>
        </form>
      ) : null}
    </div>
  );
}
