// Loads .env.local into process.env for scripts run outside Next (migrate, seed, calc, tests).
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";

export function loadEnvFile(file = path.join(process.cwd(), ".env.local")) {
  if (!existsSync(file)) return;
  for (const line of readFileSync(file, "utf8").split("\n")) {
    const m = /^\s*([A-Z0-9_]+)\s*=\s*(.*)\s*$/.exec(line);
    if (!m || line.trimStart().startsWith("#")) continue;
    let value = m[2]!;
    if (/^".*"$/.test(value) || /^'.*'$/.test(value)) value = value.slice(1, -1);
    if (process.env[m[1]!] === undefined) process.env[m[1]!] = value;
  }
}
