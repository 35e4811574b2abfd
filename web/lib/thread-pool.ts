/**
 * A bounded pool of worker threads for the web process, so heavy work (reading an upload,
 * running a what-if) cannot stall its other requests. Bounded twice: a few threads and a short
 * waiting line; past it a run is refused as `busy` (the caller answers 503 with Retry-After)
 * instead of piling work up. A run that overruns its hard stop has its thread ended and replaced.
 *
 * The thread protocol, shared by every thread entry: the thread posts `{ ready: true }` once
 * loaded; each run is posted as `{ id, ...message }` and answered `{ id, ...answer }`, or
 * `{ id, crash }` when the work threw (the thread stays usable).
 */
import { Worker } from "node:worker_threads";

/** How one run ended: the thread's answer, or why there is none. */
export type PoolOutcome<A> =
  | { kind: "answer"; answer: A }
  | { kind: "busy" }
  | { kind: "timeout" }
  | { kind: "crash"; message: string };

/** What a pool runs and how far it may grow; read on every run, so settings may change. */
export interface ThreadPoolOptions {
  /** The thread's entry file (found at run time: the web bundle has no stable path of its own). */
  entryFile: () => string;
  /** Threads at work at once. */
  threads: () => number;
  /** Runs that may wait for a thread; one more is refused as busy. */
  queueLength: () => number;
  /** The thread as a message names it ("the record reader"), for a thread that does not start. */
  name: string;
}

interface Waiting<M, A> {
  message: M;
  hardStopMs: number;
  resolve: (r: PoolOutcome<A>) => void;
}

/** A pool of one kind of thread; `M` is what a run posts, `A` what the thread answers. */
export class ThreadPool<M extends object, A> {
  private idle: Worker[] = [];
  private busy = 0;
  private waiting: Waiting<M, A>[] = [];
  private nextId = 1;

  constructor(private readonly options: ThreadPoolOptions) {}

  /** Runs one message on a thread; past `hardStopMs` the thread is ended and the run times out. */
  run(message: M, hardStopMs: number): Promise<PoolOutcome<A>> {
    const { threads, queueLength } = this.options;
    if (this.busy >= threads() && this.waiting.length >= queueLength())
      return Promise.resolve({ kind: "busy" });
    return new Promise((resolve) => {
      this.waiting.push({ message, hardStopMs, resolve });
      this.pump();
    });
  }

  private pump(): void {
    while (this.busy < this.options.threads() && this.waiting.length > 0) {
      const job = this.waiting.shift()!;
      this.busy++;
      void this.runOne(job).then((r) => {
        this.busy--;
        job.resolve(r);
        this.pump();
      });
    }
  }

  private async take(): Promise<Worker> {
    const reused = this.idle.pop();
    if (reused) return reused;
    const worker = new Worker(this.options.entryFile());
    worker.unref(); // an idle thread must not keep the process alive
    await new Promise<void>((resolve, reject) => {
      const onMessage = (msg: { ready?: boolean }) => {
        if (!msg.ready) return;
        worker.off("message", onMessage);
        worker.off("error", reject);
        resolve();
      };
      worker.on("message", onMessage);
      worker.once("error", reject);
    });
    return worker;
  }

  private async runOne(job: Waiting<M, A>): Promise<PoolOutcome<A>> {
    let worker: Worker;
    try {
      worker = await this.take();
    } catch (err) {
      return { kind: "crash", message: `${this.options.name} did not start: ${String(err)}` };
    }
    const id = this.nextId++;
    return new Promise<PoolOutcome<A>>((resolve) => {
      const done = (r: PoolOutcome<A>, reuse: boolean) => {
        clearTimeout(timer);
        worker.off("message", onMessage);
        worker.off("error", onError);
        if (reuse) this.idle.push(worker);
        else void worker.terminate();
        resolve(r);
      };
      const onMessage = (msg: { id: number; crash?: string } & Record<string, unknown>) => {
        if (msg.id !== id) return;
        if (msg.crash !== undefined) return done({ kind: "crash", message: msg.crash }, true);
        const { id: _id, ...answer } = msg;
        void _id;
        done({ kind: "answer", answer: answer as A }, true);
      };
      const onError = (err: Error) => done({ kind: "crash", message: err.message }, false);
      const timer = setTimeout(() => done({ kind: "timeout" }, false), job.hardStopMs);
      worker.on("message", onMessage);
      worker.once("error", onError);
      worker.postMessage({ id, ...job.message });
    });
  }

  /** Starts one thread ahead of the first run (loading the engine takes seconds). */
  warm(): void {
    if (this.idle.length > 0 || this.busy > 0) return;
    this.busy++;
    void this.take()
      .then((w) => this.idle.push(w))
      .catch(() => {}) // the first run tries again and reports the failure
      .finally(() => {
        this.busy--;
        this.pump();
      });
  }

  /** Ends the idle threads (tests and shutdown). */
  async close(): Promise<void> {
    await Promise.all(this.idle.splice(0).map((w) => w.terminate()));
  }
}
