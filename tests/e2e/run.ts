// Browser end-to-end suite: `npm run test:e2e` (npm test runs it after the build).
// Starts its own database, fake SMTP and `next start` (tests/e2e/support/services.ts),
// runs tests/e2e/*.e2e.ts in name order (9N-… files last) with Debian's Chromium, prints one line per
// case and `N passed, N failed`; --report <file> also writes the counts as JSON;
// --grep <text> runs only the cases whose title contains the text.
import { readdirSync, writeFileSync, mkdirSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { chromium, type Browser } from "playwright-core";
import { runCase, takeRegistered, type CaseResult } from "./harness";
import { startServices, type Services } from "./support/services";

const ROOT = process.cwd();
const ARTIFACTS = path.join(ROOT, "tests/.artifacts/e2e");
const arg = (name: string) => {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
};
const reportFile = arg("--report");
const grep = arg("--grep");

const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

let services: Services | undefined;
let browser: Browser | undefined;
let shuttingDown = false;

async function shutdown() {
  if (shuttingDown) return;
  shuttingDown = true;
  await browser?.close().catch(() => undefined);
  await services?.stopAll();
}

for (const sig of ["SIGINT", "SIGTERM"] as const) {
  process.on(sig, () => {
    console.error(`e2e: ${sig}, stopping the servers it started`);
    void shutdown().finally(() => process.exit(1));
  });
}

function writeReport(results: CaseResult[], setupError?: string) {
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed + (setupError ? 1 : 0);
  if (reportFile) {
    mkdirSync(path.dirname(reportFile), { recursive: true });
    writeFileSync(reportFile, JSON.stringify({ passed, failed, setupError, results }, null, 2));
  }
  return { passed, failed };
}

async function main() {
  mkdirSync(ARTIFACTS, { recursive: true });
  // Name order, except that files named 9N-… run after all others (the database outage is last).
  const late = (f: string) => (/^9\d-/.test(f) ? 1 : 0);
  const files = readdirSync(path.join(ROOT, "tests/e2e"))
    .filter((f) => f.endsWith(".e2e.ts"))
    .sort((a, b) => late(a) - late(b) || a.localeCompare(b));
  const results: CaseResult[] = [];
  const t0 = Date.now();
  try {
    console.log("e2e: starting a private MariaDB, the fake SMTP server and next start…");
    services = await startServices({ artifacts: ARTIFACTS });
    console.log(`e2e: app at ${services.baseURL}, database ${services.dbName}, mailbox ${services.mailboxDir}`);
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      headless: true,
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    });
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err);
    console.error(`e2e: setup failed: ${msg}`);
    await shutdown();
    const { passed, failed } = writeReport(results, msg);
    console.log(`${passed} passed, ${failed} failed`);
    process.exitCode = 1;
    return;
  }

  const unique = Date.now().toString(36);
  for (const f of files) {
    await import(pathToFileURL(path.join(ROOT, "tests/e2e", f)).href);
    const cases = takeRegistered().filter((c) => !grep || c.title.includes(grep));
    if (!cases.length) continue;
    console.log(`\n${f}`);
    for (const c of cases) {
      const r = await runCase(c, f, { browser, services, artifacts: ARTIFACTS, unique });
      results.push(r);
      const secs = (r.ms / 1000).toFixed(1);
      if (r.ok) console.log(`  ✓ ${r.title} (${secs} s)`);
      else {
        console.log(`  ✗ ${r.title} (${secs} s)`);
        console.log(`    ${r.error?.split("\n").slice(0, 8).join("\n    ")}`);
        for (const s of r.screenshots ?? []) console.log(`    screenshot: ${path.relative(ROOT, s)}`);
      }
    }
  }
  await shutdown();
  const { passed, failed } = writeReport(results);
  console.log(`\ne2e: ${results.length} cases in ${((Date.now() - t0) / 1000).toFixed(0)} s; logs in ${path.relative(ROOT, ARTIFACTS)}/logs`);
  if (!results.length) {
    console.error("e2e: no test ran");
    process.exitCode = 1;
  }
  console.log(`${passed} passed, ${failed} failed`);
  if (failed) process.exitCode = 1;
}

await main();
process.exit(process.exitCode ?? 0);
