// Debian's Chromium driven by playwright-core, and signing in through the real form.
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

const ARGS = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"];

export interface BenchBrowser {
  browser: Browser;
  /** A fresh context (own cookies and cache) with the app as base URL. */
  newContext(): Promise<BrowserContext>;
  close(): Promise<void>;
}

export async function launchBrowser(baseURL: string): Promise<BenchBrowser> {
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ARGS });
  return {
    browser,
    newContext: async () => {
      const ctx = await browser.newContext({ baseURL, viewport: { width: 1360, height: 900 } });
      ctx.setDefaultTimeout(30_000);
      ctx.setDefaultNavigationTimeout(60_000);
      return ctx;
    },
    close: () => browser.close().catch(() => undefined),
  };
}

/** Signs in with the sign-in form and waits until the browser has left /login. */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/login");
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/^password/i).fill(password);
  await page.getByRole("button", { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 30_000 });
}
