import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { countProjects, demoOrganisationId, demoUser } from "./support/fixtures";
import { expectVisible, signIn } from "./support/pages";
import { fillProjectForm, projectField } from "./support/project-form";

describe("bad input", () => {
  test("the project form shows messages at the fields and saves nothing", async ({ page, screenshot }) => {
    const engineer = demoUser("engineer");
    const orgId = await demoOrganisationId();
    const before = await countProjects(orgId);
    await signIn(page, engineer.email, engineer.password);
    await page.goto("/projects/new");
    await fillProjectForm(page, { code: "", name: "Board with bad input", systemVoltage: "5" });
    await page.getByRole("button", { name: /create project|save/i }).click();

    for (const [field, message] of [
      ["code", /project code is required/i],
      ["systemVoltage", /system voltage must be from 12 to 1000 V/i],
    ] as const) {
      const input = projectField[field](page);
      await expectVisible(page.getByText(message), `the message ${message} on the form`);
      assert.equal(await input.getAttribute("aria-invalid"), "true", `${field} is marked invalid`);
      const describedBy = (await input.getAttribute("aria-describedby")) ?? "";
      const ids = describedBy.split(/\s+/).filter(Boolean);
      const texts = await Promise.all(ids.map((id) => page.locator(`[id="${id}"]`).innerText().catch(() => "")));
      assert.ok(
        texts.some((t) => message.test(t)),
        `${field}'s aria-describedby (${describedBy}) points at its message`,
      );
    }
    await screenshot("project-form-errors", page);
    assert.match(new URL(page.url()).pathname, /\/projects\/new/, "still on the form");
    assert.equal(await countProjects(orgId), before, "nothing saved");
  });

  test("the JSON API answers 400 naming the bad fields", async ({ page }) => {
    const engineer = demoUser("engineer");
    const orgId = await demoOrganisationId();
    const before = await countProjects(orgId);
    await signIn(page, engineer.email, engineer.password);

    const res = await page.request.post("/api/v1/projects", {
      data: {
        code: "",
        name: "API board",
        systemVoltage: 5,
        systemType: "3ph-4w",
        frequency: 50,
        earthing: "TN-S",
        designAmbient: 35,
        altitude: "high",
        standardFamily: "iec",
        unitSystem: "metric",
      },
    });
    assert.equal(res.status(), 400);
    const body = (await res.json()) as { error?: { code?: string; fields?: Record<string, string> } };
    assert.equal(body.error?.code, "validation");
    const fields = body.error?.fields ?? {};
    assert.match(fields.code ?? "", /project code is required/i);
    assert.match(fields.systemVoltage ?? "", /system voltage must be from 12 to 1000 V/i);
    assert.match(fields.altitude ?? "", /altitude must be a number/i);

    const notJson = await page.request.post("/api/v1/projects", { data: "{not json", headers: { "content-type": "application/json" } });
    assert.equal(notJson.status(), 400, "a body that is not JSON is a 400");
    assert.equal(await countProjects(orgId), before, "nothing saved");
  });
});
