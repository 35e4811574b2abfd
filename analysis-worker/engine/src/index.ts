/**
 * The engine's front door. Everything outside the engine imports from here; inside, stages
 * import each other by path. Pure: no I/O, no clock, no randomness that is not passed in.
 */
export * from "./record/types.js";
export * from "./graph/kinds.js";
export * from "./record/parse-record.js";
export * from "./record/serialize-record.js";
export * from "./record/record-json-schema.js";
export * from "./values/parse-value.js";
export * from "./values/parse-tolerance.js";
export * from "./values/e-series.js";
export * from "./values/format-value.js";
export * from "./import/read-circuit-file.js";
export * from "./import/read-deck.js";
export * from "./import/read-parts-csv.js";
export * from "./import/export-deck.js";
export * from "./graph/circuit-graph.js";
export * from "./graph/check-circuit.js";
export * from "./graph/subgraph-match.js";
export * from "./blocks/find-blocks.js";
export * from "./fingerprint/fnv-hash.js";
export * from "./fingerprint/wl-fingerprint.js";
export * from "./fingerprint/match-fragment.js";
export * from "./fingerprint/compare-topology.js";
export * from "./layout/layout-types.js";
export * from "./layout/layout-schematic.js";
export * from "./layout/render-svg.js";
export * from "./engine-version.js";
export * from "./analyze.js";
export * from "./search-columns.js";
export * from "./solver/solver-error.js";
export * from "./solver/sparse-lu.js";
export * from "./solver/dense-lu.js";
export * from "./solver/ac-phasor.js";
export * from "./solver/analyze-circuit.js";
export * from "./figures/fft.js";
export * from "./figures/waveform-stats.js";
export * from "./solver/what-if.js";
export * from "./solver/circuit-model.js";
export * from "./solver/device-models.js";
export * from "./solver/mna.js";
export * from "./solver/transient.js";
export * from "./solver/periodic-steady-state.js";
export * from "./figures/circuit-figures.js";
