/**
 * The search bench's databases, kept between runs: one per measured size, named after the
 * generator's version, the fingerprint definition's version and the size, so a rerun on a quiet
 * machine only times queries. A database counts as complete only when its `bench_meta` row exists
 * (written last, after the load and ANALYZE); an incomplete one (an interrupted load) is dropped and
 * loaded again. Every size is loaded from the start of the same seeded sequence, so the 10,000
 * entries of the small database are the first 10,000 of the large one.
 */
import { randomBytes, randomUUID } from "node:crypto";
import pg from "pg";
import { drizzle } from "drizzle-orm/node-postgres";
import { applyMigrations, createPool, schema, type Database } from "@teardown/db";
import {
  FINGERPRINT_VERSION,
  mulberry32,
  searchTextOf,
  topologyColumnsFor,
} from "@teardown/engine";
import {
  GENERATOR_VERSION,
  mainsGadgets,
  type GeneratedGadget,
} from "./mains-circuit-generator.js";

/** Teams the entries are spread over; the viewer is on three of them. */
const TEAMS = 50;
const VIEWER_TEAMS = 3;
/** Share of entries that are public. */
const PUBLIC_SHARE = 0.3;
/** Rows per insert statement. */
const INSERT_BATCH = 500;
export const VIEWER_ID = "bench-viewer";
export const FLAG_CODES = [
  "no-fuse",
  "bleeder-slow",
  "overstress-voltage",
  "overstress-power",
  "capacitor-class",
  "no-surge-limit",
];

export interface BenchDatabase {
  name: string;
  url: string;
  /** Seconds the load took (when it was loaded earlier, as recorded then). */
  loadSeconds: number;
  reused: boolean;
}

/** The database's name for this many entries. */
export function benchDatabaseName(entries: number): string {
  return `tl_search_bench_g${GENERATOR_VERSION}_f${FINGERPRINT_VERSION}_${entries}`;
}

function urlOf(adminUrl: string, name: string): string {
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

/** A complete database of `entries` entries: the kept one, or a new load (`fresh` forces one). */
export async function benchDatabase(
  adminUrl: string,
  entries: number,
  fresh: boolean,
  log: (line: string) => void,
): Promise<BenchDatabase> {
  const name = benchDatabaseName(entries);
  const url = urlOf(adminUrl, name);
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    const exists =
      (await admin.query("select 1 from pg_database where datname = $1", [name])).rowCount === 1;
    if (exists && !fresh) {
      const meta = await completeMeta(url);
      if (meta !== null) {
        // Later migrations (a new index) apply to a kept database too.
        await applyMigrations(url);
        return { name, url, loadSeconds: meta.loadSeconds, reused: true };
      }
      log(`${name}: incomplete (an interrupted load), loading again`);
    }
    await admin.query(`drop database if exists ${name} with (force)`);
    await admin.query(`create database ${name}`);
  } finally {
    await admin.end();
  }
  const t0 = performance.now();
  await load(url, entries, log);
  const loadSeconds = (performance.now() - t0) / 1000;
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query("vacuum analyze");
    await client.query(
      "create table bench_meta (entries int not null, load_seconds float8 not null)",
    );
    await client.query("insert into bench_meta values ($1, $2)", [entries, loadSeconds]);
  } finally {
    await client.end();
  }
  return { name, url, loadSeconds, reused: false };
}

/** The load record of a complete database, or null. */
async function completeMeta(url: string): Promise<{ loadSeconds: number } | null> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const r = await client.query<{ load_seconds: number }>(
      "select load_seconds from bench_meta where to_regclass('bench_meta') is not null",
    );
    return r.rows[0] ? { loadSeconds: Number(r.rows[0].load_seconds) } : null;
  } catch {
    return null;
  } finally {
    await client.end();
  }
}

async function load(url: string, entries: number, log: (line: string) => void): Promise<void> {
  await applyMigrations(url);
  const pool = createPool(url, 2);
  try {
    const db = drizzle(pool, { schema }) as unknown as Database;
    const teamIds = await makeTeams(db);
    const next = mainsGadgets(20261202);
    const random = mulberry32(7);
    let loaded = 0;
    let lastLog = performance.now();
    while (loaded < entries) {
      const n = Math.min(INSERT_BATCH, entries - loaded);
      await insertBatch(
        db,
        Array.from({ length: n }, () => next()),
        teamIds,
        random,
      );
      loaded += n;
      if (performance.now() - lastLog > 30_000) {
        log(`  loading: ${loaded} of ${entries}`);
        lastLog = performance.now();
      }
    }
  } finally {
    await pool.end();
  }
}

async function makeTeams(db: Database): Promise<string[]> {
  await db
    .insert(schema.users)
    .values({ id: VIEWER_ID, name: "Bench Viewer", email: "viewer@bench.example" });
  const teams = await db
    .insert(schema.teams)
    .values(
      Array.from({ length: TEAMS }, (_, i) => ({
        name: `Bench lab ${i + 1}`,
        slug: `bench-lab-${i + 1}`,
      })),
    )
    .returning({ id: schema.teams.id });
  const teamIds = teams.map((t) => t.id);
  await db
    .insert(schema.memberships)
    .values(
      teamIds
        .slice(0, VIEWER_TEAMS)
        .map((teamId) => ({ teamId, userId: VIEWER_ID, role: "viewer" as const })),
    );
  return teamIds;
}

/** Inserts one batch of entries with their first revision and search columns, in one transaction. */
async function insertBatch(
  db: Database,
  batch: GeneratedGadget[],
  teamIds: string[],
  random: () => number,
): Promise<void> {
  const made = batch.map((g) => ({
    id: randomUUID(),
    g,
    topo: topologyColumnsFor(g.record),
    flags: FLAG_CODES.filter(() => random() < 0.15),
    team: teamIds[Math.floor(random() * teamIds.length)]!,
    pub: random() < PUBLIC_SHARE,
    mismatch: random() < 0.05,
  }));
  await db.transaction(async (tx) => {
    await tx.insert(schema.entries).values(
      made.map((m) => ({
        id: m.id,
        teamId: m.team,
        title: String(m.g.doc.title),
        category: m.g.category,
        visibility: m.pub ? ("public" as const) : ("team" as const),
        currentRevision: 1,
        searchText: searchTextOf(m.g.record),
        searchTags: m.g.record.device.tags.join(" "),
        searchBlocks: m.g.blocks,
        searchFlags: m.flags,
        hasMismatch: m.mismatch,
        facets: {
          supply_vrms: m.g.record.device.rated_supply.vrms,
          supply_hz: m.g.record.device.rated_supply.hz,
        },
        fingerprint: m.topo.fingerprint,
        valueFeatures: m.topo.valueFeatures,
        fragmentFeatures: m.topo.fragmentFeatures,
        topology: m.topo.topology,
        fingerprintVersion: m.topo.version,
      })),
    );
    await tx.insert(schema.revisions).values(
      made.map((m) => ({
        entryId: m.id,
        number: 1,
        record: m.g.doc,
        recordHash: randomBytes(32).toString("hex"),
        message: "bench",
      })),
    );
  });
}
