"use client";
/**
 * One entry that contains the fragment: every place it sits (fragment ref → entry ref), and the
 * entry's schematic with the chosen place marked. The schematic is read only when shown.
 */
import { useState } from "react";
import type { EntrySummary, FragmentMatch } from "../../client/api-types";
import { failureText } from "../../client/http";
import { useEntry } from "../entry/entry-queries";
import { EntryHeading } from "./entry-heading";
import { HighlightedSchematic } from "./highlighted-schematic";
import css from "./search.module.css";

/** Entry ref → fragment ref, the way round the schematic needs it. */
function byEntryRef(match: FragmentMatch): Record<string, string> {
  return Object.fromEntries(Object.entries(match.parts).map(([frag, entry]) => [entry, frag]));
}

function EntrySchematic({
  entryId,
  match,
  title,
}: {
  entryId: string;
  match: FragmentMatch;
  title: string;
}) {
  const state = useEntry(entryId);
  if (state.isError)
    return <p className="error-text">Could not read the entry: {failureText(state.error)}</p>;
  if (state.isPending) return <p className="muted">Drawing the schematic…</p>;
  const refs = Object.entries(match.parts)
    .map(([frag, entry]) => `${entry} as ${frag}`)
    .join(", ");
  return (
    <HighlightedSchematic
      layout={state.data.analysis?.layout}
      matched={byEntryRef(match)}
      label={`Schematic of ${title}, fragment marked on ${refs}`}
    />
  );
}

export function FragmentHit({
  entry,
  matches,
  teamName,
  showSchematic,
}: {
  entry: EntrySummary;
  matches: FragmentMatch[];
  teamName: string | undefined;
  showSchematic: boolean;
}) {
  const [chosen, setChosen] = useState(0);
  const [shown, setShown] = useState(showSchematic);
  const match = matches[chosen] ?? matches[0];
  return (
    <li className={css.hit} data-entry-id={entry.id}>
      <div className={css.hitBody}>
        <EntryHeading entry={entry} teamName={teamName} />
        <p className="muted small">
          The fragment sits in {matches.length} place{matches.length === 1 ? "" : "s"}.
        </p>
        <div className={css.matchChoices} role="group" aria-label={`Places in ${entry.title}`}>
          {matches.map((m, i) => (
            <table
              key={i}
              className={i === chosen ? css.matchChosen : css.match}
              data-testid="fragment-match"
            >
              <caption>
                <button
                  type="button"
                  className="link-button"
                  aria-pressed={i === chosen}
                  onClick={() => {
                    setChosen(i);
                    setShown(true);
                  }}
                >
                  Place {i + 1}
                  {i === chosen ? " (marked)" : ""}
                </button>
              </caption>
              <thead>
                <tr>
                  <th scope="col">fragment</th>
                  <th scope="col">entry</th>
                </tr>
              </thead>
              <tbody>
                {Object.entries(m.parts).map(([frag, ref]) => (
                  <tr key={frag}>
                    <td>{frag}</td>
                    <td>→ {ref}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ))}
        </div>
        {match &&
          (shown ? (
            <EntrySchematic entryId={entry.id} match={match} title={entry.title} />
          ) : (
            <button type="button" onClick={() => setShown(true)}>
              Show on the schematic
            </button>
          ))}
      </div>
    </li>
  );
}
