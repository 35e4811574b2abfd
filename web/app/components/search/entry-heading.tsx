/** An entry's line in any search list: title link, category, team, who may read it, flags. */
import Link from "next/link";
import type { EntrySummary } from "../../client/api-types";
import css from "./search.module.css";

export function EntryHeading({
  entry,
  teamName,
}: {
  entry: EntrySummary;
  teamName: string | undefined;
}) {
  return (
    <div className={css.entryHeading}>
      <Link href={`/entries/${entry.id}`} className={css.entryTitle}>
        {entry.title}
      </Link>
      <span className="muted small">
        {" "}
        {entry.category ?? "no category"}
        {teamName ? ` · ${teamName}` : ""}
      </span>
      {entry.visibility === "public" && <span className="tag quiet">public</span>}
      {entry.archived && <span className="tag">archived</span>}
      {entry.flags.length > 0 && (
        <span className={css.chips} aria-label="Flags">
          {entry.flags.map((f) => (
            <span key={f} className="chip">
              {f}
            </span>
          ))}
        </span>
      )}
    </div>
  );
}
