/** The engine's version: stored with every analysis; a change makes `npm run reanalyze` redo all. */
export const ENGINE_VERSION = "1.4.0";
