/**
 * Calculation API under load: `POST /api/v1/calc/{kind}` on the production Next server
 * (bearer token → guard → engine → JSON), next to a bare node:http server that makes
 * the same engine call with nothing around it, and next to the same Next route doing no
 * work at all. autocannon on loopback, 50 connections, a 2 s warm-up then a 10 s measured
 * run per target, one target at a time. Three lines per kind:
 *
 * - "bare node:http + runCalc": the engine alone behind node:http (the baseline).
 * - "Next route handler, no work": the same route and body with a malformed token, which
 *   the guard refuses (401) before reading the body, asking the database or calling the
 *   engine: Next's own cost per route-handler request, the floor no handler code can beat.
 * - "Next calc route + token": the real path. What it pays on top of the floor: the
 *   token look-up (a database round trip at most once per TOKEN_CACHE_TTL_MS per token,
 *   see lib/auth/tokens.ts), reading and parsing the body, the engine, the JSON answer.
 *
 * The load generator runs in this process and shares the machine's cores with the
 * servers, so absolute figures are lower than on a dedicated load host; the ratios are
 * the figures to watch. autocannon sends no Accept-Encoding, so no answer is compressed.
 *
 * Goals: the Next route keeps at least half the bare server's throughput, p99 ≤ 50 ms
 * (voltage drop; the busbar rating costs milliseconds of engine time per call, so its
 * tail is set by queueing 50 connections behind it on two cores). When Next's own floor
 * is below half the bare server, the first goal cannot be met by handler code; the
 * floor line shows by how much.
 */
import { spawn } from "node:child_process";
import autocannon, { type Result } from "autocannon";
import { CALC_EXAMPLES } from "../app/api/v1/calc/examples";
import type { CalcKindName } from "../lib/engine";
import { prepareBenchActors } from "./support/actors";
import { freePort, missingBuild, startNextServer, stopChild, type RunningServer } from "./support/server";
import { loadLine, table } from "./support/stats";

const CONNECTIONS = 50;
const WARMUP_S = 2;
const DURATION_S = 10;
const KINDS: CalcKindName[] = ["voltage-drop", "busbar-rating"];

interface Target {
  name: string;
  url: (kind: string) => string;
  headers: Record<string, string>;
}

async function load(target: Target, kind: CalcKindName, seconds: number): Promise<Result> {
  return autocannon({
    url: target.url(kind),
    connections: CONNECTIONS,
    duration: seconds,
    timeout: 30,
    method: "POST",
    headers: { "content-type": "application/json", ...target.headers },
    body: JSON.stringify(CALC_EXAMPLES[kind]),
  });
}

/** One request first: a target that answers errors would only measure its error path. */
async function check(target: Target, kind: CalcKindName) {
  const res = await fetch(target.url(kind), {
    method: "POST",
    headers: { "content-type": "application/json", ...target.headers },
    body: JSON.stringify(CALC_EXAMPLES[kind]),
  });
  const text = await res.text();
  if (res.status !== 200) throw new Error(`${target.name} ${kind}: answered ${res.status}: ${text.slice(0, 300)}`);
  return text.length;
}

async function startBare(): Promise<RunningServer> {
  const port = await freePort();
  const child = spawn(process.execPath, ["--import", "tsx", "bench/support/bare-calc-server.ts", String(port)], { cwd: process.cwd(), stdio: ["ignore", "pipe", "inherit"] });
  const stop = () => stopChild(child);
  try {
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error("bare calc server not ready after 30 s")), 30_000);
      child.once("exit", (code) => reject(new Error(`bare calc server exited (code ${code})`)));
      child.stdout?.once("data", () => {
        clearTimeout(timer);
        resolve();
      });
    });
  } catch (err) {
    await stop();
    throw err;
  }
  return { baseURL: `http://127.0.0.1:${port}`, pid: child.pid, stop };
}

/** The no-work target must be refused by the guard, or it would measure real work. */
async function checkRefused(target: Target, kind: CalcKindName) {
  const res = await fetch(target.url(kind), {
    method: "POST",
    headers: { "content-type": "application/json", ...target.headers },
    body: JSON.stringify(CALC_EXAMPLES[kind]),
  });
  await res.arrayBuffer();
  if (res.status !== 401) throw new Error(`${target.name} ${kind}: answered ${res.status}, expected 401`);
}

const ms = (x: number) => `${x.toFixed(x < 10 ? 1 : 0)} ms`;

export async function run(): Promise<void> {
  const missing = missingBuild();
  if (missing) {
    console.log(missing);
    return;
  }
  console.log(`before: ${loadLine()}`);
  const actors = await prepareBenchActors();
  let next: RunningServer | undefined;
  let bare: RunningServer | undefined;
  try {
    next = await startNextServer();
    bare = await startBare();
    const calc: Target = { name: "Next calc route + token", url: (k) => `${next!.baseURL}/api/v1/calc/${k}`, headers: { authorization: `Bearer ${actors.token}` } };
    const floor: Target = { name: "Next route handler, no work", url: calc.url, headers: { authorization: "Bearer ohm_malformed" } };
    const bareTarget: Target = { name: "bare node:http + runCalc", url: (k) => `${bare!.baseURL}/${k}`, headers: {} };
    console.log(`autocannon: ${CONNECTIONS} connections, ${WARMUP_S} s warm-up + ${DURATION_S} s measured per target, loopback; Next pid ${next.pid}, bare pid ${bare.pid}`);

    for (const kind of KINDS) {
      const bytes = await check(calc, kind);
      await checkRefused(floor, kind);
      await check(bareTarget, kind);
      console.log(`  (${kind}: ${bytes} bytes per response)`);
      const measured: [Target, Result][] = [];
      for (const t of [bareTarget, floor, calc]) {
        await load(t, kind, WARMUP_S);
        measured.push([t, await load(t, kind, DURATION_S)]);
      }
      const rows = [["target", "req/s", "p50", "p90", "p99", "max", "2xx", "non-2xx", "errors"]];
      for (const [t, r] of measured) {
        rows.push([t.name, r.requests.average.toFixed(0), ms(r.latency.p50), ms(r.latency.p90), ms(r.latency.p99), ms(r.latency.max), String(r["2xx"]), String(r.non2xx), String(r.errors + r.timeouts)]);
      }
      console.log(`\nPOST /calc/${kind}`);
      console.log(table(rows));
      const [b, f, n] = measured.map(([, r]) => r) as [Result, Result, Result];
      const pct = (x: number, y: number) => `${((x / y) * 100).toFixed(0)} %`;
      const ratio = n.requests.average / b.requests.average;
      console.log(
        `Next calc/bare throughput ${pct(n.requests.average, b.requests.average)} (goal ≥ 50 %: ${ratio >= 0.5 ? "met" : "NOT met"}); ` +
          `Next calc p99 ${ms(n.latency.p99)} (goal ≤ 50 ms: ${n.latency.p99 <= 50 ? "met" : "NOT met"})`,
      );
      console.log(
        `Next's own floor: no-work route/bare ${pct(f.requests.average, b.requests.average)}; ` +
          `calc route/no-work route ${pct(n.requests.average, f.requests.average)} (what the handler's own work keeps of Next's floor)` +
          (f["2xx"] > 0 ? ` (unexpected: ${f["2xx"]} no-work answers were 2xx)` : ""),
      );
    }
    console.log(`\nafter: ${loadLine()}`);
  } finally {
    await bare?.stop();
    await next?.stop();
  }
}
