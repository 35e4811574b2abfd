"use client";
/** Choosing the second board: the entries the caller may read, filtered by words. */
import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { failureText, getJson } from "../../client/http";
import type { EntrySummary } from "../../client/api-types";
import css from "./compare.module.css";

/** How many entries the picker lists at once (the list endpoint's largest page). */
const PICKER_PAGE = 100;

/** A list of readable entries, each a link to the comparison of `a` with it. */
export function EntryPicker({ a }: { a: string }) {
  const [words, setWords] = useState("");
  const query = useQuery({
    queryKey: ["compare-picker", words],
    queryFn: () => {
      const params = new URLSearchParams({ limit: String(PICKER_PAGE), sort: "title" });
      if (words.trim()) params.set("q", words.trim());
      return getJson<{ entries: EntrySummary[] }>(`/api/entries?${params}`);
    },
    retry: false,
  });
  const others = (query.data?.entries ?? []).filter((e) => e.id !== a);
  return (
    <section className={css.section} data-testid="compare-picker">
      <h2>Compare with…</h2>
      <label>
        Filter{" "}
        <input
          type="search"
          value={words}
          onChange={(e) => setWords(e.target.value)}
          placeholder="title, category, part…"
          maxLength={200}
        />
      </label>
      {query.isPending ? <p className={css.hint}>Loading…</p> : null}
      {query.isError ? <p className={css.errorBox}>{failureText(query.error)}</p> : null}
      <ul className={css.picker}>
        {others.map((e) => (
          <li key={e.id}>
            <a href={`/compare?${new URLSearchParams({ a, b: e.id })}`}>{e.title}</a>{" "}
            <span className={css.hint}>
              {e.category ?? "no category"} · {e.visibility}
            </span>
          </li>
        ))}
      </ul>
      {query.data && others.length === 0 ? <p className={css.hint}>No other entries.</p> : null}
    </section>
  );
}
