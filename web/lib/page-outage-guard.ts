/**
 * Turns a page render that failed because the database went away into the outage page (503,
 * Retry-After, a readable message) instead of Next's 500.
 *
 * Why here: the proxy pings the database before a page renders, but the database can go away
 * after that ping and before the page's own queries finish (a restart, a killed connection, a
 * pool that times out). Next answers any failure before the first byte with status 500 and
 * offers no way for a page to choose 503, so the answer is corrected where it is written.
 *
 * How: every request runs inside a small async-local record. Next reports each render failure
 * to instrumentation's `onRequestError` from inside that request, which marks the record when
 * `isTransientDatabaseError` says "away for now" (the one classification the API uses too).
 * The request's response is wrapped so that a 500 about to be written for a marked page
 * request becomes the outage page. A page that has already started streaming keeps its status;
 * pages here render in one piece, so in practice every such failure is caught before that.
 */
import { AsyncLocalStorage } from "node:async_hooks";
import http from "node:http";
import { isTransientDatabaseError } from "@teardown/db";
import { OUTAGE_RETRY_AFTER_SECONDS, outagePageHtml } from "./outage-page";

interface RequestMark {
  databaseAway: boolean;
}

const globalForGuard = globalThis as unknown as {
  teardownOutageGuard?: AsyncLocalStorage<RequestMark>;
};

function storage(): AsyncLocalStorage<RequestMark> {
  globalForGuard.teardownOutageGuard ??= new AsyncLocalStorage<RequestMark>();
  return globalForGuard.teardownOutageGuard;
}

/**
 * Called with every failure Next reports for a request (instrumentation's onRequestError): a
 * page render that failed on a lost or refused database connection marks its request.
 */
export function noteRequestError(err: unknown, routeType: string): void {
  if (routeType !== "render") return;
  if (!isTransientDatabaseError(err)) return;
  const mark = storage().getStore();
  if (mark) mark.databaseAway = true;
}

/** The CSP nonce the proxy put on this answer, so the outage page's one style passes the policy. */
function nonceOf(res: http.ServerResponse): string {
  const policy = res.getHeader("content-security-policy");
  return /'nonce-([^']+)'/.exec(String(policy ?? ""))?.[1] ?? "";
}

/** Wraps one response so that a 500 written for a marked request becomes the outage page. */
function guardResponse(req: http.IncomingMessage, res: http.ServerResponse, mark: RequestMark) {
  // The API answers its own 503 as JSON (api-error.ts); only pages get the HTML outage page.
  if ((req.url ?? "").startsWith("/api/")) return;
  const { writeHead, write, end, flushHeaders } = res;
  let replaced = false;
  const shouldReplace = (status: number) => !res.headersSent && status === 500 && mark.databaseAway;
  const sendOutage = () => {
    replaced = true;
    const html = outagePageHtml(nonceOf(res));
    res.removeHeader("content-length");
    res.removeHeader("content-encoding");
    res.removeHeader("etag");
    res.removeHeader("vary");
    Reflect.apply(writeHead, res, [
      503,
      {
        "content-type": "text/html; charset=utf-8",
        "content-length": Buffer.byteLength(html),
        "retry-after": String(OUTAGE_RETRY_AFTER_SECONDS),
        "cache-control": "no-store",
      },
    ]);
    Reflect.apply(end, res, [html]);
  };
  res.writeHead = function (this: http.ServerResponse, status: number, ...rest: unknown[]) {
    if (replaced) return this;
    if (shouldReplace(status)) {
      sendOutage();
      return this;
    }
    return Reflect.apply(writeHead, this, [status, ...rest]) as http.ServerResponse;
  } as typeof res.writeHead;
  res.flushHeaders = function (this: http.ServerResponse) {
    if (replaced) return;
    if (shouldReplace(this.statusCode)) return sendOutage();
    Reflect.apply(flushHeaders, this, []);
  };
  res.write = function (this: http.ServerResponse, ...args: unknown[]) {
    if (replaced) return true;
    if (shouldReplace(this.statusCode)) {
      sendOutage();
      return true;
    }
    return Reflect.apply(write, this, args) as boolean;
  } as typeof res.write;
  res.end = function (this: http.ServerResponse, ...args: unknown[]) {
    if (replaced) return this;
    if (shouldReplace(this.statusCode)) {
      sendOutage();
      return this;
    }
    return Reflect.apply(end, this, args) as http.ServerResponse;
  } as typeof res.end;
}

/**
 * Runs every HTTP request of this process inside its own mark and guards its response (once per
 * process). Installed by instrumentation.ts, next to the peer-address hook, before any request.
 */
export function installPageOutageGuard(): void {
  const flag = globalThis as unknown as { teardownOutageGuardInstalled?: boolean };
  if (flag.teardownOutageGuardInstalled) return;
  flag.teardownOutageGuardInstalled = true;
  (globalThis as { teardownNoteRequestError?: typeof noteRequestError }).teardownNoteRequestError =
    noteRequestError;
  const als = storage();
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (
    this: http.Server,
    event: string | symbol,
    ...args: unknown[]
  ): boolean {
    if (event !== "request") return Reflect.apply(emit, this, [event, ...args]) as boolean;
    const mark: RequestMark = { databaseAway: false };
    guardResponse(args[0] as http.IncomingMessage, args[1] as http.ServerResponse, mark);
    return als.run(mark, () => Reflect.apply(emit, this, [event, ...args]) as boolean);
  } as typeof emit;
}
