"use client";
/**
 * The stored waveforms of the analysis the entry page shows, fetched when the tab that draws
 * them opens: entry reads leave them out because they are most of a solved entry's answer and
 * most visits never look at them.
 */
import { failureText } from "../../../client/http";
import { useWaveforms } from "../entry-queries";
import type { Obj } from "./result-access";
import { WaveformPlots } from "./waveform-plot";

/** The waveform chart for one revision's shown analysis, once its waveforms have arrived. */
export function StoredWaveforms({
  entryId,
  revision,
  analysisKey,
  result,
}: {
  entryId: string;
  revision: number;
  /** Which analysis is shown (engine version and finish time): a new one asks again. */
  analysisKey: string;
  result: Obj;
}) {
  const query = useWaveforms(entryId, revision, analysisKey);
  if (query.isPending) return <p className="muted">Loading the waveforms…</p>;
  if (query.isError) return <p className="muted">{failureText(query.error)}</p>;
  return <WaveformPlots result={{ ...result, waveforms: query.data.waveforms }} />;
}
