import assert from "node:assert/strict";
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoOrganisationId, demoUser, projectIdByCode } from "./support/fixtures";
import { expectVisible, signIn } from "./support/pages";

/** Text of a PDF, page by page, through poppler's pdftotext (Debian's poppler-utils). */
function pdfText(bytes: Buffer): string {
  const dir = mkdtempSync(path.join(tmpdir(), "ohm-pdf-"));
  const file = path.join(dir, "doc.pdf");
  writeFileSync(file, bytes);
  return execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
}

describe("PDF sheets, stamp and package", () => {
  test("a lead downloads the approved sheet's stamped PDF, anyone verifies its code, and the package is issued from the project page", async ({ page, newPage, screenshot }) => {
    const lead = demoUser("lead");
    const projectId = await projectIdByCode(await demoOrganisationId(), DEMO_PROJECTS[0].code);
    await signIn(page, lead.email, lead.password);

    // The seeded approved busbar rating, through its sheet page's "Download PDF" link.
    await page.goto(`/projects/${projectId}`);
    await page.getByRole("link", { name: "BR-01" }).first().click();
    await page.waitForURL(/\/sheets\/\d+/);
    const href = await page.getByRole("link", { name: "Download PDF" }).getAttribute("href");
    assert.ok(href, "the sheet page links its PDF");
    const pdf = await page.request.get(href);
    assert.equal(pdf.status(), 200);
    assert.equal(pdf.headers()["content-type"], "application/pdf");
    const text = pdfText(await pdf.body());
    assert.match(text, /APPROVED/, "the stamp");
    assert.match(text, /Idris Pennock/, "the approver on the stamp");
    assert.match(text, /Design aid/, "the caution");
    assert.doesNotMatch(text, /DRAFT/, "no watermark on an approved revision");
    const code = /Verify code\s+([A-Z2-7]{10})/.exec(text)?.[1];
    assert.ok(code, "the verification code is printed");

    // The public verification page, without signing in.
    const visitor = await newPage();
    await visitor.goto(`/verify/${code}`);
    await expectVisible(visitor.getByText("Approved and current"), "the verification verdict");
    const shown = await visitor.locator("body").innerText();
    assert.ok(!shown.includes(DEMO_PROJECTS[0].name), "the verification page shows nothing of the project");
    await screenshot("verify-approved", visitor);

    // The package, issued from the project page with drafts included.
    await page.goto(`/projects/${projectId}`);
    await page.getByLabel("Include drafts (watermarked DRAFT)").check();
    await page.getByRole("button", { name: "Issue calculation package" }).click();
    await page.waitForURL(/package=\d+/, { timeout: 60_000 });
    const download = page.locator("#packages").getByRole("link", { name: "Download PDF" }).first();
    await expectVisible(download, "the issued package's download link", 30_000);
    await screenshot("project-package-issued", page);
    const pkg = await page.request.get((await download.getAttribute("href"))!);
    assert.equal(pkg.status(), 200);
    const body = await pkg.body();
    const { createHash } = await import("node:crypto");
    assert.equal(createHash("sha256").update(body).digest("hex"), pkg.headers()["x-content-sha256"], "the package comes back exactly as issued");
    const pkgText = pdfText(body);
    for (const tag of ["BR-01", "FW-01", "VD-01", "EH-01"]) assert.match(pkgText, new RegExp(tag), `the package lists ${tag}`);
    assert.match(pkgText, /DRAFT/, "drafts are watermarked");
  });
});
