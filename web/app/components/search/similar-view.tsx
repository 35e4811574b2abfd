"use client";
/**
 * Similar circuits: the entries whose traced topology is closest to one entry's, best first,
 * each with its similarity, the block kinds both have and a link comparing it with the source.
 */
import Link from "next/link";
import { failureText } from "../../client/http";
import { useEntry } from "../entry/entry-queries";
import { EntryHeading } from "./entry-heading";
import { useSimilar } from "./search-queries";
import { compareHref, searchHref } from "./search-url";
import css from "./search.module.css";

export function SimilarView({
  entryId,
  teamNames,
}: {
  entryId: string;
  teamNames: ReadonlyMap<string, string>;
}) {
  const source = useEntry(entryId);
  const similar = useSimilar(entryId);
  const title = source.data?.entry.title;
  const results = similar.data?.results ?? [];
  return (
    <section aria-labelledby="similar-heading" className={css.similar}>
      <h2 id="similar-heading">
        Circuits similar to{" "}
        {title ? <Link href={`/entries/${entryId}`}>{title}</Link> : <span>this entry</span>}
      </h2>
      <p className="muted small">
        Ranked by how much of the traced circuit&apos;s structure they share (part kinds, how their
        pins connect and what each net does); part values only order circuits whose structure scores
        the same. 100% means the same structure.
      </p>
      {similar.isError ? (
        <p className="error-text" role="alert">
          Could not find similar circuits: {failureText(similar.error)}
        </p>
      ) : similar.isPending ? (
        <p className="muted">Looking for similar circuits…</p>
      ) : results.length === 0 ? (
        <p className="muted" data-testid="no-results">
          No other entry you can read shares this circuit&apos;s structure.
        </p>
      ) : (
        <ol className={css.hitList} data-testid="similar-results">
          {results.map((hit) => (
            <li key={hit.entry.id} className={css.hit} data-entry-id={hit.entry.id}>
              <div className={css.score} aria-label={`similarity ${Math.round(hit.score * 100)}%`}>
                {Math.round(hit.score * 100)}%
              </div>
              <div className={css.hitBody}>
                <EntryHeading entry={hit.entry} teamName={teamNames.get(hit.entry.teamId)} />
                <p className="small">
                  <span className="muted">Shared blocks: </span>
                  {hit.sharedBlocks.length === 0
                    ? "none"
                    : hit.sharedBlocks.map((b) => b.replace(/-/g, " ")).join(", ")}
                </p>
                <p className="small">
                  <Link href={compareHref(entryId, hit.entry.id)}>Compare with the source</Link>
                  {" · "}
                  <Link href={searchHref({ view: "similar", entryId: hit.entry.id })}>
                    Similar to this one
                  </Link>
                </p>
              </div>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
