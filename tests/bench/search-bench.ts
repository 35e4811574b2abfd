/**
 * Search at scale: a seeded generator of plausible mains gadgets (tests/bench/search/) is
 * bulk-loaded into databases on the server at 127.0.0.1:5432 (or DATABASE_ADMIN_URL), one per
 * measured size, which are kept between runs (see search/bench-database.ts: a rerun reuses them
 * and only times queries). At each size the bench times, as one member of three of 50 teams:
 * - similar circuits (the indexed candidate method) and the same query as a full scan (every
 *   row compared, index scans switched off), with their ratio;
 * - text plus facets (words, sometimes facet filters) and the same with index scans off;
 * - fragment search (five fragments from the block patterns, 20 hits at most).
 * Sizes: SEARCH_BENCH_STEP (default 10000) and SEARCH_BENCH_ENTRIES (default 100000), plus any in
 * SEARCH_BENCH_MEASURE_AT (comma-separated). SEARCH_BENCH_FRESH=1 loads every size again.
 * Run alone: `npx tsx tests/bench/search-bench.ts`.
 * A measurement, not a test: it prints figures and fails only when something breaks. Targets
 * from issue 12: p95 < 50 ms similar, < 30 ms text.
 */
import pg from "pg";
import { drizzle } from "drizzle-orm/node-postgres";
import { sql } from "drizzle-orm";
import {
  createPool,
  fingerprintStats,
  intArrayParam,
  rareFeatures,
  schema,
  searchText,
  similarEntries,
  visibleEntry,
  type Database,
  type SearchFacet,
} from "@teardown/db";
import { FINGERPRINT_VERSION, mulberry32, type TeardownRecord } from "@teardown/engine";
import { searchFragment } from "../../web/lib/search/fragment-search.js";
import { readFragment } from "../../web/lib/search/fragment-text.js";
import { benchDatabase, FLAG_CODES, VIEWER_ID } from "./search/bench-database.js";
import { buffersOf } from "./search/query-buffers.js";
import { BENCH_FRAGMENTS, inventedWord } from "./search/mains-circuit-generator.js";

const ADMIN_URL = process.env.DATABASE_ADMIN_URL ?? "postgres://postgres@127.0.0.1:5432/postgres";
const TOTAL = Number(process.env.SEARCH_BENCH_ENTRIES ?? 100_000);
const STEP = Number(process.env.SEARCH_BENCH_STEP ?? 10_000);
const FRESH = process.env.SEARCH_BENCH_FRESH === "1";
/** Timed queries per size. */
const SIMILAR_QUERIES = 100;
const TEXT_QUERIES = 100;
const FULL_SCAN_QUERIES = 10;
const FRAGMENT_ROUNDS = 4;
/** Entries similar search is asked about (drawn from those the viewer may read). */
const SIMILAR_SAMPLE = 2000;
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
/** The sizes measured, smallest first. */
const SIZES = [
  ...new Set([
    STEP,
    TOTAL,
    ...(process.env.SEARCH_BENCH_MEASURE_AT ?? "").split(",").filter(Boolean).map(Number),
  ]),
]
  .filter((n) => n > 0 && n <= TOTAL)
  .sort((a, b) => a - b);

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
  /** Share of text queries whose facet counts were lower bounds (the match set over the cap). */
  textCappedShare: number;
  fragmentP50: number;
  fragmentP95: number;
  candidatesP50: number;
  /** Shared buffers touched (EXPLAIN BUFFERS): load-independent figures, p50 and p95. */
  similarBuffers: { p50: number; p95: number };
  similarScanBuffers: { p50: number; p95: number };
  textBuffers: { p50: number; p95: number };
  textScanBuffers: { p50: number; p95: number };
}

interface Loaded {
  id: string;
  fingerprint: number[];
  valueFeatures: number[];
  blocks: string[];
}

async function main(): Promise<void> {
  console.log(`search bench: sizes ${SIZES.join(", ")}${FRESH ? " (fresh loads)" : ""}`);
  const rows: Array<Figures & { entries: number }> = [];
  for (const size of SIZES) {
    const bench = await benchDatabase(ADMIN_URL, size, FRESH, console.log);
    console.log(
      `${size} entries: database ${bench.name}, ${bench.reused ? "kept from an earlier run (its load took" : "loaded in"} ${bench.loadSeconds.toFixed(0)} s${bench.reused ? ")" : ""}`,
    );
    const pool = createPool(bench.url, 4);
    // The same database with index scans off: the "full scan" the ratios compare against.
    const scanPool = new pg.Pool({
      connectionString: bench.url,
      max: 2,
      options: "-c enable_bitmapscan=off -c enable_indexscan=off",
    });
    try {
      const db = drizzle(pool, { schema }) as unknown as Database;
      const scanDb = drizzle(scanPool, { schema }) as unknown as Database;
      await fingerprintStats(db, true);
      // Queries draw from their own generator, so every size and every rerun asks the same.
      const figures = await measure(
        { db, pool, scanDb, scanPool },
        await similarSample(db),
        mulberry32(11),
      );
      rows.push({ entries: size, ...figures });
      console.log(
        `${size} entries: similar p50 ${ms(figures.similarP50)} p95 ${ms(figures.similarP95)} ` +
          `(full scan p50 ${ms(figures.similarScanP50)}, ${figures.similarRatio.toFixed(1)}x); ` +
          `text+facets p50 ${ms(figures.textP50)} p95 ${ms(figures.textP95)} (full scan p50 ${ms(figures.textScanP50)}, ${figures.textRatio.toFixed(1)}x; ` +
          `${(figures.textCappedShare * 100).toFixed(0)}% over the cap); ` +
          `fragment p50 ${ms(figures.fragmentP50)} p95 ${ms(figures.fragmentP95)}; similar candidates p50 ${figures.candidatesP50}`,
      );
      const b = (x: { p50: number; p95: number }) => `p50 ${x.p50} p95 ${x.p95}`;
      console.log(
        `${size} entries, buffers touched per query (EXPLAIN BUFFERS, unmoved by load): ` +
          `similar ${b(figures.similarBuffers)} (full scan ${b(figures.similarScanBuffers)}); ` +
          `text+facets ${b(figures.textBuffers)} (full scan ${b(figures.textScanBuffers)})`,
      );
    } finally {
      await pool.end().catch(() => {});
      await scanPool.end().catch(() => {});
    }
  }
  const first = rows[0]!;
  const last = rows[rows.length - 1]!;
  console.log(`\ngrowth ${first.entries} -> ${last.entries} entries (p95):`);
  for (const k of ["similarP95", "textP95", "fragmentP95"] as const)
    console.log(`  ${k}: ${ms(first[k])} -> ${ms(last[k])} (${(last[k] / first[k]).toFixed(2)}x)`);
  for (const k of ["similarBuffers", "textBuffers"] as const)
    console.log(
      `  ${k} (p95): ${first[k].p95} -> ${last[k].p95} (${(last[k].p95 / first[k].p95).toFixed(2)}x)`,
    );
  console.log(
    `targets at ${last.entries}: similar p95 ${ms(last.similarP95)} (< 50 ms: ${last.similarP95 < 50 ? "met" : "missed"}), ` +
      `text p95 ${ms(last.textP95)} (< 30 ms: ${last.textP95 < 30 ? "met" : "missed"})`,
  );
  console.log(`(databases kept for the next run; drop them with: drop database <name>)`);
}

/** Entries the viewer may read to ask "similar" about: a fixed pseudo-random draw. */
async function similarSample(db: Database): Promise<Loaded[]> {
  const r = await db.execute<{
    id: string;
    fingerprint: number[];
    value_features: number[];
    search_blocks: string[];
  }>(sql`select e.id, e.fingerprint, e.value_features, e.search_blocks from entries e
    where ${visibleEntry("e", VIEWER_ID)} order by md5(e.title), e.id limit ${SIMILAR_SAMPLE}`);
  return r.rows.map((x) => ({
    id: x.id,
    fingerprint: x.fingerprint,
    valueFeatures: x.value_features,
    blocks: x.search_blocks,
  }));
}

interface Connections {
  db: Database;
  pool: pg.Pool;
  scanDb: Database;
  scanPool: pg.Pool;
}

async function measure(
  { db, pool, scanDb, scanPool }: Connections,
  sample: Loaded[],
  random: () => number,
): Promise<Figures> {
  const similarBuffers: number[] = [];
  const similarScanBuffers: number[] = [];
  const textBuffers: number[] = [];
  const textScanBuffers: number[] = [];
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
    const [t] = await timed(() => similarEntries(db, VIEWER_ID, query));
    similar.push(t);
    if (i < FULL_SCAN_QUERIES) {
      const [ts] = await timed(() =>
        similarEntries(scanDb, VIEWER_ID, { ...query, fullScan: true }),
      );
      similarScan.push(ts);
      candidates.push(await candidateCount(db, q.fingerprint));
      similarBuffers.push(await buffersOf(pool, (d) => similarEntries(d, VIEWER_ID, query)));
      similarScanBuffers.push(
        await buffersOf(scanPool, (d) =>
          similarEntries(d, VIEWER_ID, { ...query, fullScan: true }),
        ),
      );
    }
  }
  const text: number[] = [];
  const textScan: number[] = [];
  let capped = 0;
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
    const [t, page] = await timed(() => searchText(db, VIEWER_ID, query));
    text.push(t);
    if (!page.facetsExact) capped++;
    if (i < FULL_SCAN_QUERIES) {
      textScan.push((await timed(() => searchText(scanDb, VIEWER_ID, query)))[0]);
      textBuffers.push(await buffersOf(pool, (d) => searchText(d, VIEWER_ID, query)));
      textScanBuffers.push(await buffersOf(scanPool, (d) => searchText(d, VIEWER_ID, query)));
    }
  }
  const fragment: number[] = [];
  for (let round = 0; round < FRAGMENT_ROUNDS; round++)
    for (const f of BENCH_FRAGMENTS) {
      const read = readFragment(f.text, f.format);
      if (!read.ok) throw new Error(`bench fragment does not read: ${read.errors[0]!.message}`);
      fragment.push(
        (await timed(() => searchFragment(db, VIEWER_ID, read.record as TeardownRecord, 20)))[0],
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
    textCappedShare: capped / TEXT_QUERIES,
    fragmentP50: f.p50,
    fragmentP95: f.p95,
    candidatesP50: stats(candidates).p50,
    similarBuffers: stats(similarBuffers),
    similarScanBuffers: stats(similarScanBuffers),
    textBuffers: stats(textBuffers),
    textScanBuffers: stats(textScanBuffers),
  };
}

/** How many rows the similar query's candidate lookup reaches (for the report). */
async function candidateCount(db: Database, fp: number[]): Promise<number> {
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
