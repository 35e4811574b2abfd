/**
 * Chooses the Postgres server for the whole test run, once: `DATABASE_URL` when set, else the
 * server on 127.0.0.1:5432 when one answers, else an embedded server under .data/test-postgres.
 * Test files then create and drop their own databases on it (see test-database.ts).
 */
import path from "node:path";
import pg from "pg";
import type { TestProject } from "vitest/node";
import { projectRoot } from "@teardown/db";
import { startEmbeddedServer, type EmbeddedServer } from "@teardown/db/embedded-server";

declare module "vitest" {
  export interface ProvidedContext {
    testServerAdminUrl: string;
    testServerKind: "DATABASE_URL" | "local" | "embedded";
  }
}

const LOCAL_SERVER_URL = "postgres://postgres@127.0.0.1:5432/postgres";

async function answers(url: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 1500 });
  try {
    await client.connect();
    await client.query("select 1");
    return true;
  } catch {
    return false;
  } finally {
    await client.end().catch(() => {});
  }
}

let embedded: EmbeddedServer | null = null;

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  let url: string;
  let kind: "DATABASE_URL" | "local" | "embedded";
  if (process.env.DATABASE_URL) {
    url = process.env.DATABASE_URL;
    kind = "DATABASE_URL";
  } else if (await answers(LOCAL_SERVER_URL)) {
    url = LOCAL_SERVER_URL;
    kind = "local";
  } else {
    embedded = await startEmbeddedServer({
      dataDir: path.join(projectRoot(), ".data", "test-postgres"),
    });
    url = embedded.adminUrl;
    kind = "embedded";
  }
  project.provide("testServerAdminUrl", url);
  project.provide("testServerKind", kind);
  return async () => {
    await embedded?.stop();
  };
}
