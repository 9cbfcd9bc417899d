import assert from "node:assert/strict";
import type { Page } from "playwright-core";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { readMailbox, type Mail } from "./support/mailbox";
import { expectHidden, expectVisible, signIn } from "./support/pages";

// The calculation-sheet workflow through the browser: create, live results, save,
// submit; the lead checks from the e-mail link and approves; a change starts revision B
// while A stays readable; a viewer reads without any control to change anything.

const CURRENT = /^Current ?\(A\)$/;

/** The headline temperature of a busbar rating, as shown in the results panel. */
async function temperatureText(page: Page): Promise<string> {
  const el = page.getByTestId("result-temperature");
  await el.waitFor({ state: "visible", timeout: 20_000 });
  return (await el.innerText()).trim();
}

/** Waits until the results panel says where its numbers come from ("live" or "saved") and is not computing. */
async function waitForResultSource(page: Page, source: "live" | "saved") {
  await page.locator(`[data-testid="result-source"][data-source="${source}"]:not([data-busy])`).waitFor({ state: "visible", timeout: 20_000 });
}

async function waitForSheetMail(dir: string, to: string, tag: string, timeoutMs = 30_000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const hit = (await readMailbox(dir)).find(
      (m) => (m.envelopeTo.some((a) => a.toLowerCase() === to.toLowerCase()) || m.to.toLowerCase().includes(to.toLowerCase())) && `${m.subject}\n${m.text}`.includes(tag),
    );
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`no mail about ${tag} to ${to} arrived within ${timeoutMs / 1000} s`);
}

describe("calculation sheets", () => {
  test(
    "engineer creates a busbar rating with live results, saves and submits; the lead approves from the e-mail; a change starts revision B; a viewer only reads",
    async ({ page, newPage, services, unique, screenshot }) => {
      const engineer = demoUser("engineer");
      const lead = demoUser("lead");
      const viewer = demoUser("viewer");
      const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
      const tag = `BR-${unique}`.toUpperCase().slice(0, 40);

      // 1. The engineer adds a busbar rating sheet.
      await signIn(page, engineer.email, engineer.password);
      await page.goto(`/projects/${projectId}/sheets/new`);
      await page.getByRole("radio", { name: /busbar rating/i }).check();
      await page.getByRole("textbox", { name: "Tag", exact: true }).fill(tag);
      await page.getByRole("textbox", { name: "Title", exact: true }).fill("Main busbar MSB-1, 2 × 100 × 10 Cu");
      await page.getByRole("button", { name: /create sheet/i }).click();
      await page.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname), { timeout: 20_000 });
      const sheetPath = new URL(page.url()).pathname;
      await expectVisible(page.getByText(tag).first(), "the new sheet's tag");
      await expectVisible(page.getByTestId("revision-label").filter({ hasText: "Rev A" }), "revision A");

      // The stored (server) result shows first; its temperature is a number in °C.
      await waitForResultSource(page, "saved");
      const before = await temperatureText(page);
      assert.match(before, /^\d+(\.\d+)? °C$/, `a bar temperature in °C, got "${before}"`);
      await expectVisible(page.getByRole("note", { name: /caution/i }), "the caution beside the thermal result");

      // 2. Changing the current recomputes as the user types (in the worker), marked "live".
      const current = page.getByLabel(CURRENT);
      await current.fill("2600");
      await waitForResultSource(page, "live");
      const after = await temperatureText(page);
      assert.notEqual(after, before, "the temperature changes with the current");
      assert.ok(parseFloat(after) > parseFloat(before), `more current, hotter bars (${before} → ${after})`);
      await screenshot("sheet-busbar-live", page);

      // A value out of range is named with its allowed range, in the user's units.
      await page.getByLabel(/^Bar width ?\(mm\)$/).fill("900");
      await expectVisible(page.getByText(/Bar width must be from 3 to 400 mm/), "the bar width's range in mm");
      await page.getByLabel(/^Bar width ?\(mm\)$/).fill("100");

      // 3. Save: the server's result becomes the saved one.
      await page.getByRole("button", { name: /^save$/i }).click();
      await expectVisible(page.getByText(/saved revision a/i), "the saved message");
      await waitForResultSource(page, "saved");
      assert.equal(await temperatureText(page), after, "the saved result equals the live one for the same inputs");

      // 4. Submit for review.
      await page.getByRole("button", { name: /submit for review/i }).click();
      await expectVisible(page.locator('[data-status="in_review"]'), "the in-review status");
      await expectHidden(page.getByRole("button", { name: /^save$/i }), "a Save button while in review");

      // 5. The lead gets the e-mail, follows its link and approves.
      const mail = await waitForSheetMail(services.mailboxDir, lead.email, tag);
      const link = /https?:\/\/[^\s<>"]+\/projects\/\d+\/sheets\/\d+/.exec(mail.text)?.[0];
      assert.ok(link, `the review mail links to the sheet:\n${mail.text}`);
      assert.equal(new URL(link).pathname, sheetPath, "the link opens this sheet");
      const leadPage = await newPage();
      await signIn(leadPage, lead.email, lead.password);
      // The review queue lists it (fetched from the JSON route).
      await leadPage.goto("/review");
      await expectVisible(leadPage.getByRole("link", { name: tag }), "the sheet in the lead's review queue");
      await leadPage.goto(link);
      await expectVisible(leadPage.getByText(tag).first(), "the sheet from the mail link");
      await expectVisible(leadPage.getByTestId("result-temperature"), "the results for the checker");
      await leadPage.getByRole("button", { name: /check this revision/i }).click();
      await leadPage.getByRole("button", { name: /approve revision a/i }).click();
      await expectVisible(leadPage.locator('[data-status="approved"]'), "the approved status");
      await screenshot("sheet-approved-by-lead", leadPage);

      // 6. The engineer changes the approved sheet: revision B starts, A stays readable.
      await page.reload();
      await expectVisible(page.locator('[data-status="approved"]'), "the approved status for the engineer");
      assert.equal(await page.getByLabel(CURRENT).isDisabled(), true, "an approved revision is locked");
      await page.getByRole("button", { name: /start revision b/i }).click();
      await page.getByLabel(CURRENT).fill("2400");
      await waitForResultSource(page, "live");
      await page.getByRole("button", { name: /save as revision b/i }).click();
      await expectVisible(page.getByTestId("revision-label").filter({ hasText: "Rev B" }), "revision B");
      await expectVisible(page.locator('[data-status="draft"]').first(), "revision B as a draft");
      const revA = page.getByRole("navigation", { name: "Revisions" }).getByRole("link", { name: /rev a/i });
      await expectVisible(revA, "a link to revision A");
      await revA.click();
      await page.waitForURL(/[?&]rev=0/);
      await expectVisible(page.getByTestId("revision-label").filter({ hasText: "Rev A" }), "revision A still readable");
      await expectVisible(page.getByText(/kept read-only/i), "the read-only note on revision A");
      assert.equal(await page.getByLabel(CURRENT).inputValue(), "2600", "revision A keeps its inputs");
      assert.equal(await page.getByLabel(CURRENT).isDisabled(), true, "revision A cannot be edited");

      // The revisions page shows the changed current A → B.
      await page.goto(`${sheetPath}/revisions`);
      await expectVisible(page.locator('[data-change="current_A"]'), "the changed current in the comparison");

      // The engineer's own list has it, at revision B.
      await page.goto("/my-sheets");
      const mine = page.locator(`[data-sheet="${tag}"]`);
      await expectVisible(mine, "the sheet in My sheets");
      assert.match(await mine.innerText(), /\bB\s*\(in force: A\)/, "My sheets shows revision B with A in force");

      // 7. A viewer reads everything and changes nothing.
      const viewerPage = await newPage();
      await signIn(viewerPage, viewer.email, viewer.password);
      await viewerPage.goto(sheetPath);
      await expectVisible(viewerPage.getByTestId("result-source"), "the results for a viewer");
      assert.equal(await viewerPage.getByLabel(CURRENT).isDisabled(), true, "the viewer's form is disabled");
      for (const name of [/^save/i, /submit for review/i, /start revision/i, /check this revision/i, /withdraw/i]) {
        await expectHidden(viewerPage.getByRole("button", { name }), `a ${String(name)} button for a viewer`);
      }
      await screenshot("sheet-viewer", viewerPage);
    },
    { timeoutMs: 180_000 },
  );

  test(
    "every sheet kind starts from the project's defaults with a result; a sizing pick opens a busbar rating; an enclosure budget takes its loss",
    async ({ page, unique, screenshot }) => {
      const engineer = demoUser("engineer");
      const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
      await signIn(page, engineer.email, engineer.password);
      const kinds: [string, RegExp][] = [
        ["voltage-drop", /feeder voltage drop/i],
        ["fault-withstand", /fault withstand/i],
        ["parallel-sharing", /parallel sharing/i],
        ["busbar-sizing", /busbar sizing/i],
        ["enclosure-heat", /enclosure heat budget/i],
      ];
      const paths: Record<string, string> = {};
      for (const [kind, name] of kinds) {
        await page.goto(`/projects/${projectId}/sheets/new?kind=${kind}`);
        await page.getByRole("radio", { name }).check();
        await page.getByRole("textbox", { name: "Tag", exact: true }).fill(`${kind.slice(0, 6)}-${unique}`.toUpperCase());
        await page.getByRole("button", { name: /create sheet/i }).click();
        await page.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname), { timeout: 20_000 });
        paths[kind] = new URL(page.url()).pathname;
        await waitForResultSource(page, "saved");
        await expectVisible(page.locator(`[data-results="${kind}"]`), `the ${kind} results`);
        await expectVisible(page.getByRole("note", { name: /caution/i }), `the caution on ${kind}`);
        await screenshot(`sheet-${kind}`, page);
      }

      // Voltage drop: a longer route gives a larger drop, live.
      await page.goto(paths["voltage-drop"]!);
      await waitForResultSource(page, "saved");
      const drop = page.getByTestId("result-drop-percent");
      const before = parseFloat(await drop.innerText());
      await page.getByLabel(/^Route length ?\(m\)$/).fill("150");
      await waitForResultSource(page, "live");
      assert.ok(parseFloat(await drop.innerText()) > before, "a longer feeder drops more voltage");

      // Two tabs on the same sheet: the second save meets the first one's version → conflict, then Reload.
      const other = await page.context().newPage();
      await other.goto(paths["voltage-drop"]!);
      await waitForResultSource(other, "saved");
      await page.getByRole("button", { name: /^save$/i }).click();
      await expectVisible(page.getByText(/saved revision a/i), "the first tab's save");
      await other.getByLabel(/^Load current ?\(A\)$/).fill("120");
      await other.getByRole("button", { name: /^save$/i }).click();
      await expectVisible(other.getByText(/someone else saved this sheet first/i), "the conflict banner");
      await screenshot("sheet-conflict", other);
      await other.getByRole("button", { name: /^reload$/i }).click();
      await waitForResultSource(other, "saved");
      assert.equal(await other.getByLabel(/^Route length ?\(m\)$/).inputValue(), "150", "after Reload the other tab's saved length shows");
      await other.close();

      // Busbar sizing: pick the first passing arrangement → a new busbar rating sheet.
      await page.goto(paths["busbar-sizing"]!);
      await waitForResultSource(page, "saved");
      await page.getByRole("button", { name: /rate this arrangement/i }).first().click();
      const dialog = page.getByRole("dialog");
      const ratingTag = `BRS-${unique}`.toUpperCase();
      await dialog.getByRole("textbox", { name: "Tag", exact: true }).fill(ratingTag);
      await dialog.getByRole("button", { name: /create busbar rating/i }).click();
      await page.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname) && url.pathname !== paths["busbar-sizing"], { timeout: 20_000 });
      await waitForResultSource(page, "saved");
      await expectVisible(page.getByTestId("result-temperature"), "the picked arrangement's rating");

      // Enclosure heat: the busbar rating's W/m × length becomes a loss row marked with its sheet.
      await page.goto(paths["enclosure-heat"]!);
      await waitForResultSource(page, "saved");
      const source = page.getByRole("listitem").filter({ hasText: ratingTag });
      await source.getByRole("textbox").fill("2");
      await source.getByRole("button", { name: new RegExp(`add ${ratingTag}`, "i") }).click();
      await expectVisible(page.getByText(/from sheet/i), "the loss row's source sheet");
      await waitForResultSource(page, "live");
      await expectVisible(page.getByRole("table", { name: /losses by source/i }).getByText(ratingTag), "the loss by source");
      assert.ok(parseFloat(await page.getByTestId("result-total-loss").innerText()) > 0, "the busbar loss counts");
      await page.getByRole("button", { name: /^save$/i }).click();
      await expectVisible(page.getByText(/saved revision a/i), "the saved budget");
      await screenshot("sheet-enclosure-heat-with-busbar", page);
    },
    { timeoutMs: 180_000 },
  );
});
