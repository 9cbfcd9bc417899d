// A small test harness for the browser suite: `describe`/`test` register cases; the runner
// (run.ts) runs them one after another, each in a fresh browser context, with a time
// limit, and keeps a screenshot of every open page when a case fails.
import { mkdirSync } from "node:fs";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import type { Services } from "./support/services";

export interface TestContext {
  /** A page in a fresh, signed-out browser context whose baseURL is the app. */
  page: Page;
  /** Another fresh context and page (a second user at the same time). */
  newPage(): Promise<Page>;
  services: Services;
  baseURL: string;
  /** Saves a full-page screenshot as tests/.artifacts/e2e/screens/<name>.png. */
  screenshot(name: string, page?: Page): Promise<string>;
  /** A value unique to this run (for e-mails, project codes). */
  unique: string;
}

type Body = (t: TestContext) => Promise<void>;

interface Case {
  title: string;
  body: Body;
  timeoutMs: number;
}

export interface CaseResult {
  file: string;
  title: string;
  ok: boolean;
  ms: number;
  error?: string;
  screenshots?: string[];
}

const registered: Case[] = [];
const suites: string[] = [];

export function describe(name: string, body: () => void) {
  suites.push(name);
  try {
    body();
  } finally {
    suites.pop();
  }
}

export function test(name: string, body: Body, opts: { timeoutMs?: number } = {}) {
  registered.push({ title: [...suites, name].join(" › "), body, timeoutMs: opts.timeoutMs ?? 60_000 });
}

/** Takes the cases registered by the file just imported. */
export function takeRegistered(): Case[] {
  return registered.splice(0);
}

const slug = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "")
    .slice(0, 90);

export async function runCase(
  c: Case,
  file: string,
  env: { browser: Browser; services: Services; artifacts: string; unique: string },
): Promise<CaseResult> {
  const contexts: BrowserContext[] = [];
  const pageErrors: string[] = [];
  const screensDir = path.join(env.artifacts, "screens");
  const failDir = path.join(env.artifacts, "failures");
  mkdirSync(screensDir, { recursive: true });
  mkdirSync(failDir, { recursive: true });

  const newPage = async () => {
    const ctx = await env.browser.newContext({ baseURL: env.services.baseURL, viewport: { width: 1360, height: 900 } });
    ctx.setDefaultTimeout(15_000);
    ctx.setDefaultNavigationTimeout(30_000);
    contexts.push(ctx);
    const p = await ctx.newPage();
    p.on("pageerror", (e) => pageErrors.push(e.message));
    return p;
  };
  const page = await newPage();
  const t: TestContext = {
    page,
    newPage,
    services: env.services,
    baseURL: env.services.baseURL,
    unique: env.unique,
    screenshot: async (name, p = page) => {
      const file = path.join(screensDir, `${slug(name)}.png`);
      // From the top, so the sticky top bar is not stitched into the middle of the picture.
      await p.evaluate(() => window.scrollTo(0, 0));
      await p.screenshot({ path: file, fullPage: true });
      return file;
    },
  };

  const started = Date.now();
  let timer: NodeJS.Timeout | undefined;
  let error: unknown;
  try {
    await Promise.race([
      c.body(t),
      new Promise<never>((_, reject) => {
        timer = setTimeout(() => reject(new Error(`timed out after ${c.timeoutMs / 1000} s`)), c.timeoutMs);
      }),
    ]);
  } catch (err) {
    error = err;
  } finally {
    clearTimeout(timer);
  }
  const ms = Date.now() - started;

  const screenshots: string[] = [];
  if (error) {
    let i = 0;
    for (const ctx of contexts) {
      for (const p of ctx.pages()) {
        const shot = path.join(failDir, `${slug(baseName(file))}--${slug(c.title)}${i ? `-${i}` : ""}.png`);
        i++;
        await p.screenshot({ path: shot, fullPage: true, timeout: 10_000 }).then(
          () => screenshots.push(shot),
          () => undefined,
        );
      }
    }
  }
  for (const ctx of contexts) await ctx.close().catch(() => undefined);

  if (!error) return { file, title: c.title, ok: true, ms };
  const message = error instanceof Error ? (error.stack ?? error.message) : String(error);
  const extra = pageErrors.length ? `\n    errors in the page: ${pageErrors.slice(0, 3).join(" | ")}` : "";
  return { file, title: c.title, ok: false, ms, error: message + extra, screenshots };
}

function baseName(f: string) {
  return path.basename(f).replace(/\.e2e\.ts$/, "");
}
