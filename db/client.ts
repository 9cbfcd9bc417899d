import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Db = MySql2Database<typeof schema>;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

// One pool per process; kept on globalThis so dev reloads do not open new pools.
const g = globalThis as unknown as { ohmsteadPool?: mysql.Pool; ohmsteadDb?: Db };

export function pool(): mysql.Pool {
  if (!g.ohmsteadPool) {
    g.ohmsteadPool = mysql.createPool({
      uri: env().DATABASE_URL,
      connectionLimit: 20,
      timezone: "Z",
      connectTimeout: 3000,
      enableKeepAlive: true,
    });
  }
  return g.ohmsteadPool;
}

export function db(): Db {
  if (!g.ohmsteadDb) g.ohmsteadDb = drizzle(pool(), { schema, mode: "default" });
  return g.ohmsteadDb;
}

export async function closeDb() {
  const p = g.ohmsteadPool;
  g.ohmsteadPool = undefined;
  g.ohmsteadDb = undefined;
  await p?.end();
}

export { schema };
