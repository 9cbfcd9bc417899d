import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { countProjects, demoOrganisationId, demoUser } from "./support/fixtures";
import { expectHidden, expectNotFound, expectVisible, signIn } from "./support/pages";
import { fillProjectForm } from "./support/project-form";

describe("roles", () => {
  test("a viewer sees no New project and may not open the new-project page", async ({ page }) => {
    const viewer = demoUser("viewer");
    await signIn(page, viewer.email, viewer.password);
    await page.goto("/projects");
    await expectVisible(page.getByRole("heading", { name: /projects/i }), "the projects heading");
    await expectHidden(page.getByRole("link", { name: /new project/i }), "a New project link");
    await expectHidden(page.getByRole("button", { name: /new project/i }), "a New project button");
    await expectNotFound(page, "/projects/new");
    assert.equal(await page.getByLabel(/^project code/i).count(), 0, "no project form for a viewer");
  });

  test("an engineer creates a project", async ({ page, unique, screenshot }) => {
    const engineer = demoUser("engineer");
    const orgId = await demoOrganisationId();
    const before = await countProjects(orgId);
    await signIn(page, engineer.email, engineer.password);
    await page.goto("/projects");
    await page.getByRole("link", { name: /new project/i }).click();
    await page.waitForURL(/\/projects\/new/);
    const code = `E2E-${unique}`.toUpperCase();
    await fillProjectForm(page, {
      code,
      name: "Distribution board DB-3, test hall",
      client: "Harrowgate Test Works",
      systemVoltage: "400",
    });
    await screenshot("project-new-filled", page);
    await page.getByRole("button", { name: /create project|save/i }).click();
    await page.waitForURL((url) => /^\/projects\/\d+/.test(url.pathname), { timeout: 20_000 });
    await expectVisible(page.getByText(code), "the new project's code on its page");
    await screenshot("project-detail", page);
    assert.equal(await countProjects(orgId), before + 1, "one project more in the database");
    await page.goto("/projects");
    await expectVisible(page.getByText(code, { exact: true }), "the new project in the list");
  });

  test("an administrator sees Users; an engineer gets 404 on /admin/users", async ({ page, newPage, screenshot }) => {
    const admin = demoUser("admin");
    await signIn(page, admin.email, admin.password);
    await page.goto("/projects");
    await page.getByRole("link", { name: /^users$/i }).first().click();
    await page.waitForURL(/\/admin\/users/);
    for (const role of ["lead", "engineer", "viewer"] as const) {
      await expectVisible(page.getByText(demoUser(role).email), `${role} in the user list`);
    }
    await screenshot("admin-users", page);

    const engineer = demoUser("engineer");
    const other = await newPage();
    await signIn(other, engineer.email, engineer.password);
    await other.goto("/projects");
    await expectHidden(other.getByRole("link", { name: /^users$/i }), "a Users link for an engineer");
    await expectNotFound(other, "/admin/users");
    assert.equal(await other.getByRole("button", { name: /send invitation/i }).count(), 0, "no invitation form for an engineer");
    assert.equal(await other.getByText(demoUser("viewer").email).count(), 0, "no user list for an engineer");
  });
});
