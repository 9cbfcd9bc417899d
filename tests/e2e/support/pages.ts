// Page helpers: how a person signs in and finds things, by label and role (no CSS selectors).
import assert from "node:assert/strict";
import type { Locator, Page, Response } from "playwright-core";

export async function fillSignIn(page: Page, email: string, password: string) {
  await page.goto("/login");
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/^password/i).fill(password);
  await page.getByRole("button", { name: /sign in/i }).click();
}

/** Signs in and waits until the browser has left the sign-in page. */
export async function signIn(page: Page, email: string, password: string) {
  await fillSignIn(page, email, password);
  await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 20_000 });
}

/** The alert the sign-in page shows after a refused attempt. */
export function signInError(page: Page): Locator {
  return page
    .getByRole("alert")
    .filter({ hasText: /not right|too many|not possible|could not be reached/i })
    .first();
}

export async function expectVisible(locator: Locator, what: string, timeout = 15_000) {
  try {
    await locator.first().waitFor({ state: "visible", timeout });
  } catch {
    assert.fail(`expected to see ${what}`);
  }
}

export async function expectHidden(locator: Locator, what: string) {
  assert.equal(await locator.count(), 0, `expected not to see ${what}`);
}

/**
 * A page the user may not open shows the not-found page. The HTTP status is 404 when the
 * page fails before streaming starts; a route under a loading.tsx has already sent 200
 * with the loading shell, and Next.js then swaps in the not-found page. Callers also
 * check that nothing of the refused content reached the page.
 */
export async function expectNotFound(page: Page, path: string) {
  const res: Response | null = await page.goto(path);
  assert.ok(res, `no response for ${path}`);
  assert.ok([200, 404].includes(res.status()), `${path} answers ${res.status()}`);
  await expectVisible(page.getByRole("heading", { name: /^not found$/i }), `the not-found page on ${path}`);
  return res.status();
}

/** Visible text without stack traces or internals. */
export async function assertNoStackTrace(page: Page) {
  const text = await page.locator("body").innerText();
  assert.doesNotMatch(text, /\n\s+at [\w.<>]+ \(|node_modules|ECONNREFUSED|webpack-internal|\.tsx?:\d+/, "the page shows a stack trace or internals");
}
