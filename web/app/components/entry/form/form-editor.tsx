"use client";
/**
 * The form editor shared by the new-entry and edit pages: device, parts, nets, measurements
 * and board spacings, checked live by the engine with each problem beside its field. Before
 * saving it asks for what the solver needs (line and neutral roles, a load's resistance or
 * capacitance) and says what would be left out; saving anyway takes a second, explicit click.
 * The page owns the state (so it can keep the editor's edits across a stale save) and the submit.
 */
import { useState, type ReactNode } from "react";
import type { FormState } from "./form-state";
import { FieldProblems, hasProblem } from "./field-problems";
import { MeasurementsEditor } from "./measurements-editor";
import { NetsEditor } from "./nets-editor";
import { PartsEditor } from "./parts-editor";
import { fieldPaths, placeProblems, type PlacedProblem } from "./place-errors";
import { SpacingsEditor } from "./spacings-editor";
import { checkForm, solverShortfall, useLiveCheck } from "./use-live-check";
import css from "./form.module.css";

export interface FormEditorProps {
  state: FormState;
  onChange: (fn: (s: FormState) => FormState) => void;
  /** Submit button text ("Create entry" or "Save revision"). */
  submitLabel: string;
  /** Called with the record document and the revision message when the engine accepts the form. */
  onSubmit: (document: Record<string, unknown>, message: string) => void;
  message: string;
  onMessage: (m: string) => void;
  busy: boolean;
  /** Problems the server listed for the last submit (placed like the live ones). */
  serverProblems?: PlacedProblem[];
  /** Shown just above the submit row (a save failure, a stale-revision notice). */
  children?: ReactNode;
  /** A form id, so two forms on one page stay apart. */
  id: string;
}

/** The form editor. */
export function FormEditor(props: FormEditorProps) {
  const { state, onChange: update } = props;
  const live = useLiveCheck(state);
  const problems: PlacedProblem[] = [
    ...live.errors,
    ...(live.errors.length === 0 ? (props.serverProblems ?? []) : []),
  ];
  const places = placeProblems(problems, fieldPaths(state));
  const warnings = placeProblems(live.warnings, []).unplaced;
  const set = (change: Partial<FormState>) => update((s) => ({ ...s, ...change }));
  // The left-out list the person agreed to save with; a changed list asks again.
  const [acceptedGaps, setAcceptedGaps] = useState<string | null>(null);
  const shortfall = solverShortfall(live.expected);

  return (
    <form
      id={props.id}
      className={css.form}
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        // The live check may lag the last keystroke (it is deferred): judge the state as it is now.
        const now = checkForm(state);
        if (now.errors.length > 0) return;
        const missing = solverShortfall(now.expected);
        if (missing !== null && missing !== acceptedGaps) {
          setAcceptedGaps(missing);
          document.getElementById(`${props.id}-solver-needs`)?.scrollIntoView({ block: "center" });
          return;
        }
        props.onSubmit(now.document, props.message);
      }}
    >
      <div
        className={`${css.status} ${live.errors.length > 0 ? css.statusBad : css.statusOk}`}
        aria-live="polite"
        data-testid="form-check"
      >
        {live.errors.length > 0
          ? `${live.errors.length} problem${live.errors.length === 1 ? "" : "s"} to fix before saving (shown beside each field).`
          : `The engine reads this record: ${state.parts.length} part${state.parts.length === 1 ? "" : "s"}${live.issues.length > 0 ? `, ${live.issues.length} circuit note${live.issues.length === 1 ? "" : "s"}` : ""}.`}
        {places.unplaced.length > 0 ? (
          <ul>
            {places.unplaced.map((p, i) => (
              <li key={i}>
                {p.path ? <code>{p.path}</code> : null} {p.message}
              </li>
            ))}
          </ul>
        ) : null}
      </div>

      <fieldset className={css.fieldset}>
        <legend>Device</legend>
        <div className={css.grid}>
          <label className={`${css.label} ${css.wide}`}>
            Title
            <input
              className={css.input}
              name="title"
              value={state.title}
              aria-invalid={hasProblem(places, "title")}
              onChange={(e) => set({ title: e.target.value })}
            />
            <FieldProblems places={places} path="title" />
          </label>
          <label className={css.label}>
            Category
            <input
              className={css.input}
              name="category"
              placeholder="fragrance warmer"
              value={state.category}
              onChange={(e) => set({ category: e.target.value })}
            />
            <FieldProblems places={places} path="device.category" />
          </label>
          <label className={css.label}>
            Rated supply, volts RMS
            <input
              className={css.input}
              name="device.rated_supply.vrms"
              value={state.vrms}
              aria-invalid={hasProblem(places, "device.rated_supply.vrms")}
              onChange={(e) => set({ vrms: e.target.value })}
            />
            <FieldProblems places={places} path="device.rated_supply.vrms" />
          </label>
          <label className={css.label}>
            Rated supply, hertz
            <input
              className={css.input}
              name="device.rated_supply.hz"
              value={state.hz}
              aria-invalid={hasProblem(places, "device.rated_supply.hz")}
              onChange={(e) => set({ hz: e.target.value })}
            />
            <FieldProblems places={places} path="device.rated_supply.hz" />
          </label>
          <label className={css.label}>
            Tags (comma separated)
            <input
              className={css.input}
              name="tags"
              value={state.tags}
              onChange={(e) => set({ tags: e.target.value })}
            />
            <FieldProblems places={places} path="device.tags" />
          </label>
          <label className={`${css.label} ${css.wide}`}>
            Summary (Markdown)
            <textarea
              className={css.textarea}
              name="summary"
              value={state.summary}
              onChange={(e) => set({ summary: e.target.value })}
            />
            <FieldProblems places={places} path="summary" />
          </label>
        </div>
        <FieldProblems places={places} path="device" />
      </fieldset>

      <PartsEditor state={state} update={update} places={places} />
      <NetsEditor state={state} update={update} places={places} />
      <MeasurementsEditor state={state} update={update} places={places} />
      <SpacingsEditor state={state} update={update} places={places} />

      {warnings.length > 0 || live.issues.length > 0 ? (
        <fieldset className={css.fieldset}>
          <legend>Notes from the engine</legend>
          <ul>
            {warnings.map((w, i) => (
              <li key={`w${i}`} className={css.warning}>
                {w.path ? <code>{w.path}</code> : null} {w.message}
              </li>
            ))}
            {live.issues.map((issue, i) => (
              <li key={`c${i}`} className={issue.severity === "error" ? css.problem : css.warning}>
                {issue.message}
              </li>
            ))}
          </ul>
        </fieldset>
      ) : null}

      {shortfall !== null ? (
        <fieldset
          className={css.fieldset}
          id={`${props.id}-solver-needs`}
          data-testid="solver-needs"
          role="status"
        >
          <legend>What the analysis will not cover</legend>
          <p className={css.warning}>{shortfall}</p>
          <p>
            Give each load a resistance (model r) or a capacitance (model c), a value to every
            resistor, capacitor and inductor, and one net the line role and one the neutral role.
            {acceptedGaps === shortfall
              ? " Saving now stores the entry with these left out; its analysis will say so."
              : ""}
          </p>
        </fieldset>
      ) : null}
      {props.children}
      <div className={css.submitRow}>
        <label className={css.label}>
          What changed (revision message)
          <input
            className={css.input}
            name="message"
            value={props.message}
            onChange={(e) => props.onMessage(e.target.value)}
          />
        </label>
        <button type="submit" className={css.submit} disabled={props.busy}>
          {shortfall !== null && acceptedGaps === shortfall
            ? `${props.submitLabel} anyway`
            : props.submitLabel}
        </button>
      </div>
    </form>
  );
}
