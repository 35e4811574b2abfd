/**
 * Search at scale: a seeded generator of plausible mains gadgets (tests/bench/search/) is
 * bulk-loaded into a scratch database on the server at 127.0.0.1:5432 (or DATABASE_ADMIN_URL) in
 * steps, and at each step the bench times, as one member of three of 50 teams:
 * - similar circuits (the indexed candidate method) and the same query as a full scan (every
 *   row compared, index scans switched off), with their ratio;
 * - text plus facets (words, sometimes facet filters) and the same with index scans off;
 * - fragment search (five fragments from the block patterns, 20 hits at most).
 * Sizes: SEARCH_BENCH_ENTRIES (default 100000) in steps of SEARCH_BENCH_STEP (default 10000).
 * A measurement, not a test: it prints figures and fails only when something breaks. Targets
 * from issue 12: p95 < 50 ms similar, < 30 ms text.
 */
import { randomBytes, randomUUID } from "node:crypto";
import pg from "pg";
import { drizzle } from "drizzle-orm/node-postgres";
import { sql } from "drizzle-orm";
import {
  applyMigrations,
  createPool,
  fingerprintStats,
  schema,
  searchText,
  similarEntries,
  type Database,
  type SearchFacet,
} from "@teardown/db";
import {
  FINGERPRINT_VERSION,
  mulberry32,
  searchTextOf,
  topologyColumnsFor,
  type TeardownRecord,
} from "@teardown/engine";
import { searchFragment } from "../../web/lib/search/fragment-search.js";
import { readFragment } from "../../web/lib/search/fragment-text.js";
import { BENCH_FRAGMENTS, inventedWord, mainsGadgets } from "./search/mains-circuit-generator.js";

const ADMIN_URL = process.env.DATABASE_ADMIN_URL ?? "postgres://postgres@127.0.0.1:5432/postgres";
const TOTAL = Number(process.env.SEARCH_BENCH_ENTRIES ?? 100_000);
const STEP = Number(process.env.SEARCH_BENCH_STEP ?? 10_000);
/** Teams the entries are spread over; the viewer is on three of them. */
const TEAMS = 50;
const VIEWER_TEAMS = 3;
/** Share of entries that are public. */
const PUBLIC_SHARE = 0.3;
/** Rows per insert statement. */
const INSERT_BATCH = 500;
/** Timed queries per step. */
const SIMILAR_QUERIES = 100;
const TEXT_QUERIES = 100;
const FULL_SCAN_QUERIES = 10;
const FRAGMENT_ROUNDS = 4;
const FLAG_CODES = [
  "no-fuse",
  "bleeder-slow",
  "overstress-voltage",
  "overstress-power",
  "capacitor-class",
  "no-surge-limit",
];
/** Trade words users type (each in a few percent of summaries); invented words are drawn too. */
const WORDS = [
  "dropper",
  "bridge",
  "relay coil",
  "scorched",
  "amber",
  "heater",
  "zener",
  "charger",
  "timer socket",
  "cracked joint",
  "LED string",
];
/** Sizes at which figures are taken (besides the first step and the last), from SEARCH_BENCH_MEASURE_AT. */
const MEASURE_AT = new Set(
  (process.env.SEARCH_BENCH_MEASURE_AT ?? "").split(",").filter(Boolean).map(Number),
);

function quantile(sorted: readonly number[], q: number): number {
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[rank]!;
}
function stats(samples: number[]): { p50: number; p95: number } {
  const s = [...samples].sort((a, b) => a - b);
  return { p50: quantile(s, 0.5), p95: quantile(s, 0.95) };
}
const ms = (x: number) => `${x.toFixed(1)} ms`;

async function timed<T>(fn: () => Promise<T>): Promise<[number, T]> {
  const t0 = performance.now();
  const out = await fn();
  return [performance.now() - t0, out];
}

interface Figures {
  similarP50: number;
  similarP95: number;
  similarScanP50: number;
  similarRatio: number;
  textP50: number;
  textP95: number;
  textScanP50: number;
  textRatio: number;
  fragmentP50: number;
  fragmentP95: number;
  candidatesP50: number;
}

interface Loaded {
  id: string;
  fingerprint: number[];
  valueFeatures: number[];
  blocks: string[];
}

async function main(): Promise<void> {
  const name = `tl_search_bench_${randomBytes(5).toString("hex")}`;
  const admin = new pg.Client({ connectionString: ADMIN_URL });
  await admin.connect();
  await admin.query(`create database ${name}`);
  const url = new URL(ADMIN_URL);
  url.pathname = `/${name}`;
  const dbUrl = url.toString();
  const pool = createPool(dbUrl, 4);
  // The same database with index scans off: the "full scan" the ratios compare against.
  const scanPool = new pg.Pool({
    connectionString: dbUrl,
    max: 2,
    options: "-c enable_bitmapscan=off -c enable_indexscan=off",
  });
  try {
    await applyMigrations(dbUrl);
    const db = drizzle(pool, { schema }) as unknown as Database;
    const scanDb = drizzle(scanPool, { schema }) as unknown as Database;
    const { teamIds, viewerId } = await makeTeams(db);
    const next = mainsGadgets(20261202);
    const random = mulberry32(7);
    // Queries draw from their own generator, so measuring at more sizes leaves the data the same.
    const queryRandom = mulberry32(11);
    const sample: Loaded[] = [];
    const rows: Array<Figures & { entries: number }> = [];
    let loaded = 0;
    console.log(`search bench: up to ${TOTAL} entries in steps of ${STEP}, database ${name}`);
    while (loaded < TOTAL) {
      const target = Math.min(TOTAL, loaded + STEP);
      const t0 = performance.now();
      while (loaded < target) {
        const n = Math.min(INSERT_BATCH, target - loaded);
        const batch = Array.from({ length: n }, () => next());
        const ids = await insertBatch(db, batch, teamIds, random);
        // Keep a reservoir of entries the viewer can read, to query similar from.
        batch.forEach((g, i) => {
          if (sample.length < 2000 && random() < 0.05)
            sample.push({ id: ids[i]!.id, ...ids[i]!.features, blocks: g.blocks });
        });
        loaded += n;
      }
      const loadS = (performance.now() - t0) / 1000;
      const measureHere =
        MEASURE_AT.size === 0 || loaded === STEP || loaded === TOTAL || MEASURE_AT.has(loaded);
      if (!measureHere) {
        console.log(`${loaded} entries (loaded in ${loadS.toFixed(0)} s)`);
        continue;
      }
      await pool.query("vacuum analyze entries");
      await fingerprintStats(db, true);
      const figures = await measure(db, scanDb, viewerId, sample, queryRandom);
      rows.push({ entries: loaded, ...figures });
      console.log(
        `${loaded} entries (loaded in ${loadS.toFixed(0)} s): similar p50 ${ms(figures.similarP50)} p95 ${ms(figures.similarP95)} ` +
          `(full scan p50 ${ms(figures.similarScanP50)}, ${figures.similarRatio.toFixed(1)}x); ` +
          `text+facets p50 ${ms(figures.textP50)} p95 ${ms(figures.textP95)} (full scan p50 ${ms(figures.textScanP50)}, ${figures.textRatio.toFixed(1)}x); ` +
          `fragment p50 ${ms(figures.fragmentP50)} p95 ${ms(figures.fragmentP95)}; similar candidates p50 ${figures.candidatesP50}`,
      );
    }
    const first = rows[0]!;
    const last = rows[rows.length - 1]!;
    console.log(`\ngrowth ${first.entries} -> ${last.entries} entries (p95):`);
    for (const k of ["similarP95", "textP95", "fragmentP95"] as const)
      console.log(
        `  ${k}: ${ms(first[k])} -> ${ms(last[k])} (${(last[k] / first[k]).toFixed(2)}x)`,
      );
    console.log(
      `targets at ${last.entries}: similar p95 ${ms(last.similarP95)} (< 50 ms: ${last.similarP95 < 50 ? "met" : "missed"}), ` +
        `text p95 ${ms(last.textP95)} (< 30 ms: ${last.textP95 < 30 ? "met" : "missed"})`,
    );
  } finally {
    await pool.end().catch(() => {});
    await scanPool.end().catch(() => {});
    // SEARCH_BENCH_KEEP=1 leaves the database for a look at the plans (drop it by hand after).
    if (process.env.SEARCH_BENCH_KEEP === "1") console.log(`kept database ${name}`);
    else await admin.query(`drop database if exists ${name} with (force)`);
    await admin.end();
  }
}

async function makeTeams(db: Database): Promise<{ teamIds: string[]; viewerId: string }> {
  const viewerId = "bench-viewer";
  await db
    .insert(schema.users)
    .values({ id: viewerId, name: "Bench Viewer", email: "viewer@bench.example" });
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
        .map((teamId) => ({ teamId, userId: viewerId, role: "viewer" as const })),
    );
  return { teamIds, viewerId };
}

/** Inserts one batch of entries with their first revision and search columns, in one transaction. */
async function insertBatch(
  db: Database,
  batch: ReturnType<ReturnType<typeof mainsGadgets>>[],
  teamIds: string[],
  random: () => number,
): Promise<Array<{ id: string; features: { fingerprint: number[]; valueFeatures: number[] } }>> {
  const made = batch.map((g) => {
    const id = randomUUID();
    const topo = topologyColumnsFor(g.record);
    const flags = FLAG_CODES.filter(() => random() < 0.15);
    return {
      id,
      g,
      topo,
      flags,
      team: teamIds[Math.floor(random() * teamIds.length)]!,
      pub: random() < PUBLIC_SHARE,
      mismatch: random() < 0.05,
    };
  });
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
  return made.map((m) => ({
    id: m.id,
    features: { fingerprint: m.topo.fingerprint, valueFeatures: m.topo.valueFeatures },
  }));
}

async function measure(
  db: Database,
  scanDb: Database,
  viewerId: string,
  sample: Loaded[],
  random: () => number,
): Promise<Figures> {
  const similar: number[] = [];
  const similarScan: number[] = [];
  const candidates: number[] = [];
  for (let i = 0; i < SIMILAR_QUERIES; i++) {
    const q = sample[Math.floor(random() * sample.length)]!;
    const query = {
      entryId: q.id,
      fingerprint: q.fingerprint,
      valueFeatures: q.valueFeatures,
      blocks: q.blocks,
      version: FINGERPRINT_VERSION,
      limit: 20,
    };
    const [t] = await timed(() => similarEntries(db, viewerId, query));
    similar.push(t);
    if (i < FULL_SCAN_QUERIES) {
      const [ts] = await timed(() =>
        similarEntries(scanDb, viewerId, { ...query, fullScan: true }),
      );
      similarScan.push(ts);
      candidates.push(await candidateCount(db, q.fingerprint));
    }
  }
  const text: number[] = [];
  const textScan: number[] = [];
  for (let i = 0; i < TEXT_QUERIES; i++) {
    // Half trade words, half invented words of middling frequency (rank 20 to 2000).
    const words =
      random() < 0.5
        ? WORDS[Math.floor(random() * WORDS.length)]!
        : inventedWord(20 + Math.floor(random() * 1980));
    const filters: Partial<Record<SearchFacet, string[]>> = {};
    if (random() < 0.5) filters.flag = [FLAG_CODES[Math.floor(random() * FLAG_CODES.length)]!];
    if (random() < 0.3) filters.block = ["bridge-rectifier", "half-wave-rectifier"];
    const query = { q: words, filters, limit: 20 };
    const [t] = await timed(() => searchText(db, viewerId, query));
    text.push(t);
    if (i < FULL_SCAN_QUERIES)
      textScan.push((await timed(() => searchText(scanDb, viewerId, query)))[0]);
  }
  const fragment: number[] = [];
  for (let round = 0; round < FRAGMENT_ROUNDS; round++)
    for (const f of BENCH_FRAGMENTS) {
      const read = readFragment(f.text, f.format);
      if (!read.ok) throw new Error(`bench fragment does not read: ${read.errors[0]!.message}`);
      fragment.push(
        (await timed(() => searchFragment(db, viewerId, read.record as TeardownRecord, 20)))[0],
      );
    }
  const s = stats(similar);
  const ss = stats(similarScan);
  const t = stats(text);
  const ts = stats(textScan);
  const f = stats(fragment);
  return {
    similarP50: s.p50,
    similarP95: s.p95,
    similarScanP50: ss.p50,
    similarRatio: ss.p50 / s.p50,
    textP50: t.p50,
    textP95: t.p95,
    textScanP50: ts.p50,
    textRatio: ts.p50 / t.p50,
    fragmentP50: f.p50,
    fragmentP95: f.p95,
    candidatesP50: stats(candidates).p50,
  };
}

/** How many rows the similar query's candidate lookup reaches (for the report). */
async function candidateCount(db: Database, fp: number[]): Promise<number> {
  const { rareFeatures, intArrayParam } = await import("@teardown/db");
  const rare = rareFeatures(fp, await fingerprintStats(db));
  const r = await db.execute<{ n: number }>(
    sql`select count(*)::int as n from entries where fingerprint && ${intArrayParam(rare)}::int[]`,
  );
  return r.rows[0]!.n;
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
