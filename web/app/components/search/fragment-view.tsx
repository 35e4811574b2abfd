"use client";
/**
 * Circuit fragment search: the visitor pastes a few traced parts (a deck, CSV list or record;
 * values, ratings and net roles may be left out) and gets every readable entry that contains
 * them, each place the fragment sits, and the entry's schematic with it marked. The text and
 * its format go into the URL, so a fragment search can be shared like any other.
 */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import type { ApiProblem, FragmentFormat } from "../../client/api-types";
import { ApiFailure, failureText } from "../../client/http";
import { ProblemList } from "../entry/problem-list";
import { FORMAT_NAMES, FRAGMENT_EXAMPLES } from "./fragment-examples";
import { FragmentHit } from "./fragment-hit";
import { useFragmentSearch } from "./search-queries";
import { FRAGMENT_FORMATS, searchHref, type FragmentState } from "./search-url";
import css from "./search.module.css";

/** How many hits show their schematic straight away (the rest on request). */
const SCHEMATICS_SHOWN = 3;

/** The problems of a fragment the server could not read, each with its line and path. */
function problemsOf(err: unknown): ApiProblem[] | null {
  if (!(err instanceof ApiFailure) || err.status !== 422) return null;
  if (err.body.errors && err.body.errors.length > 0) return err.body.errors;
  const line = typeof err.body.line === "number" ? err.body.line : null;
  return [{ path: err.body.path ?? "", message: err.body.message, line }];
}

export function FragmentView({
  state,
  teamNames,
}: {
  state: FragmentState;
  teamNames: ReadonlyMap<string, string>;
}) {
  const router = useRouter();
  const [draft, setDraft] = useState(state.text);
  const [format, setFormat] = useState<FragmentFormat>(state.format);
  const search = useFragmentSearch(state.text, state.format);

  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    router.push(searchHref({ view: "fragment", text: draft, format }), { scroll: false });
  }

  const problems = problemsOf(search.error);
  const results = search.data?.results ?? [];
  return (
    <section aria-labelledby="fragment-heading">
      <h2 id="fragment-heading">Find a circuit fragment</h2>
      <p className="muted small">
        Paste a few parts as you traced them. Parts match by kind and by which pin goes where; the
        two ends of a resistor or plain capacitor may be either way round, different nets of the
        fragment must be different nets of the entry, and the entry may have more parts on those
        nets. Values, ratings and net roles may be left out.
      </p>
      <form className={css.fragmentForm} onSubmit={onSubmit} aria-label="Fragment">
        <label>
          <span>Format</span>
          <select
            name="format"
            value={format}
            onChange={(e) => setFormat(e.target.value as FragmentFormat)}
          >
            {FRAGMENT_FORMATS.map((f) => (
              <option key={f} value={f}>
                {FORMAT_NAMES[f]}
              </option>
            ))}
          </select>
        </label>
        <label className={css.fragmentText}>
          <span>Fragment</span>
          <textarea
            name="fragment"
            rows={8}
            spellCheck={false}
            value={draft}
            placeholder={FRAGMENT_EXAMPLES[format]}
            onChange={(e) => setDraft(e.target.value)}
          />
        </label>
        <div className="row">
          <button type="submit" disabled={draft.trim() === ""}>
            Find fragment
          </button>
          <button
            type="button"
            className="link-button"
            onClick={() => setDraft(FRAGMENT_EXAMPLES[format])}
          >
            Use the example
          </button>
        </div>
      </form>
      {state.text.trim() === "" ? null : problems ? (
        <ProblemList problems={problems} text={state.text} title="The fragment could not be read" />
      ) : search.isError ? (
        <p className="error-text" role="alert">
          Could not search: {failureText(search.error)}
        </p>
      ) : search.isPending ? (
        <p className="muted">Matching the fragment…</p>
      ) : results.length === 0 ? (
        <p className="muted" data-testid="no-results">
          No entry you can read contains this fragment.
        </p>
      ) : (
        <>
          <p className="muted" role="status">
            {results.length} entr{results.length === 1 ? "y contains" : "ies contain"} the fragment.
            {search.data?.complete === false &&
              " The search stopped before checking every candidate, so there may be more; a fragment with more parts narrows it."}
          </p>
          <ol className={css.hitList} data-testid="fragment-results">
            {results.map((r, i) => (
              <FragmentHit
                key={r.entry.id}
                entry={r.entry}
                matches={r.matches}
                teamName={teamNames.get(r.entry.teamId)}
                showSchematic={i < SCHEMATICS_SHOWN}
              />
            ))}
          </ol>
        </>
      )}
    </section>
  );
}
