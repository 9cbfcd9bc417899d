import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { expectVisible, signIn } from "./support/pages";

// An admin uploads the organisation's ampacity table: a file with a bad row is refused
// with the row named, the fixed file is stored as version 1. An engineer then takes a
// feeder's current-carrying capacity from it and sees the table named in the results.
//
// Illustrative values: 35 mm² copper PVC, installation E, 110 A at 30 °C reference,
// 70 °C maximum. The demo project's design ambient is 35 °C, so
// k_θ = √((70 − 35)/(70 − 30)) = 0.935 and I_z = 110·0.935 = 102.9 A (no grouping).

const HEADER = "size (mm2),label,material,insulation,installation method,reference ambient (C),conductor max (C),amps";
const ROWS = ["25,25 mm²,copper,pvc,E,30,70,92", "35,35 mm²,copper,pvc,E,30,70,110", "50,50 mm²,copper,pvc,E,30,70,134"];

describe("organisation ampacity tables", () => {
  test(
    "admin uploads a table with a bad row and sees the errors, fixes it and gets version 1; an engineer picks it on a feeder voltage drop sheet and sees it named",
    async ({ page, newPage, unique, screenshot }) => {
      const admin = demoUser("admin");
      const name = `Feeder table ${unique}`;
      await signIn(page, admin.email, admin.password);
      await page.goto("/ampacity-tables");
      await expectVisible(page.getByRole("heading", { name: "Ampacity tables", level: 1 }), "the ampacity tables page");

      // 1. A file with one bad row is refused whole, the row and column named.
      await page.getByLabel("Table name", { exact: true }).fill(name);
      await page.getByRole("textbox", { name: "Source" }).fill("Illustrative e2e values, not a code's table");
      const bad = [HEADER, ROWS[0], "35,35 mm²,copper,pvc,E,30,70,n/a", ROWS[2]].join("\n");
      await page.setInputFiles("#file", { name: "feeder-table.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
      await page.getByRole("button", { name: "Upload table" }).click();
      const errors = page.getByTestId("upload-errors");
      await expectVisible(errors, "the list of row errors");
      assert.match(await errors.innerText(), /Line 3, column "amps": Amps "n\/a" is not a number/);
      await expectVisible(page.getByText(/a code table must be complete/), "why the whole table was refused");
      await screenshot("ampacity-upload-refused", page);

      // 2. The fixed file is stored as version 1 of the name.
      await page.setInputFiles("#file", { name: "feeder-table.csv", mimeType: "text/csv", buffer: Buffer.from([HEADER, ...ROWS].join("\n")) });
      await page.getByRole("button", { name: "Upload table" }).click();
      const stored = page.getByTestId("upload-stored");
      await expectVisible(stored, "the stored message");
      assert.match(await stored.innerText(), new RegExp(`Stored version 1 of “${name}” with 3 rows`));
      const listRow = page.getByTestId("ampacity-tables").locator("tr", { hasText: name });
      await expectVisible(listRow, "the table in the list");
      assert.match(await listRow.innerText(), /v1\s+3\s+Illustrative e2e values/);
      // Typing the same name again announces the next version.
      await page.getByLabel("Table name", { exact: true }).fill(name);
      await expectVisible(page.getByText(`Uploading adds version 2 of “${name}”; version 1 stays readable.`), "the next-version hint");
      await screenshot("ampacity-tables-list", page);

      // The version's own page lists its rows and the file's hash.
      await listRow.getByRole("link", { name }).click();
      await expectVisible(page.getByRole("heading", { name: `${name} v1` }), "the version's page");
      assert.equal(await page.getByTestId("ampacity-rows").locator("tbody tr").count(), 3);
      assert.match(await page.getByTestId("file-sha256").innerText(), /^[0-9a-f]{64}$/);

      // 3. An engineer takes I_z from the table on a feeder voltage drop sheet.
      const engineer = demoUser("engineer");
      const ep = await newPage();
      await signIn(ep, engineer.email, engineer.password);
      const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
      await ep.goto(`/projects/${projectId}/sheets/new?kind=voltage-drop`);
      await ep.getByRole("radio", { name: /feeder voltage drop/i }).check();
      await ep.getByRole("textbox", { name: "Tag", exact: true }).fill(`VD-AT-${unique}`.toUpperCase().slice(0, 40));
      await ep.getByRole("textbox", { name: "Title", exact: true }).fill("Feeder to DB-3, 35 mm² Cu PVC");
      await ep.getByRole("button", { name: /create sheet/i }).click();
      await ep.waitForURL((url) => /^\/projects\/\d+\/sheets\/\d+$/.test(url.pathname), { timeout: 20_000 });
      await expectVisible(ep.locator('[data-results="voltage-drop"]'), "the voltage drop results");

      await ep.getByRole("radio", { name: /organisation's ampacity table/i }).check();
      await ep.getByLabel("Ampacity table", { exact: true }).selectOption({ label: `${name} v1` });
      const used = ep.getByTestId("result-ampacity-table");
      await expectVisible(used, "the table named in the results", 20_000);
      const text = await used.innerText();
      assert.match(text, new RegExp(`Ampacity from ${name} v1, row 35 mm² copper PVC, installation E \\(110 A at 30 °C\\), k_θ 0\\.935, k_g 1\\.00 \\(no grouping\\)`));
      assert.match(text, /I_z 102\.9 A/);
      assert.equal(await ep.getByLabel("Installation method").inputValue(), "E", "the table's installation method");
      assert.equal(await ep.getByLabel("Insulation in the table").inputValue(), "pvc");
      assert.match(await ep.getByTestId("result-table-iz").innerText(), /^102\.9 A$/);
      await screenshot("ampacity-feeder-results", ep);

      // Saved: the server's result names the table too.
      await ep.getByRole("button", { name: "Save", exact: true }).click();
      await ep.locator('[data-testid="result-source"][data-source="saved"]').waitFor({ state: "visible", timeout: 20_000 });
      await expectVisible(ep.getByTestId("result-ampacity-table").getByText(`${name} v1`), "the table named in the saved result");
    },
    { timeoutMs: 120_000 },
  );
});
