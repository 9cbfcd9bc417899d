import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { createSecondOrganisation, DEMO_PROJECTS, demoOrganisationId, projectIdByCode, projectRow } from "./support/fixtures";
import { expectNotFound, expectVisible, signIn } from "./support/pages";
import { projectField } from "./support/project-form";

describe("organisation isolation", () => {
  test("another organisation's project is 404 in pages, the API and server actions", async ({ page, unique, screenshot }) => {
    const demoOrg = await demoOrganisationId();
    const demoProjectId = await projectIdByCode(demoOrg, DEMO_PROJECTS[0].code);
    const before = await projectRow(demoProjectId);
    const second = await createSecondOrganisation(unique);

    await signIn(page, second.email, second.password);
    await page.goto("/projects");
    await expectVisible(page.getByText(`SO-${unique}`), "the second organisation's own project");
    for (const p of DEMO_PROJECTS) {
      assert.equal(await page.getByText(p.code, { exact: true }).count(), 0, `the demo project ${p.code} must not be listed`);
    }

    // The page.
    await expectNotFound(page, `/projects/${demoProjectId}`);
    const shown = await page.locator("body").innerText();
    assert.ok(!shown.includes(DEMO_PROJECTS[0].code) && !shown.includes(DEMO_PROJECTS[0].name), "nothing of the other project is shown");
    await expectNotFound(page, `/projects/${demoProjectId}/edit`);
    assert.equal(await projectField.name(page).count(), 0, "no edit form for the other organisation's project");
    await screenshot("project-other-organisation-404", page);

    // The JSON API, with this browser's session cookie.
    const api = await page.request.get(`/api/v1/projects/${demoProjectId}`);
    assert.equal(api.status(), 404, "GET /api/v1/projects/<other organisation's id>");
    const own = await page.request.get(`/api/v1/projects/${second.projectId}`);
    assert.equal(own.status(), 200, "GET /api/v1/projects/<own id>");
    const patch = await page.request.patch(`/api/v1/projects/${demoProjectId}`, { data: { version: before!.version, name: "Tampered" } });
    assert.equal(patch.status(), 404, "PATCH /api/v1/projects/<other organisation's id>");

    // The server action: the edit form of the user's own project, with the project id in the
    // action's request rewritten to the other organisation's project.
    await page.goto(`/projects/${second.projectId}/edit`);
    await projectField.name(page).fill(`Tampered ${unique}`);
    let rewritten = false;
    await page.route("**/*", async (route) => {
      const req = route.request();
      const body = req.postData();
      if (req.method() !== "POST" || !req.headers()["next-action"] || !body) return route.continue();
      const own = String(second.projectId);
      const tampered = body
        .replace(new RegExp(`("id"\\s*:\\s*"?)${own}(?!\\d)`, "g"), `$1${demoProjectId}`)
        .replace(new RegExp(`(name="[^"]*id"\\r\\n\\r\\n)${own}(?!\\d)`, "g"), `$1${demoProjectId}`);
      rewritten ||= tampered !== body;
      return route.continue({ postData: tampered });
    });
    const actionResponse = page.waitForResponse((r) => r.request().method() === "POST" && !!r.request().headers()["next-action"]);
    await page.getByRole("button", { name: /save/i }).click();
    await actionResponse;
    assert.ok(rewritten, "the action request carried the project id and was rewritten");
    await expectVisible(page.getByRole("alert").filter({ hasText: /project not found/i }), "the action's not-found answer on the form");
    await screenshot("project-edit-tampered-action", page);
    await page.unroute("**/*");

    const after = await projectRow(demoProjectId);
    assert.equal(after?.name, before?.name, "the demo project's name is unchanged");
    assert.equal(after?.version, before?.version, "the demo project's version is unchanged");
    const ownAfter = await projectRow(second.projectId);
    assert.equal(ownAfter?.name, "Second organisation distribution board", "the user's own project is unchanged");
  });
});
