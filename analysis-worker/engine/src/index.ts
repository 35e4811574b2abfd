/**
 * The engine's front door. Everything outside the engine imports from here; inside, stages
 * import each other by path. Pure: no I/O, no clock, no randomness that is not passed in.
 */
export * from "./record/types.js";
export * from "./graph/kinds.js";
