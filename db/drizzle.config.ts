import { defineConfig } from "drizzle-kit";

// Migrations are generated from the schema and committed; they are applied at start-up by
// db/migrate.ts, never by drizzle-kit at run time.
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema/index.ts",
  out: "./db/migrations",
  casing: undefined,
});
