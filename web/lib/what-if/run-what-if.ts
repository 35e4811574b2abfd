/**
 * One what-if request, from the entry to the answer: the caller must be able to read the entry;
 * the body is checked against its current revision's record (422 naming the field); a cached
 * answer for the same (revision, engine version, input) is returned at once; otherwise the run
 * takes one of the caller's what-if allowances and runs off the request thread within the
 * analysis budget, and its result is cached.
 */
import { ENGINE_VERSION, type AnalysisResult } from "@teardown/engine";
import { readableEntry } from "../access";
import { ApiError, notFound } from "../api-error";
import type { Caller } from "../caller";
import { database } from "../database";
import { clientAddress } from "../request-guard";
import { revisionByNumber, storedRecord } from "../revisions";
import { checkedWhatIf, type WhatIfBody } from "./what-if-body";
import { cachedWhatIf, storeWhatIf } from "./what-if-cache";
import { canonicalInput, inputKey, type WhatIfInput } from "./what-if-key";
import { runWhatIfOffThread } from "./what-if-pool";
import { takeWhatIfAllowance } from "./what-if-rate";

/** Seconds a caller is told to wait when every what-if thread and waiting place is taken. */
const BUSY_RETRY_SECONDS = 10;

export interface WhatIfAnswer {
  result: AnalysisResult;
  /** The input as analysed: the supply and each change in SI units, in part order. */
  input: WhatIfInput;
  /** True when the answer came from the cache. */
  cached: boolean;
  revision: number;
}

export async function answerWhatIf(
  req: Request,
  caller: Caller | null,
  entryId: string,
  body: WhatIfBody,
): Promise<WhatIfAnswer> {
  const { db } = database();
  const { entry } = await readableEntry(db, caller, entryId);
  if (entry.currentRevision === null) throw notFound("revision");
  const rev = await revisionByNumber(db, entry.id, entry.currentRevision);
  const checked = checkedWhatIf(storedRecord(rev.record), body);
  const input = canonicalInput(checked);
  const key = inputKey(input);
  const base = { input, revision: rev.number };
  const hit = await cachedWhatIf(db, rev.id, ENGINE_VERSION, key);
  if (hit !== null) return { ...base, result: hit, cached: true };

  takeWhatIfAllowance(caller ? `user:${caller.userId}` : `address:${clientAddress(req)}`);
  const run = await runWhatIfOffThread(rev.record, input);
  if (run.ok) {
    const result = run.result as AnalysisResult;
    // A run cut short by the clock says more about the machine's load than about the circuit.
    const cutShort = result.status === "not-solved" && result.solver_code === "time-budget";
    if (!cutShort)
      await storeWhatIf(db, {
        revisionId: rev.id,
        engineVersion: ENGINE_VERSION,
        key,
        input,
        result,
      });
    return { ...base, result, cached: false };
  }
  switch (run.kind) {
    case "busy":
      throw new ApiError(503, "what-if-busy", "every what-if place is taken; try again shortly", {
        retryAfterSeconds: BUSY_RETRY_SECONDS,
      });
    case "timeout":
      throw new ApiError(
        503,
        "what-if-budget",
        `the what-if ran past the analysis budget of ${run.budgetMs} ms and was stopped`,
      );
    case "input":
      throw new ApiError(422, "invalid-what-if", `the what-if is not valid: ${run.message}`, {
        path: run.errors[0]?.path,
        errors: run.errors,
      });
    case "analysis":
      throw new ApiError(
        422,
        "what-if-failed",
        `the what-if could not be analysed: ${run.message}`,
        {
          stage: run.code,
        },
      );
    case "crash":
      throw new Error(`what-if thread: ${run.message}`);
  }
}
