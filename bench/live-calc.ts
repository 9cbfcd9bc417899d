/**
 * Live recalculation in the sheet editor, per keystroke, in Chromium against the
 * production server: a busbar rating sheet (heavy kind: computed in a web worker) and
 * a feeder voltage drop sheet (cheap kind: computed in the page).
 *
 * For each keystroke in the current field (alternately deleting and retyping its last
 * digit, so every keystroke changes the inputs), the page records, with
 * performance.now(): the keydown; the moment the editor's result badge leaves
 * "computing" with the new result in the DOM (a MutationObserver); and the next
 * frame after that (requestAnimationFrame + a task: the result has been painted).
 * Nothing is saved. The editor waits LIVE_DEBOUNCE_MS after the last keystroke before
 * it computes, on purpose, so that much of every figure is the debounce, not work.
 */
import { sparePanel } from "./network-server";
import type { Page } from "playwright-core";
import { LIVE_DEBOUNCE_MS } from "../components/sheets/editor/use-live-calc";
import { prepareBenchActors } from "./support/actors";
import { launchBrowser, signIn, type BenchBrowser } from "./support/browser";
import { missingBuild, startNextServer, type RunningServer } from "./support/server";
import { ensureBenchSheets } from "./support/sheets";
import { loadLine, quantile, table } from "./support/stats";

const WARMUP_KEYS = 4;
const MEASURED_KEYS = 20;
const PAUSE_MS = 120;

interface Sample {
  dom: number;
  paint: number;
  /** The calculation time the editor itself shows on its badge, ms. */
  calc: number | null;
}

declare global {
  interface Window {
    __benchLive?: { t0: number; waiting: boolean; sawBusy: boolean; samples: Sample[] };
  }
}

/** Installs the keydown → result-shown probe in the page. */
async function installProbe(page: Page) {
  await page.evaluate(() => {
    const b = { t0: 0, waiting: false, sawBusy: false, samples: [] as Sample[] };
    window.__benchLive = b;
    document.addEventListener(
      "keydown",
      () => {
        b.t0 = performance.now();
        b.waiting = true;
        b.sawBusy = false;
      },
      true,
    );
    new MutationObserver(() => {
      if (!b.waiting) return;
      const badge = document.querySelector('[data-testid="result-source"]');
      if (!badge) return;
      if (badge.hasAttribute("data-busy")) {
        b.sawBusy = true;
        return;
      }
      if (!b.sawBusy || badge.getAttribute("data-source") !== "live") return;
      const dom = performance.now() - b.t0;
      const t0 = b.t0;
      b.waiting = false;
      const m = /(\d+) ms/.exec(badge.textContent ?? "");
      const calc = m ? Number(m[1]) : null;
      requestAnimationFrame(() => setTimeout(() => b.samples.push({ dom, paint: performance.now() - t0, calc }), 0));
    }).observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
  });
}

async function measure(page: Page, url: string, path = "current_A"): Promise<{ samples: Sample[]; value: string }> {
  await page.goto(url);
  const field = page.locator(`input[data-path="${path}"]`);
  await field.waitFor({ state: "visible", timeout: 60_000 });
  await page.locator('[data-testid="result-source"]').waitFor({ timeout: 60_000 });
  if (await field.isDisabled()) throw new Error(`the current field of ${url} is read-only for the bench engineer`);
  const value = await field.inputValue();
  if (!/\d$/.test(value) || value.length < 2) throw new Error(`the current field holds "${value}"; expected a number of two digits or more`);
  const last = value.slice(-1);
  await installProbe(page);
  await field.click();
  await page.keyboard.press("End");
  const samples: Sample[] = [];
  for (let i = 0; i < WARMUP_KEYS + MEASURED_KEYS; i++) {
    const before = await page.evaluate(() => window.__benchLive!.samples.length);
    await page.keyboard.press(i % 2 === 0 ? "Backspace" : last);
    await page.waitForFunction((n) => window.__benchLive!.samples.length > n, before, { timeout: 15_000 });
    await page.waitForTimeout(PAUSE_MS);
  }
  const all = await page.evaluate(() => window.__benchLive!.samples);
  samples.push(...all.slice(WARMUP_KEYS));
  return { samples, value };
}

const f = (x: number) => `${x.toFixed(0)} ms`;

export async function run(): Promise<void> {
  const missing = missingBuild();
  if (missing) {
    console.log(missing);
    return;
  }
  console.log(`before: ${loadLine()}`);
  const actors = await prepareBenchActors();
  let server: RunningServer | undefined;
  let browser: BenchBrowser | undefined;
  try {
    server = await startNextServer();
    const kinds = ["busbar-rating", "voltage-drop", "bus-network"] as const;
    // A bus network of about 300 segments (18 bus sections with droppers and tap-offs).
    const network = sparePanel(300, "ac") as unknown as Record<string, unknown>;
    const segments = (network.segments as unknown[]).length;
    const { projectId, sheets } = await ensureBenchSheets(server.baseURL, actors.token, actors.engineer.id, kinds, { "bus-network": network });
    browser = await launchBrowser(server.baseURL);
    const ctx = await browser.newContext();
    const signInPage = await ctx.newPage();
    await signIn(signInPage, actors.engineer.email, actors.engineer.password);
    await signInPage.close();

    const rows = [["sheet (field: current)", "keys", "median shown", "p95 shown", "median painted", "p95 painted", "max", "engine (badge)"]];
    for (const kind of kinds) {
      const page = await ctx.newPage();
      try {
        const { samples } = await measure(page, `/projects/${projectId}/sheets/${sheets[kind]}`, kind === "bus-network" ? "loads.0.current_A" : "current_A");
        const dom = samples.map((s) => s.dom);
        const paint = samples.map((s) => s.paint);
        const calc = samples.map((s) => s.calc).filter((c): c is number => c !== null);
        rows.push([
          kind === "bus-network" ? `bus-network, ${segments} segments (worker)` : `${kind}${kind === "busbar-rating" ? " (worker)" : " (in page)"}`,
          String(samples.length),
          f(quantile(dom, 0.5)),
          f(quantile(dom, 0.95)),
          f(quantile(paint, 0.5)),
          f(quantile(paint, 0.95)),
          f(Math.max(...paint)),
          calc.length ? `${quantile(calc, 0.5)} ms median` : "—",
        ]);
      } finally {
        await page.close({ runBeforeUnload: false });
      }
    }
    console.log(table(rows));
    console.log(
      `keydown → result in the DOM ("shown") and → next frame ("painted"); ${WARMUP_KEYS} warm-up keys left out; includes the editor's ${LIVE_DEBOUNCE_MS} ms debounce.`,
    );
    console.log(`after: ${loadLine()}`);
  } finally {
    await browser?.close();
    await server?.stop();
  }
}
