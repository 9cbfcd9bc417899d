import assert from "node:assert/strict";
import type { Page } from "playwright-core";
import { sparePanel } from "../../bench/network-server";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { expectVisible, signIn } from "./support/pages";

// A bus network sheet in the browser: the engineer adds one, sees the solved network
// (key values, diagram, voltage along a path, hottest segments, the spare way that
// carries no current), edits a load and a segment and sees the picture and the numbers
// change without a page reload, saves, then imports a network file (and a bad one).

async function waitForResultSource(page: Page, source: "live" | "saved") {
  await page.locator(`[data-testid="result-source"][data-source="${source}"]:not([data-busy])`).waitFor({ state: "visible", timeout: 30_000 });
}

/** What the results show of the network: hottest table, diagram summary and drawing, path caption, worst drop. */
async function snapshot(page: Page) {
  const diagram = page.getByTestId("network-diagram");
  await diagram.waitFor({ state: "visible", timeout: 20_000 });
  const pathFigure = page.locator("figure", { has: page.getByTestId("network-path-plot") });
  return {
    hottest: (await page.getByTestId("hottest-segments").innerText()).trim(),
    diagramLabel: (await diagram.getAttribute("aria-label")) ?? "",
    diagramSvg: await diagram.evaluate((el) => el.outerHTML),
    path: (await pathFigure.locator("figcaption").first().innerText()).trim(),
    worstDrop: (await page.getByTestId("bn-worst-drop").innerText()).trim(),
  };
}

/** Polls until `read` gives something other than `old` (the live result arrives after a debounce). */
async function changed<T>(read: () => Promise<T>, old: T, what: string, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const now = await read();
    if (JSON.stringify(now) !== JSON.stringify(old)) return now;
    if (Date.now() > deadline) assert.fail(`expected ${what} to change`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

const SMALL_CSV = [
  "record,id,material,area_mm2,temperature_C,reactance_mohm_per_m,ampacity_A,from,to,conductor,length_m,node,current_A,pf,voltage_V,name,value",
  "setting,,,,,,,,,,,,,,,mode,ac",
  "conductor,bar,cu-etp,500,70,0.15,1000,,,,,,,,,,",
  "conductor,cable,cu-annealed,25,70,0.08,100,,,,,,,,,,",
  "segment,K1,,,,,,IN,Q1,bar,0.5,,,,,,",
  "segment,K2,,,,,,Q1,Q2,bar,0.5,,,,,,",
  "segment,F1,,,,,,Q1,X1,cable,15,,,,,,",
  "segment,F2,,,,,,Q2,X2,cable,22,,,,,,",
  "segment,F3,,,,,,Q2,SPARE,cable,4,,,,,,",
  "supply,,,,,,,,,,,IN,,,230,,",
  "load,,,,,,,,,,,X1,40,0.9,,,",
  "load,,,,,,,,,,,X2,63,0.85,,,",
].join("\n");

describe("bus network sheets", () => {
  test(
    "engineer adds a bus network, sees it solved and coloured, edits a load and a segment without a reload, saves, and imports a CSV network",
    async ({ page, unique, screenshot }) => {
      const engineer = demoUser("engineer");
      const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
      const tag = `BN-${unique}`.toUpperCase().slice(0, 40);

      // 1. Add a bus network sheet: it starts from a small panel of the project's system.
      await signIn(page, engineer.email, engineer.password);
      await page.goto(`/projects/${projectId}/sheets/new`);
      await page.getByRole("radio", { name: /bus network/i }).check();
      await page.getByRole("textbox", { name: "Tag", exact: true }).fill(tag);
      await page.getByRole("textbox", { name: "Title", exact: true }).fill("Main distribution board MDB-1");
      await page.getByRole("button", { name: /create sheet/i }).click();
      await page.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname), { timeout: 20_000 });

      // 2. The server's result: key values, caution, diagram with legend, path plot, hottest list, the spare way.
      await waitForResultSource(page, "saved");
      await expectVisible(page.getByRole("note", { name: /caution/i }), "the caution");
      await expectVisible(page.getByRole("img", { name: /bus network diagram/i }), "the network diagram");
      await expectVisible(page.getByTestId("network-legend"), "the colour legend");
      await expectVisible(page.getByTestId("network-path-plot"), "the voltage along a path");
      assert.match(await page.getByTestId("bn-supply-current").innerText(), /^\d+(\.\d+)? A$/);
      const dead = page.getByTestId("dead-branches");
      await expectVisible(dead, "the branches that carry no current");
      assert.match(await dead.innerText(), /TO-4/, "the unloaded spare way is listed as carrying no current");
      const before = await snapshot(page);
      await screenshot("bus-network-saved", page);

      // 3. Edit a load current: live result, new colours, new hottest values and path, no reload.
      await page.evaluate(() => ((window as unknown as { __noReload: number }).__noReload = 1));
      await page.getByRole("textbox", { name: "Load 4 current (A)" }).fill("160");
      await waitForResultSource(page, "live");
      const afterLoad = await changed(() => snapshot(page), before, "the results after a load change");
      assert.notEqual(afterLoad.hottest, before.hottest, "the hottest segments' values change with the load");
      assert.notEqual(afterLoad.diagramSvg, before.diagramSvg, "the diagram is recoloured");
      assert.notEqual(afterLoad.path, before.path, "the voltage along the path changes");
      assert.notEqual(afterLoad.worstDrop, before.worstDrop, "the worst drop changes");

      // A segment length: the path to the far motor gets longer and its drop larger.
      await page.getByRole("textbox", { name: "Segment 11 length (m)" }).fill("45");
      await waitForResultSource(page, "live");
      const afterLength = await changed(async () => (await snapshot(page)).path, afterLoad.path, "the path plot after a length change").then(() => snapshot(page));
      assert.notEqual(afterLength.path, afterLoad.path, "the path plot changes with a segment length");
      assert.equal(await page.evaluate(() => (window as unknown as { __noReload?: number }).__noReload), 1, "the page was not reloaded");

      // A value out of range names the row, the field and the range.
      await page.getByRole("textbox", { name: "Segment 2 length (m)" }).fill("-1");
      await expectVisible(page.getByText("Segment 2, length: length must be from 0.0001 to 10000 m"), "the row and field of the error");
      await page.getByRole("textbox", { name: "Segment 2 length (m)" }).fill("0.8");
      await screenshot("bus-network-live", page);

      // 4. Save: the server's result matches the live one.
      await page.getByRole("button", { name: /^save$/i }).click();
      await expectVisible(page.getByText(/saved revision a/i), "the saved message");
      await waitForResultSource(page, "saved");
      assert.equal((await snapshot(page)).worstDrop, afterLength.worstDrop, "the saved worst drop equals the live one");

      // 5. A bad file changes nothing and its problem names the row and column.
      const fileInput = page.getByLabel("Import a network (.csv or .json)");
      await fileInput.setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from(SMALL_CSV.replace("segment,K2,,,,,,Q1,Q2,bar,0.5", "segment,K2,,,,,,Q1,Q2,bar,-3")) });
      await page.getByRole("button", { name: /import and solve/i }).click();
      await expectVisible(page.getByText("Row 6, column length_m: length must be from 0.0001 to 10000 m"), "the bad row of the file");

      // 6. A good file replaces the network; the form and the result follow.
      await fileInput.setInputFiles({ name: "board.csv", mimeType: "text/csv", buffer: Buffer.from(SMALL_CSV) });
      await page.getByRole("button", { name: /import and solve/i }).click();
      await expectVisible(page.getByText(/imported 6 nodes, 5 segments and 2 loads/i), "the import message");
      await changed(() => page.getByRole("textbox", { name: "Segment 1 id" }).inputValue(), "MB-1", "the first segment id in the form after the import");
      assert.equal(await page.getByRole("textbox", { name: "Segment 1 id" }).inputValue(), "K1", "the imported segments are in the form");
      await waitForResultSource(page, "saved");
      assert.match(await page.getByTestId("dead-branches").innerText(), /F3/, "the imported spare way carries no current");
      await screenshot("bus-network-imported", page);

      // 7. A network too large for the tables: a summary of the server's result, the workflow still there.
      const large = sparePanel(2_000);
      assert.ok(large.segments.length > 1500, "the generated panel is above the form's limit");
      await fileInput.setInputFiles({ name: "large.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(large)) });
      await page.getByRole("button", { name: /import and solve/i }).click();
      await expectVisible(page.getByTestId("large-network"), "the large network summary", 30_000);
      assert.match(await page.getByTestId("solved-on-server").innerText(), /^Solved on the server in [\d,]+ ms when .+ imported “large\.json”/);
      await expectVisible(page.getByTestId("hottest-segments"), "the hottest segments of the stored result");
      assert.equal(await page.getByRole("textbox", { name: "Segment 1 id" }).count(), 0, "no table rows for a large network");
      await expectVisible(page.getByRole("button", { name: /submit for review/i }), "the workflow for a large network");
      await expectVisible(page.getByRole("link", { name: /download the current network/i }), "the download of the network");
      await screenshot("bus-network-large", page);
    },
    { timeoutMs: 150_000 },
  );
});
