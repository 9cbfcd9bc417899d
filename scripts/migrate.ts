// Applies the committed SQL migrations in drizzle/ (never `drizzle-kit push`).
// Usage: tsx scripts/migrate.ts [--test]   (--test: the <DB_NAME>_test database)
import { migrate } from "drizzle-orm/mysql2/migrator";
import { loadEnvFile } from "./load-env";

loadEnvFile();
if (process.argv.includes("--test")) process.env.DB_NAME = `${process.env.DB_NAME ?? "ohmstead"}_test`;

const { db, closeDb } = await import("../db/client");
const started = Date.now();
try {
  await migrate(db(), { migrationsFolder: "./drizzle" });
  console.log(`migrate: ${process.env.DB_NAME} up to date (${Date.now() - started} ms)`);
} catch (err) {
  console.error("migrate: failed:", err instanceof Error ? err.message : err);
  process.exitCode = 1;
} finally {
  await closeDb();
}
