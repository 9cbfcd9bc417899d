// The production build served by `next start` on a free loopback port, for the
// application benchmarks. Started per benchmark and always stopped by the caller.
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import { loadEnvFile } from "../../scripts/load-env";

const ROOT = process.cwd();
const live = new Set<ChildProcess>();

// A crashed benchmark must not leave a server behind.
process.on("exit", () => {
  for (const c of live) if (c.exitCode === null) c.kill("SIGKILL");
});

/** Why the production server cannot start, or null when `.next` holds a finished build. */
export function missingBuild(): string | null {
  return existsSync(path.join(ROOT, ".next", "BUILD_ID")) ? null : "no production build (.next/BUILD_ID is missing): run `npx next build` first; skipped";
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

export interface RunningServer {
  baseURL: string;
  pid: number | undefined;
  stop(): Promise<void>;
}

/** Stops a child: SIGTERM, then SIGKILL after the grace period. */
export async function stopChild(child: ChildProcess, graceMs = 5000): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((r) => child.once("exit", () => r()));
  child.kill("SIGTERM");
  const timer = setTimeout(() => child.kill("SIGKILL"), graceMs);
  await exited;
  clearTimeout(timer);
}

/**
 * `next start` of the existing build with the database of .env.local. The node process
 * started here is the server itself (no npx wrapper), so stopping it stops the server.
 */
export async function startNextServer(): Promise<RunningServer> {
  loadEnvFile();
  const port = await freePort();
  const baseURL = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, [path.join(ROOT, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: "production",
      NEXT_TELEMETRY_DISABLED: "1",
      APP_URL: baseURL,
      NEXTAUTH_URL: baseURL,
      // The benchmarks send no mail.
      OUTBOX_SENDER: "off",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  live.add(child);
  child.once("exit", () => live.delete(child));
  let log = "";
  const keep = (b: Buffer) => {
    log = (log + b.toString("utf8")).slice(-4000);
  };
  child.stdout?.on("data", keep);
  child.stderr?.on("data", keep);
  const stop = () => stopChild(child);

  const deadline = Date.now() + 90_000;
  try {
    for (;;) {
      if (child.exitCode !== null) throw new Error(`next start exited (code ${child.exitCode}):\n${log}`);
      if (Date.now() > deadline) throw new Error(`next start not ready after 90 s:\n${log}`);
      const ok = await fetch(`${baseURL}/api/health`, { signal: AbortSignal.timeout(5000) }).then(
        (r) => r.status < 500,
        () => false,
      );
      if (ok) break;
      await new Promise((r) => setTimeout(r, 200));
    }
  } catch (err) {
    await stop();
    throw err;
  }
  return { baseURL, pid: child.pid, stop };
}
