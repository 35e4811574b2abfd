"use client";
/**
 * The compare page: /compare?a=ENTRY&b=ENTRY[&aRevision=N&bRevision=M]. With only `a`, a picker
 * offers the second board; with both, the two schematics side by side and the tables below. The
 * pair lives in the URL, so a comparison can be linked and reloaded.
 */
import { useRouter } from "next/navigation";
import { useQuery } from "@tanstack/react-query";
import { failureText, getJson } from "../../client/http";
import type { CompareSide, EntryComparison } from "../../client/api-types";
import { CompareFigures, CompareFlags } from "./compare-figures";
import { CompareNets, CompareParts } from "./compare-parts";
import { CompareSchematics } from "./compare-schematics";
import { EntryPicker } from "./entry-picker";
import css from "./compare.module.css";

export interface CompareTarget {
  a: string;
  b: string | null;
  aRevision: number | null;
  bRevision: number | null;
}

/** The URL of a comparison. */
export function compareHref(t: CompareTarget): string {
  const p = new URLSearchParams({ a: t.a });
  if (t.b !== null) p.set("b", t.b);
  if (t.aRevision !== null) p.set("aRevision", String(t.aRevision));
  if (t.bRevision !== null) p.set("bRevision", String(t.bRevision));
  return `/compare?${p}`;
}

function RevisionChoice({
  label,
  side,
  onPick,
}: {
  label: string;
  side: CompareSide;
  onPick: (n: number) => void;
}) {
  const count = side.entry.currentRevision ?? 1;
  return (
    <label>
      {label} revision{" "}
      <select value={side.revision} onChange={(e) => onPick(Number(e.target.value))}>
        {Array.from({ length: count }, (_, i) => i + 1).map((n) => (
          <option key={n} value={n}>
            {n}
            {n === count ? " (current)" : ""}
          </option>
        ))}
      </select>
    </label>
  );
}

/** The whole page's content. */
export function ComparePage({ target }: { target: CompareTarget }) {
  const router = useRouter();
  const query = useQuery({
    queryKey: ["compare", target],
    queryFn: () => getJson<EntryComparison>(`/api${compareHref(target)}`),
    enabled: target.b !== null,
    retry: false,
  });
  if (target.b === null)
    return (
      <>
        <h1>Compare two teardowns</h1>
        <p>
          <a href={`/entries/${target.a}`}>← back to the entry</a>
        </p>
        <EntryPicker a={target.a} />
      </>
    );
  const c = query.data;
  return (
    <>
      <h1>Compare two teardowns</h1>
      {query.isPending ? <p className={css.hint}>Comparing…</p> : null}
      {query.isError ? <p className={css.errorBox}>{failureText(query.error)}</p> : null}
      {c ? (
        <>
          <div className={css.controls}>
            <RevisionChoice
              label="A:"
              side={c.a}
              onPick={(n) => router.push(compareHref({ ...target, aRevision: n }))}
            />
            <RevisionChoice
              label="B:"
              side={c.b}
              onPick={(n) => router.push(compareHref({ ...target, bRevision: n }))}
            />
            <a
              href={compareHref({
                a: target.b,
                b: target.a,
                aRevision: target.bRevision,
                bRevision: target.aRevision,
              })}
            >
              swap A and B
            </a>
            <a href={compareHref({ ...target, b: null, bRevision: null })}>choose another B</a>
          </div>
          <CompareSchematics comparison={c} />
          <CompareParts comparison={c} />
          <CompareNets comparison={c} />
          <CompareFigures comparison={c} />
          <CompareFlags comparison={c} />
        </>
      ) : null}
    </>
  );
}
