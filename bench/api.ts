/**
 * Calculation API under load: `POST /api/v1/calc/{kind}` on the production Next server
 * (bearer token → guard → engine → JSON), next to a bare node:http server that makes
 * the same engine call with nothing around it. autocannon on loopback, 50 connections,
 * a 2 s warm-up then a 10 s measured run per target, one target at a time.
 *
 * What the real path pays on top of the engine: Next's routing and Request/Response
 * objects, and the guard's database lookup of the token and its user on every request
 * (plus a last-used write at most once a minute). The load generator runs in this
 * process and shares the machine's cores with both servers, so the absolute figures
 * are lower than on a dedicated load host; the ratio is the figure to watch.
 *
 * Goals: the Next route keeps at least half the bare server's throughput, p99 ≤ 50 ms
 * (voltage drop; the busbar rating costs milliseconds of engine time per call, so its
 * tail is set by queueing 50 connections behind it on two cores).
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
    const targets: Target[] = [
      { name: "Next route + token guard", url: (k) => `${next!.baseURL}/api/v1/calc/${k}`, headers: { authorization: `Bearer ${actors.token}` } },
      { name: "bare node:http + runCalc", url: (k) => `${bare!.baseURL}/${k}`, headers: {} },
    ];
    console.log(`autocannon: ${CONNECTIONS} connections, ${WARMUP_S} s warm-up + ${DURATION_S} s measured per target, loopback; Next pid ${next.pid}, bare pid ${bare.pid}`);

    for (const kind of KINDS) {
      const results: Result[] = [];
      for (const t of targets) {
        const bytes = await check(t, kind);
        await load(t, kind, WARMUP_S);
        const r = await load(t, kind, DURATION_S);
        results.push(r);
        if (t === targets[0]) console.log(`  (${kind}: ${bytes} bytes per response)`);
      }
      const rows = [["target", "req/s", "p50", "p90", "p99", "max", "non-2xx", "errors"]];
      targets.forEach((t, i) => {
        const r = results[i]!;
        rows.push([t.name, r.requests.average.toFixed(0), ms(r.latency.p50), ms(r.latency.p90), ms(r.latency.p99), ms(r.latency.max), String(r.non2xx), String(r.errors + r.timeouts)]);
      });
      console.log(`\nPOST /calc/${kind}`);
      console.log(table(rows));
      const [n, b] = [results[0]!, results[1]!];
      const ratio = n.requests.average / b.requests.average;
      console.log(
        `Next/bare throughput ${(ratio * 100).toFixed(0)} % (goal ≥ 50 %: ${ratio >= 0.5 ? "met" : "NOT met"}); ` +
          `Next p99 ${ms(n.latency.p99)} (goal ≤ 50 ms: ${n.latency.p99 <= 50 ? "met" : "NOT met"})`,
      );
    }
    // Where the Next figure goes: the same route with a malformed token is refused by the
    // guard before any database query, so this is Next's own floor for the route.
    const floor = await (async () => {
      const t: Target = { name: "floor", url: targets[0]!.url, headers: { authorization: "Bearer ohm_malformed" } };
      await load(t, "voltage-drop", WARMUP_S);
      return load(t, "voltage-drop", DURATION_S);
    })();
    console.log(
      `\nNext floor (same route, malformed token refused before any DB query, 401): ${floor.requests.average.toFixed(0)} req/s, ` +
        `p50 ${ms(floor.latency.p50)}, p99 ${ms(floor.latency.p99)}${floor["2xx"] > 0 ? ` (unexpected: ${floor["2xx"]} answers were 2xx)` : ""}`,
    );
    console.log(`\nafter: ${loadLine()}`);
  } finally {
    await bare?.stop();
    await next?.stop();
  }
}
