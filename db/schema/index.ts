/** The whole database schema, one file per area. */
export * from "./auth.js";
export * from "./teams.js";
export * from "./entries.js";
export * from "./analyses.js";
export * from "./attachments.js";
export * from "./audit.js";
export * from "./what-if-results.js";
