/** The database package's front door for the worker, the web app, the seed and tests. */
export * from "./client.js";
export * from "./pool-guard.js";
export * from "./errors.js";
export * from "./transient-errors.js";
export * from "./migrate.js";
export * as schema from "./schema/index.js";
export * from "./queue.js";
export * from "./entries.js";
export * from "./search/array-param.js";
export * from "./search/entry-summary.js";
export * from "./search/fragment-candidates.js";
export * from "./search/rare-features.js";
export * from "./search/search-columns-store.js";
export * from "./search/search-cursor.js";
export * from "./search/similar-search.js";
export * from "./search/text-search.js";
export * from "./search/visibility.js";
