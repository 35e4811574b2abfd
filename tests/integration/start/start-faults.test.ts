// Bad configuration makes `npm start` stop at once with one clear line, exit code 1 and no
// stack trace: an unreachable or malformed DATABASE_URL, and a port already in use.
import { spawn } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const ROOT = projectRoot();

function runStart(
  env: Record<string, string>,
): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(
      process.execPath,
      ["--import", "tsx", path.join(ROOT, "scripts", "start.ts")],
      {
        cwd: ROOT,
        env: { ...process.env, ...env },
        stdio: ["ignore", "pipe", "pipe"],
      },
    );
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (c: Buffer) => (stdout += c.toString()));
    child.stderr.on("data", (c: Buffer) => (stderr += c.toString()));
    child.on("close", (code) => resolve({ code, stdout, stderr }));
  });
}

async function closedPort(): Promise<number> {
  const srv = net.createServer();
  await new Promise<void>((r) => srv.listen(0, "127.0.0.1", () => r()));
  const port = (srv.address() as net.AddressInfo).port;
  await new Promise<void>((r) => srv.close(() => r()));
  return port;
}

describe("npm start with bad configuration", () => {
  it("names the host and the cause in one line when DATABASE_URL is unreachable", async () => {
    const dbPort = await closedPort();
    const res = await runStart({
      DATABASE_URL: `postgres://postgres@127.0.0.1:${dbPort}/nowhere`,
      PORT: String(await closedPort()),
    });
    expect(res.code).toBe(1);
    const lines = res.stderr.trim().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain(`127.0.0.1:${dbPort}/nowhere`);
    expect(lines[0]).toMatch(/connection refused/);
    expect(res.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);

  it("says the URL is malformed when DATABASE_URL is not a URL", async () => {
    const res = await runStart({
      DATABASE_URL: "not a url at all",
      PORT: String(await closedPort()),
    });
    expect(res.code).toBe(1);
    expect(res.stderr.trim().split("\n")).toHaveLength(1);
    expect(res.stderr).toMatch(/not a valid postgres:\/\/ URL/);
  }, 60_000);

  it("names the port when it is already in use", async () => {
    const srv = net.createServer();
    await new Promise<void>((r) => srv.listen(0, "0.0.0.0", () => r()));
    const port = (srv.address() as net.AddressInfo).port;
    try {
      const res = await runStart({
        PORT: String(port),
        DATABASE_URL: "postgres://postgres@127.0.0.1:1/x",
      });
      expect(res.code).toBe(1);
      expect(res.stderr.trim()).toBe(
        `teardown-ledger: port ${port} is already in use (set PORT to another port, or stop what uses it)`,
      );
    } finally {
      srv.close();
    }
  }, 60_000);
});
