import { defineConfig } from "drizzle-kit";

// Used only by `npm run db:generate` (drizzle-kit generate). Migrations are applied by
// scripts/migrate.ts; drizzle-kit push/pull are not used (they fail on MariaDB CHECK constraints).
export default defineConfig({
  dialect: "mysql",
  schema: "./db/schema/index.ts",
  out: "./drizzle",
  dbCredentials: { url: process.env.DATABASE_URL ?? "mysql://unused@127.0.0.1:3307/unused" },
});
