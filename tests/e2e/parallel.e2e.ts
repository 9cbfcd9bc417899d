import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { expectHidden, expectVisible, signIn } from "./support/pages";

// Parallel sharing, each path open in turn: the engineer opens one path and sees where its
// current goes (before → after per remaining path) and which remaining path overloads,
// and the sheet lists every "one path open" case with the worst one highlighted.
//
// The kind's defaults: 800 A over two equal 240 mm² cables of 20 m and 24 m, 450 A each.
// Current divides inversely to length: 800·24/44 = 436 A and 800·20/44 = 364 A. With
// either cable open the other carries all 800 A = 178 % of its 450 A: overloaded.

describe("parallel sharing", () => {
  test(
    "engineer opens a path with the select and sees the redistributed currents and the overloaded path named",
    async ({ page, unique, screenshot }) => {
      const engineer = demoUser("engineer");
      const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
      await signIn(page, engineer.email, engineer.password);

      await page.goto(`/projects/${projectId}/sheets/new?kind=parallel-sharing`);
      await page.getByRole("radio", { name: /parallel sharing/i }).check();
      await page.getByRole("textbox", { name: "Tag", exact: true }).fill(`PS-N1-${unique}`.toUpperCase().slice(0, 40));
      await page.getByRole("textbox", { name: "Title", exact: true }).fill("Two incomer cables in parallel");
      await page.getByRole("button", { name: /create sheet/i }).click();
      await page.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname), { timeout: 20_000 });
      const results = page.locator('[data-results="parallel-sharing"]');
      await expectVisible(results, "the parallel sharing results");

      // Every "one path open" case is listed, the worst highlighted, each failing in words.
      const cases = page.getByTestId("contingency-table");
      await expectVisible(cases, "the table of one-path-open cases");
      assert.equal(await cases.locator("tbody tr").count(), 2, "one row per path");
      const worst = cases.locator("tr[data-worst]");
      assert.equal(await worst.count(), 1, "exactly one worst case");
      assert.match(await worst.innerText(), /Worst case/);
      const cable1Open = cases.locator('tr[data-open-path="Cable 1"]');
      assert.match(await cable1Open.innerText(), /Cable 2\s+800(\.0)? A\s+178 %\s+Fail: Cable 2 overloaded/, "with Cable 1 open, Cable 2 carries 800 A, 178 % of its ampacity: fail");

      // Open Cable 2 with the select: Cable 1 takes its current and is named as overloaded.
      await page.getByLabel("Compare with").selectOption({ label: "Cable 2 open" });
      const moved = page.locator('[data-testid="redistribution"][data-open-path="Cable 2"]');
      await expectVisible(moved, "the redistribution with Cable 2 open");
      await expectVisible(moved.getByText("With Cable 2 open, Cable 1 carries 800 A, 178 % of its 450 A ampacity: it is overloaded."), "the overload named in words");
      const row1 = moved.locator('tr[data-path="Cable 1"]');
      assert.match(await row1.innerText(), /Cable 1\s+436 A\s+800 A\s+\+364 A \(\+83 %\)\s+178 %\s+Overloaded/, "Cable 1 before → after, the increase and the overload");
      assert.match(await moved.locator('tr[data-path="Cable 2"]').innerText(), /Cable 2\s+364 A\s+0 A\s+—\s+—\s+Open/, "the open path carries nothing");
      await screenshot("parallel-cable-2-open", page);

      // The table's Show button opens the other case in the same picture.
      await page.getByRole("button", { name: "Show the case with Cable 1 open" }).click();
      const other = page.locator('[data-testid="redistribution"][data-open-path="Cable 1"]');
      await expectVisible(other, "the redistribution with Cable 1 open");
      assert.equal(await page.getByLabel("Compare with").inputValue(), "0", "the select follows the table");
      await expectVisible(other.getByText(/Cable 2 carries 800 A.*it is overloaded/), "Cable 2 named as overloaded");

      // Normal operation hides the redistribution.
      await page.getByLabel("Compare with").selectOption({ label: "Normal operation only" });
      await expectHidden(page.getByTestId("redistribution"), "a redistribution in normal operation");
      await screenshot("parallel-normal", page);
    },
    { timeoutMs: 120_000 },
  );
});
