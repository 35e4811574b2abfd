"use client";
/**
 * What-if: run the engine on the server for another supply (120 V / 60 Hz, 230 V / 50 Hz, any
 * value) and/or changed part values, and show the answer beside the stored analysis with the
 * differences. When a thyristor or triac that fires at the rated supply stops firing, the answer
 * says so and shows the gate-resistor change the engine suggests, which can be tried at once.
 */
import { useState } from "react";
import { ApiFailure, failureText } from "../../../client/http";
import type { TriggerSuggestion, WhatIfRequest } from "../../../client/api-types";
import { useWhatIf } from "../entry-queries";
import { finite, si } from "../si-units";
import { arr, obj, str, type Obj } from "./result-access";
import { WhatIfCompare } from "./what-if-compare";
import css from "../entry.module.css";

type SupplyChoice = "rated" | "120/60" | "230/50" | "other";

interface Change {
  part: string;
  value: string;
}

/** The suggestion a trigger of the what-if result carries, if any. */
export function suggestionOf(trigger: Obj): TriggerSuggestion | null {
  const s = obj(trigger.suggestion);
  const value = finite(s.value);
  const angle = finite(s.angle_deg);
  const part = str(s.part);
  if (part === null || value === null) return null;
  return { part, value, series: str(s.series) ?? "", angle_deg: angle ?? NaN };
}

/** The form and, once run, the comparison. */
export function WhatIfPanel({
  entryId,
  revision,
  record,
  stored,
}: {
  entryId: string;
  revision: number;
  record: Obj;
  stored: Obj;
}) {
  const rated = obj(obj(record.device).rated_supply);
  const ratedV = finite(rated.vrms);
  const ratedHz = finite(rated.hz);
  const refs = arr(record.parts)
    .map(obj)
    .filter((p) => p.value !== undefined || obj(p.model).r !== undefined)
    .map((p) => String(p.ref));
  const [choice, setChoice] = useState<SupplyChoice>(ratedV === 120 ? "230/50" : "120/60");
  const [other, setOther] = useState({ vrms: "", hz: "" });
  const [changes, setChanges] = useState<Change[]>([]);
  const [asked, setAsked] = useState<WhatIfRequest | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const answer = useWhatIf(entryId, revision, asked);

  const buildRequest = (extra: Change[] = []): WhatIfRequest | null => {
    const req: WhatIfRequest = {};
    if (choice === "120/60") req.supply = { vrms: 120, hz: 60 };
    else if (choice === "230/50") req.supply = { vrms: 230, hz: 50 };
    else if (choice === "other") {
      const vrms = Number(other.vrms);
      const hz = Number(other.hz);
      if (!(vrms > 0) || !(hz > 0)) {
        setFormError("Give the supply as a positive RMS voltage and a positive frequency.");
        return null;
      }
      req.supply = { vrms, hz };
    }
    const all = [...changes, ...extra].filter((c) => c.part !== "" && c.value.trim() !== "");
    if (all.length > 0) req.changes = all.map((c) => ({ part: c.part, value: c.value.trim() }));
    setFormError(null);
    return req;
  };

  const run = () => {
    const req = buildRequest();
    if (req !== null) setAsked(req);
  };
  const trySuggestion = (s: TriggerSuggestion) => {
    const next = [
      ...changes.filter((c) => c.part !== s.part),
      { part: s.part, value: String(s.value) },
    ];
    setChanges(next);
    const req = buildRequest([]);
    if (req !== null) {
      const merged = [
        ...(req.changes ?? []).filter((c) => c.part !== s.part),
        { part: s.part, value: String(s.value) },
      ];
      setAsked({ ...req, changes: merged });
    }
  };

  const failure = answer.error;
  const problem =
    failure instanceof ApiFailure
      ? `${failure.body.message}${failure.body.path ? ` (at ${failure.body.path})` : ""}`
      : failure
        ? failureText(failure)
        : null;
  const result = answer.data ? (answer.data as unknown as Obj) : null;
  const stopped = arr(result?.triggers)
    .map(obj)
    .filter((t) => t.fires === false)
    .map((t) => ({
      part: str(t.part) ?? "?",
      firedBefore:
        obj(t.rated).fires === true ||
        arr(stored.triggers)
          .map(obj)
          .some((s) => s.part === t.part && s.fires === true),
      suggestion: suggestionOf(t),
      note: str(t.suggestion_note),
    }));
  const supplyWords = (s: Obj) => `${finite(s.vrms) ?? "?"} V / ${finite(s.hz) ?? "?"} Hz`;

  return (
    <div data-testid="what-if">
      <form
        className={css.whatIfForm}
        onSubmit={(e) => {
          e.preventDefault();
          run();
        }}
      >
        <fieldset>
          <legend>Supply</legend>
          {(
            [
              ["rated", `as rated (${ratedV ?? "?"} V / ${ratedHz ?? "?"} Hz)`],
              ["120/60", "120 V / 60 Hz"],
              ["230/50", "230 V / 50 Hz"],
              ["other", "other:"],
            ] as const
          ).map(([value, label]) => (
            <label key={value} className={css.inlineLabel}>
              <input
                type="radio"
                name="what-if-supply"
                value={value}
                checked={choice === value}
                onChange={() => setChoice(value)}
              />{" "}
              {label}
            </label>
          ))}
          {choice === "other" ? (
            <>
              <input
                aria-label="supply voltage (V RMS)"
                className={css.smallInput}
                inputMode="decimal"
                placeholder="V RMS"
                value={other.vrms}
                onChange={(e) => setOther({ ...other, vrms: e.target.value })}
              />{" "}
              <input
                aria-label="supply frequency (Hz)"
                className={css.smallInput}
                inputMode="decimal"
                placeholder="Hz"
                value={other.hz}
                onChange={(e) => setOther({ ...other, hz: e.target.value })}
              />
            </>
          ) : null}
        </fieldset>
        <fieldset>
          <legend>Part values</legend>
          {changes.map((c, i) => (
            <div key={i} className={css.row}>
              <select
                aria-label={`part ${i + 1}`}
                value={c.part}
                onChange={(e) =>
                  setChanges(changes.map((x, k) => (k === i ? { ...x, part: e.target.value } : x)))
                }
              >
                <option value="">choose a part</option>
                {refs.map((r) => (
                  <option key={r} value={r}>
                    {r}
                  </option>
                ))}
              </select>
              <input
                aria-label={`new value ${i + 1}`}
                className={css.smallInput}
                placeholder="e.g. 47k, 220n"
                value={c.value}
                onChange={(e) =>
                  setChanges(changes.map((x, k) => (k === i ? { ...x, value: e.target.value } : x)))
                }
              />
              <button
                type="button"
                className={css.quiet}
                onClick={() => setChanges(changes.filter((_, k) => k !== i))}
              >
                remove
              </button>
            </div>
          ))}
          <button
            type="button"
            className={css.quiet}
            onClick={() => setChanges([...changes, { part: "", value: "" }])}
          >
            Change a part&apos;s value
          </button>
        </fieldset>
        <button
          type="submit"
          className={css.button}
          data-testid="run-what-if"
          disabled={answer.isFetching}
        >
          {answer.isFetching ? "Running…" : "Run what-if"}
        </button>
        {formError ? <p className={css.failure}>{formError}</p> : null}
      </form>
      {problem ? (
        <p className={css.failure} role="alert" data-testid="what-if-error">
          {problem}
        </p>
      ) : null}
      {result !== null ? (
        <div data-testid="what-if-result">
          <p className={css.notice}>
            Estimates from the traced netlist at {supplyWords(obj(result.supply))}
            {asked?.changes?.length
              ? ` with ${asked.changes.map((c) => `${c.part} = ${c.value}`).join(", ")}`
              : ""}
            ; mains can kill, and the caution at the top of the page applies here too.
          </p>
          {stopped.map((s) => (
            <div key={s.part} className={css.failure} data-testid="what-if-stops-firing">
              <strong>{s.part} does not fire</strong> at {supplyWords(obj(result.supply))}
              {s.firedBefore ? ", although it fires at the rated supply" : ""}.
              {s.suggestion ? (
                <>
                  {" "}
                  Suggested change:{" "}
                  <strong data-testid="what-if-suggestion">
                    {s.suggestion.part} to {si(s.suggestion.value, "Ω")}
                  </strong>{" "}
                  ({s.suggestion.series} value), which then fires at{" "}
                  {Number.isFinite(s.suggestion.angle_deg)
                    ? `${s.suggestion.angle_deg.toFixed(1)}°`
                    : "an angle not given"}
                  .{" "}
                  <button
                    type="button"
                    className={css.quiet}
                    data-testid="try-suggestion"
                    onClick={() => trySuggestion(s.suggestion!)}
                  >
                    Try it
                  </button>
                </>
              ) : (
                ` No change was suggested${s.note ? `: ${s.note}` : "."}`
              )}
            </div>
          ))}
          <WhatIfCompare stored={stored} variant={result} />
        </div>
      ) : null}
    </div>
  );
}
