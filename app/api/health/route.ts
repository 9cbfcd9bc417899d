import { pool } from "@/db/client";
import pkg from "@/package.json";

export const dynamic = "force-dynamic";

/** How long the health check waits for the database before reporting it down. */
const DB_TIMEOUT_MS = 1500;

async function databaseAnswers(): Promise<boolean> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), DB_TIMEOUT_MS);
  });
  const ping = pool()
    .query({ sql: "SELECT 1", timeout: DB_TIMEOUT_MS })
    .then(() => true as const)
    .catch(() => false as const);
  try {
    return await Promise.race([ping, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

/** Public: whether the app runs and reaches its database (200), or not (503). */
export async function GET() {
  const up = await databaseAnswers().catch(() => false);
  return Response.json(
    { app: "ok", database: up ? "ok" : "down", version: pkg.version },
    { status: up ? 200 : 503, headers: { "cache-control": "no-store" } },
  );
}
