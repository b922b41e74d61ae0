import { defineConfig } from "drizzle-kit";

export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema/index.ts",
  out: "./drizzle",
  // Only the owner role may change the schema (see scripts/migrate.ts); the app's role cannot.
  dbCredentials: { url: process.env.DATABASE_OWNER_URL ?? "postgres://gusset_owner@127.0.0.1:54329/gusset" },
  strict: true,
});
