// One lint setup for the whole tree. The rule that matters most: the engine imports nothing of
// ours and no I/O, so it stays a pure library that the worker and the web app both wrap.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import engineStages from "./scripts/lint/engine-stage-order.js";

const ENGINE_FORBIDDEN_IMPORTS = {
  paths: [
    "pg",
    "pg-boss",
    "next",
    "react",
    "fs",
    "net",
    "http",
    "https",
    "child_process",
    "os",
    "path",
    "node:fs",
    "node:fs/promises",
    "node:net",
    "node:http",
    "node:https",
    "node:child_process",
    "node:os",
    "node:path",
    "node:worker_threads",
    "node:dgram",
    "node:dns",
    "node:process",
  ].map((name) => ({
    name,
    message:
      "The engine is pure: no I/O, database or web imports (see analysis-worker/engine/README.md).",
  })),
  patterns: [
    { group: ["@teardown/*"], message: "The engine imports nothing of ours." },
    {
      group: ["next/*", "pg/*", "drizzle-orm", "drizzle-orm/*", "fs/*"],
      message: "The engine is pure: no I/O, database or web imports.",
    },
    {
      group: [
        "**/db/**",
        "**/web/**",
        "../../db/*",
        "../../web/*",
        "../../../db/*",
        "../../../web/*",
      ],
      message: "The engine must not import db or web.",
    },
  ],
};

export default tseslint.config(
  {
    ignores: [
      "**/node_modules/**",
      "**/.next/**",
      ".data/**",
      "db/migrations/**",
      "**/*.d.ts",
      "analysis-worker/engine/schema/**",
      "tests/bench/.legacy-engine/**",
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_" },
      ],
      "@typescript-eslint/no-non-null-assertion": "off",
    },
  },
  {
    // Plain CommonJS preloads for node (scripts/start/exit-with-parent.cjs).
    files: ["**/*.cjs"],
    languageOptions: {
      sourceType: "commonjs",
      globals: { require: "readonly", process: "readonly", module: "writable" },
    },
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
  {
    files: ["analysis-worker/engine/**/*.ts"],
    plugins: { "engine-stages": engineStages },
    rules: {
      "no-restricted-imports": ["error", ENGINE_FORBIDDEN_IMPORTS],
      // record → values → graph → blocks → solver → figures → flags → analyze (see the rule's file).
      "engine-stages/engine-stage-order": "error",
      "no-console": "error",
      "no-restricted-properties": [
        "error",
        { object: "Math", property: "random", message: "Pass a seeded generator in." },
        { object: "Date", property: "now", message: "Pass a clock in." },
        { object: "performance", property: "now", message: "Pass a clock in." },
      ],
      "no-restricted-globals": [
        "error",
        { name: "process", message: "The engine has no process." },
      ],
    },
  },
);
