import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { expectVisible, signIn } from "./support/pages";

/** Six invented feeders: four computable (one failing its drop), one with a bad power factor, one with no ampacity. */
const SCHEDULE = [
  "tag;from;to;material;insulation;size (mm²);number in parallel;length [m];load current (A);power factor;system;voltage (V);ampacity (A);ambient (°C)",
  "=X-201;MSB-2;Wash bay;copper;pvc;16;1;35;40;0,86;ac-3ph-4w;400;76;-5",
  "X-202;MSB-2;Compressor;copper;xlpe;35;1;60;95;0,82;ac-3ph-4w;400;158;30",
  "X-203;MSB-2;Gate;copper;pvc;2,5;1;300;14;0,95;ac-1ph-2w;230;24;30",
  "X-204;MSB-2;Dryer;copper;pvc;10;1;25;30;7;ac-3ph-4w;400;57;30",
  "",
  "X-205;MSB-2;Lights;copper;pvc;1,5;1;40;8;0,95;ac-1ph-2w;230;;30",
  "X-206;MSB-2;Chiller;aluminium;xlpe;95;2;80;260;0,85;ac-3ph-4w;400;215;35",
].join("\r\n");

describe("Cable schedule", () => {
  test("an engineer uploads a schedule with bad rows, sees the errors and the results, exports the CSV and re-imports it", async ({ page, screenshot }) => {
    const engineer = demoUser("engineer");
    const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
    await signIn(page, engineer.email, engineer.password);

    // From the project page's panel to the schedule page.
    await page.goto(`/projects/${projectId}`);
    await page.locator("#schedule-panel-heading").waitFor();
    await page.getByRole("link", { name: /cable schedule/i }).click();
    await page.waitForURL(new RegExp(`/projects/${projectId}/schedule$`));
    await expectVisible(page.getByRole("heading", { name: "Cable schedule", level: 1 }), "the schedule page");
    await expectVisible(page.getByRole("note", { name: "Caution" }), "the caution");

    // The template downloads.
    const template = await page.request.get(`/projects/${projectId}/schedule/template`);
    assert.equal(template.status(), 200);
    assert.match(await template.text(), /^\uFEFFtag,from,to,material,insulation,size \(mm²\)/);

    // A file that is not a CSV is refused with a message on the field.
    await page.getByLabel("Schedule file (CSV)").setInputFiles({ name: "feeders.xlsx", mimeType: "application/octet-stream", buffer: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0]) });
    await page.getByRole("button", { name: "Upload and compute" }).click();
    await expectVisible(page.getByText(/This is a spreadsheet workbook/), "the refusal of a workbook");
    assert.equal(await page.getByLabel("Schedule file (CSV)").getAttribute("aria-invalid"), "true");

    // The schedule with bad rows: semicolons, decimal commas, a formula-looking tag.
    await page.getByLabel("Schedule file (CSV)").setInputFiles({ name: "msb-2-feeders.csv", mimeType: "text/csv", buffer: Buffer.from(`\uFEFF${SCHEDULE}`, "utf8") });
    await page.getByRole("button", { name: "Upload and compute" }).click();
    await expectVisible(page.getByRole("status").filter({ hasText: /Uploaded: 6 rows, 4 computed/ }), "the upload's counts", 30_000);
    await expectVisible(page.getByRole("heading", { name: "Row errors" }), "the row errors");
    const errors = page.getByRole("list", { name: "Errors by row" });
    await expectVisible(errors.getByText('Row 5, column "power factor": power factor must be from 0 to 1.'), "the power-factor error of row 5");
    await expectVisible(errors.getByText(/Row 7: no ampacity/), "the no-ampacity error of row 7");
    await expectVisible(page.getByText("msb-2-feeders.csv").first(), "the file name in the summary");
    await expectVisible(page.getByText(/Separator: semicolon/), "how the file was read");

    const table = page.getByRole("table", { name: "Computed rows of the cable schedule" });
    assert.equal(await table.locator("tbody tr").count(), 4);
    await expectVisible(table.getByText("=X-201"), "the formula-looking tag shown as text");
    const failing = await table.locator('tbody tr[data-result="fail"]').count();
    assert.ok(failing >= 1, "the long 2.5 mm² run fails its drop limit");
    await page.getByLabel("Result", { exact: true }).selectOption("fail");
    assert.equal(await table.locator("tbody tr").count(), failing);
    await expectVisible(table.getByText(/Voltage drop .* exceeds the .* limit/).first(), "the failing reason");
    await page.getByLabel("Result", { exact: true }).selectOption("");
    await page.getByLabel("Filter", { exact: true }).fill("compressor");
    assert.equal(await table.locator("tbody tr").count(), 1);
    await page.getByLabel("Filter", { exact: true }).fill("");
    const dropHeader = table.locator("th").filter({ hasText: "Drop (%)" });
    for (let i = 0; i < 2 && (await dropHeader.getAttribute("aria-sort")) !== "descending"; i++) await dropHeader.getByRole("button").click();
    assert.equal(await dropHeader.getAttribute("aria-sort"), "descending");
    assert.equal(await table.locator("tbody tr").first().getAttribute("data-result"), "fail", "sorted by drop, largest first");
    await screenshot("schedule-uploaded");

    // Export: formula-looking cells neutralised; then the export goes back in as a schedule.
    const href = await page.getByRole("link", { name: "Export results (CSV)" }).getAttribute("href");
    assert.ok(href);
    const exported = await page.request.get(href);
    assert.equal(exported.status(), 200);
    const csv = await exported.text();
    assert.match(csv, /\n"'=X-201",MSB-2,/, "the tag starting with = gets a quote");
    assert.match(csv, /,"'-5",/, "a negative ambient gets a quote too");
    assert.equal(csv.trim().split("\r\n").length, 5);

    await page.getByLabel("Schedule file (CSV)").setInputFiles({ name: "re-import.csv", mimeType: "text/csv", buffer: Buffer.from(csv, "utf8") });
    await page.getByRole("button", { name: "Upload and compute" }).click();
    await expectVisible(page.getByRole("status").filter({ hasText: /Uploaded: 4 rows, 4 computed \(\d+ failing\), no row errors/ }), "the re-import's counts", 30_000);
    await expectVisible(page.getByText(/Columns not used \(ignored\)/), "the result columns ignored on re-import");
    await expectVisible(table.getByText("=X-201"), "the tag read back without the quote");
    assert.equal(await page.getByRole("heading", { name: "Row errors" }).count(), 0);
    assert.equal(await table.locator('tbody tr[data-result="fail"]').count(), failing, "the same rows fail");

    // Both uploads are listed with their hash; the first comes back byte for byte.
    const uploads = page.getByRole("table", { name: "Uploaded cable schedules" });
    assert.equal(await uploads.locator("tbody tr").count() >= 2, true);
    const original = await uploads.locator("tbody tr").filter({ hasText: "msb-2-feeders.csv" }).getByRole("link", { name: "File as uploaded" }).getAttribute("href");
    const back = await page.request.get(original!);
    const body = await back.body();
    assert.equal(body.toString("utf8"), `\uFEFF${SCHEDULE}`);
    await screenshot("schedule-reimported");

    // The project page shows the current schedule's counts.
    await page.goto(`/projects/${projectId}`);
    await expectVisible(page.getByText(/re-import\.csv: 4 rows/), "the project page's schedule panel");
  }, { timeoutMs: 120_000 });

  test("a viewer sees the cable schedule but no upload form", async ({ page }) => {
    const viewer = demoUser("viewer");
    const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
    await signIn(page, viewer.email, viewer.password);
    await page.goto(`/projects/${projectId}/schedule`);
    await expectVisible(page.getByRole("heading", { name: "Cable schedule", level: 1 }), "the schedule page");
    assert.equal(await page.getByLabel("Schedule file (CSV)").count(), 0);
  });
});
