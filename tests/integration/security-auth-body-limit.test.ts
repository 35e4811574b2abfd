// Finding 2: /api/auth/* read any body in full, so an anonymous 200 MB sign-in grew the web
// process by hundreds of MB. Now the auth gate reads at most 16 KB and stops reading there.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MAX_AUTH_BODY_BYTES } from "@/lib/auth-request";
import { call, openTestWebApp, type TestWebApp } from "../support/api-client.js";

let app: TestWebApp;
beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});

const CHUNK_BYTES = 64 * 1024;

/** A body stream of `totalBytes` that counts how much of it was ever pulled. */
function countingBody(totalBytes: number): {
  stream: ReadableStream<Uint8Array>;
  pulled: () => number;
} {
  let sent = 0;
  const chunk = new Uint8Array(CHUNK_BYTES).fill(0x61);
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent >= totalBytes) return controller.close();
      sent += chunk.byteLength;
      controller.enqueue(chunk);
    },
  });
  return { stream, pulled: () => sent };
}

describe("the auth endpoints' body limit", () => {
  it("refuses a 200 MB anonymous sign-in with no declared length after reading about 16 KB", async () => {
    const body = countingBody(200 * 1024 * 1024);
    const res = await call("POST", "/api/auth/sign-in/email", {
      body: body.stream,
      headers: { "content-type": "application/json" },
    });
    expect(res.status).toBe(413);
    expect(res.body.error.limitBytes).toBe(MAX_AUTH_BODY_BYTES);
    // One chunk past the limit is read at most (the stream may have one more queued).
    expect(body.pulled()).toBeLessThanOrEqual(MAX_AUTH_BODY_BYTES + 2 * CHUNK_BYTES);
  });

  it("refuses a declared 200 MB body before reading any of it", async () => {
    const body = countingBody(200 * 1024 * 1024);
    const res = await call("POST", "/api/auth/sign-up/email", {
      body: body.stream,
      headers: { "content-type": "application/json", "content-length": String(200 * 1024 * 1024) },
    });
    expect(res.status).toBe(413);
    expect(body.pulled()).toBeLessThanOrEqual(CHUNK_BYTES);
  });

  it("does not grow the process by the body's size when three come at once", async () => {
    global.gc?.();
    const before = process.memoryUsage().rss;
    const answers = await Promise.all(
      [0, 1, 2].map(() =>
        call("POST", "/api/auth/sign-in/email", {
          body: countingBody(100 * 1024 * 1024).stream,
          headers: { "content-type": "application/json" },
        }),
      ),
    );
    expect(answers.map((a) => a.status)).toEqual([413, 413, 413]);
    const grownMb = (process.memoryUsage().rss - before) / (1024 * 1024);
    // 300 MB were offered; reading them would grow the process by at least that much.
    expect(grownMb).toBeLessThan(64);
  });

  it("still signs a user up with an ordinary body", async () => {
    const res = await call("POST", "/api/auth/sign-up/email", {
      json: { name: "Ola Example", email: "ola@lab.test", password: "a long enough secret" },
    });
    expect(res.status).toBe(200);
  });
});
