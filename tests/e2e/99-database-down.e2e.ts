// Runs last: it stops the (private) e2e database and starts it again.
import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { demoUser } from "./support/fixtures";
import { assertNoStackTrace, expectVisible, signIn } from "./support/pages";

async function health(baseURL: string) {
  const res = await fetch(`${baseURL}/api/health`, { signal: AbortSignal.timeout(10_000) });
  return { status: res.status, body: (await res.json()) as { database?: string } };
}

describe("database outage", () => {
  test("health reports the database down, pages say so plainly, and both recover", async ({ page, services, baseURL, screenshot }) => {
    const ok = await health(baseURL);
    assert.equal(ok.status, 200);
    assert.equal(ok.body.database, "ok");

    const lead = demoUser("lead");
    await signIn(page, lead.email, lead.password);

    await services.database.stop();
    try {
      const down = await health(baseURL);
      assert.equal(down.status, 503, "health answers 503 while the database is stopped");
      assert.equal(down.body.database, "down");

      await page.goto("/projects");
      await expectVisible(page.getByText(/database/i), "a message that mentions the database");
      await assertNoStackTrace(page);
      await screenshot("database-down", page);
    } finally {
      await services.database.start();
    }

    const deadline = Date.now() + 30_000;
    let last = await health(baseURL);
    while (last.status !== 200 && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      last = await health(baseURL);
    }
    assert.equal(last.status, 200, "health is ok again after the restart");
    assert.equal(last.body.database, "ok");
    await page.goto("/projects");
    await expectVisible(page.getByRole("heading", { name: /projects/i }), "the projects page again");
  });
});
