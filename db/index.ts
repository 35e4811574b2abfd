/** The database package's front door for the worker, the web app, the seed and tests. */
export * from "./client.js";
export * from "./pool-guard.js";
export * from "./errors.js";
export * from "./transient-errors.js";
export * from "./migrate.js";
export * as schema from "./schema/index.js";
export * from "./queue.js";
export * from "./entries.js";
