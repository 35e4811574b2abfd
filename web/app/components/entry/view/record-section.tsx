"use client";
/**
 * What the person entered beyond the parts: the summary (Markdown, rendered without HTML), the
 * device's category, rated supply and tags, each net's role, touchability and note, and the
 * board spacings with the creepage and clearance they were checked against (the figures of a
 * spacing found short come from its finding; a spacing that passed shows that it passed).
 */
import { finite, si } from "../si-units";
import type { Finding } from "./finding-text";
import { arr, obj, str, strings, type Obj } from "./result-access";
import { SafeMarkdown } from "./safe-markdown";
import css from "../entry.module.css";

/** "creepage required: 3.2 mm" → "3.2 mm", from a spacing finding's figures. */
function figure(f: Finding | undefined, label: string): string | null {
  const line = f?.figures.find((s) => s.startsWith(`${label}: `));
  return line ? line.slice(label.length + 2) : null;
}

function spacingCheck(between: string[], findings: readonly Finding[], notes: string[]) {
  const key = [...between].sort().join("|");
  const short = findings.find(
    (f) => f.code === "spacing-short" && [...f.nets].sort().join("|") === key,
  );
  const unchecked = notes.some((n) => n.startsWith(`spacing ${between.join("-")}:`));
  return { short, unchecked };
}

/** The record's own words and figures. */
export function RecordSection({
  record,
  result,
  findings,
}: {
  record: Obj;
  result: Obj | null;
  findings: readonly Finding[];
}) {
  const device = obj(record.device);
  const supply = obj(device.rated_supply);
  const tags = strings(device.tags);
  const nets = Object.entries(obj(record.nets)).map(([name, v]) => [name, obj(v)] as const);
  const spacings = arr(obj(record.board).spacings).map(obj);
  const notes = strings(result?.notes).concat(strings(result?.risk_notes));
  const summary = str(record.summary);
  return (
    <div data-testid="record-section">
      <dl className={css.facts}>
        <dt>Category</dt>
        <dd>{str(device.category) ?? "not given"}</dd>
        <dt>Rated supply</dt>
        <dd>
          {finite(supply.vrms) !== null
            ? `${si(supply.vrms, "V")} RMS, ${si(supply.hz, "Hz")}`
            : "not given"}
        </dd>
        <dt>Tags</dt>
        <dd data-testid="record-tags">
          {tags.length === 0
            ? "none"
            : tags.map((t) => (
                <span key={t} className={css.partTag}>
                  {t}
                </span>
              ))}
        </dd>
      </dl>
      <h3>Summary</h3>
      {summary ? <SafeMarkdown text={summary} /> : <p className="muted">No summary.</p>}
      <h3>Nets</h3>
      {nets.length === 0 ? (
        <p className="muted">No net carries a role or note.</p>
      ) : (
        <table className={css.table} data-testid="record-nets">
          <thead>
            <tr>
              <th>Net</th>
              <th>Role</th>
              <th>Touchable</th>
              <th>Note</th>
            </tr>
          </thead>
          <tbody>
            {nets.map(([name, n]) => (
              <tr key={name}>
                <td className={css.code}>{name}</td>
                <td>{str(n.role) ?? "—"}</td>
                <td>{n.accessible === true ? <strong>yes</strong> : "no"}</td>
                <td>{str(n.note) ?? ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <h3>Board spacings</h3>
      {spacings.length === 0 ? (
        <p className="muted">No spacing measured.</p>
      ) : (
        <table className={css.table} data-testid="record-spacings">
          <thead>
            <tr>
              <th>Between</th>
              <th className={css.num}>Creepage</th>
              <th className={css.num}>Clearance</th>
              <th>Checked against</th>
            </tr>
          </thead>
          <tbody>
            {spacings.map((s, i) => {
              const between = strings(s.between);
              const { short, unchecked } = spacingCheck(between, findings, notes);
              return (
                <tr key={i}>
                  <td>
                    {between.join(" to ")}
                    {s.slot === true ? " (slot)" : ""}
                  </td>
                  <td className={css.num}>
                    {finite(s.creepage_mm) !== null ? `${s.creepage_mm} mm` : "—"}
                  </td>
                  <td className={css.num}>
                    {finite(s.clearance_mm) !== null ? `${s.clearance_mm} mm` : "—"}
                  </td>
                  <td>
                    {short ? (
                      <>
                        <strong className={css.danger}>short</strong>: creepage required{" "}
                        {figure(short, "creepage required") ?? "not given"}, clearance required{" "}
                        {figure(short, "clearance required") ?? "not given"} ({short.message})
                      </>
                    ) : unchecked ? (
                      "not checked: a net is not in the solved circuit"
                    ) : result === null ? (
                      "not checked yet"
                    ) : (
                      "no shortfall against the insulation table for its working voltage"
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </div>
  );
}
