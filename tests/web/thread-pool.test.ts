/**
 * The web process's bounded thread pool (shared by the upload reader and the what-if runs), on a
 * tiny thread that speaks the same protocol: answers come back to the run that asked, the waiting
 * line is bounded (one more is `busy`), a run past its hard stop is a `timeout` and its thread is
 * replaced, a thrown error is a `crash` and the thread stays usable. Counts are set by hand.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ThreadPool } from "@/lib/thread-pool";

const dir = mkdtempSync(path.join(os.tmpdir(), "tl-thread-pool-"));
const entry = path.join(dir, "echo-thread.mjs");
// Echoes `n` doubled with its thread id; sleeps `ms` first (blocking, like a long solve); posts a
// crash for `fail`, as the real thread entries do when the work throws.
writeFileSync(
  entry,
  `import { parentPort, threadId } from "node:worker_threads";
parentPort.postMessage({ ready: true });
parentPort.on("message", (m) => {
  if (m.ms) { const end = Date.now() + m.ms; while (Date.now() < end) {} }
  if (m.fail) return parentPort.postMessage({ id: m.id, crash: "asked to fail" });
  parentPort.postMessage({ id: m.id, doubled: m.n * 2, thread: threadId });
});
`,
);

type Msg = { n: number; ms?: number; fail?: boolean };
type Answer = { doubled: number; thread: number };

const pools: ThreadPool<Msg, Answer>[] = [];
function pool(threads: number, queue: number): ThreadPool<Msg, Answer> {
  const p = new ThreadPool<Msg, Answer>({
    entryFile: () => entry,
    threads: () => threads,
    queueLength: () => queue,
    name: "the echo thread",
  });
  pools.push(p);
  return p;
}

afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
  rmSync(dir, { recursive: true, force: true });
});

describe("the bounded thread pool", () => {
  it("gives each run its own answer, several at once", async () => {
    const p = pool(2, 8);
    const out = await Promise.all([1, 2, 3, 4, 5].map((n) => p.run({ n }, 30_000)));
    expect(out.map((o) => (o.kind === "answer" ? o.answer.doubled : null))).toEqual([
      2, 4, 6, 8, 10,
    ]);
    // Two threads at most: the five runs were served by no more than two.
    const threads = new Set(out.map((o) => (o.kind === "answer" ? o.answer.thread : -1)));
    expect(threads.size).toBeLessThanOrEqual(2);
  });

  it("refuses a run as busy when the thread and the waiting line are full", async () => {
    const p = pool(1, 2);
    // One at work and two waiting fill a pool of one thread and a line of two; the fourth is
    // refused at once, and once the line has drained a fifth is taken again.
    const held = [1, 2, 3].map((n) => p.run({ n, ms: n === 1 ? 500 : 0 }, 30_000));
    const refused = await p.run({ n: 4 }, 30_000);
    expect(refused).toEqual({ kind: "busy" });
    expect((await Promise.all(held)).map((r) => r.kind)).toEqual(["answer", "answer", "answer"]);
    expect((await p.run({ n: 5 }, 30_000)).kind).toBe("answer");
  });

  it("ends a run past its hard stop as a timeout, and answers the next on a new thread", async () => {
    const p = pool(1, 4);
    const first = await p.run({ n: 1 }, 30_000);
    const slow = await p.run({ n: 2, ms: 3000 }, 300);
    expect(slow).toEqual({ kind: "timeout" });
    const next = await p.run({ n: 3 }, 30_000);
    expect(next.kind).toBe("answer");
    if (first.kind !== "answer" || next.kind !== "answer") throw new Error("unreachable");
    expect(next.answer.doubled).toBe(6);
    expect(next.answer.thread).not.toBe(first.answer.thread);
  });

  it("reports a crash with the thread's message and keeps the thread for the next run", async () => {
    const p = pool(1, 4);
    const crash = await p.run({ n: 1, fail: true }, 30_000);
    expect(crash).toEqual({ kind: "crash", message: "asked to fail" });
    const before = await p.run({ n: 2 }, 30_000);
    const after = await p.run({ n: 3 }, 30_000);
    if (before.kind !== "answer" || after.kind !== "answer") throw new Error("unreachable");
    expect(after.answer.thread).toBe(before.answer.thread);
  });

  it("names the thread when it cannot start", async () => {
    const p = new ThreadPool<Msg, Answer>({
      entryFile: () => path.join(dir, "missing.mjs"),
      threads: () => 1,
      queueLength: () => 1,
      name: "the echo thread",
    });
    const r = await p.run({ n: 1 }, 30_000);
    expect(r.kind).toBe("crash");
    if (r.kind === "crash") expect(r.message).toMatch(/^the echo thread did not start: /);
  });
});
