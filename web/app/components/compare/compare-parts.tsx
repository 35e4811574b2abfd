"use client";
/**
 * The parts and nets of a comparison as tables: every matched pair with its pair number (the
 * number marked on both schematics), values side by side, "differs" or "same", and how sure the
 * pairing is; then the parts on one board only, and the nets whose connections changed.
 */
import type { EntryComparison } from "../../client/api-types";
import css from "./compare.module.css";

const BY_WORDS = { structure: "structure", value: "equal value", kind: "kind only" } as const;

/** The parts table. */
export function CompareParts({ comparison }: { comparison: EntryComparison }) {
  const { pairs, onlyA, onlyB } = comparison.parts;
  const differing = pairs.filter((p) => p.differs).length;
  return (
    <section className={css.section} data-testid="compare-parts">
      <h2>Parts</h2>
      <p className={css.hint}>
        {pairs.length} matched by where they sit in the circuit, not by their names; {differing}{" "}
        with different values; {onlyA.length} only on A, {onlyB.length} only on B.
      </p>
      <table className={css.table}>
        <thead>
          <tr>
            <th scope="col">#</th>
            <th scope="col">A</th>
            <th scope="col">B</th>
            <th scope="col">kind</th>
            <th scope="col">values on A</th>
            <th scope="col">values on B</th>
            <th scope="col">marking A / B</th>
            <th scope="col">verdict</th>
            <th scope="col" className={css.num}>
              confidence
            </th>
          </tr>
        </thead>
        <tbody>
          {pairs.map((p, i) => (
            <tr
              key={`${p.a}-${p.b}`}
              className={p.differs ? css.differs : undefined}
              data-pair={`${p.a}:${p.b}`}
              data-differs={p.differs ? "yes" : "no"}
            >
              <td>#{i + 1}</td>
              <td>{p.a}</td>
              <td>{p.b}</td>
              <td>{p.kind}</td>
              <td>{p.values.a ?? "—"}</td>
              <td>{p.values.b ?? "—"}</td>
              <td>
                {p.marking.a ?? "—"} / {p.marking.b ?? "—"}
              </td>
              <td className={css.marker}>{p.differs ? "≠ differs" : "same"}</td>
              <td className={css.num} title={`matched by ${BY_WORDS[p.by]}`}>
                {Math.round(p.confidence * 100)}% ({BY_WORDS[p.by]})
              </td>
            </tr>
          ))}
          {onlyA.map((ref) => (
            <tr key={`a-${ref}`} className={css.only} data-only="A">
              <td>—</td>
              <td>{ref}</td>
              <td>—</td>
              <td colSpan={5} />
              <td className={css.marker}>only on A</td>
            </tr>
          ))}
          {onlyB.map((ref) => (
            <tr key={`b-${ref}`} className={css.only} data-only="B">
              <td>—</td>
              <td>—</td>
              <td>{ref}</td>
              <td colSpan={5} />
              <td className={css.marker}>only on B</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}

/** The nets whose connections, role or touchability changed. */
export function CompareNets({ comparison }: { comparison: EntryComparison }) {
  const { nets } = comparison;
  return (
    <section className={css.section} data-testid="compare-nets">
      <h2>Nets that changed</h2>
      {nets.length === 0 ? (
        <p className={css.hint}>Every net connects the same parts on both boards.</p>
      ) : (
        <table className={css.table}>
          <thead>
            <tr>
              <th scope="col">net on A</th>
              <th scope="col">net on B</th>
              <th scope="col">pins only on A</th>
              <th scope="col">pins only on B</th>
              <th scope="col">other</th>
            </tr>
          </thead>
          <tbody>
            {nets.map((n) => (
              <tr key={`${n.a}-${n.b}`}>
                <td>{n.a ?? "(none: only on B)"}</td>
                <td>{n.b ?? "(none: only on A)"}</td>
                <td>{n.onlyA.join(", ") || "—"}</td>
                <td>{n.onlyB.join(", ") || "—"}</td>
                <td>{n.changes.join("; ") || "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
