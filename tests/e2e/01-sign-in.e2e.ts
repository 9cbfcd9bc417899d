import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { createUser, demoOrganisationId, DEMO_PROJECTS, DEMO_USERS } from "./support/fixtures";
import { expectVisible, fillSignIn, signIn, signInError } from "./support/pages";

describe("sign-in", () => {
  for (const user of DEMO_USERS) {
    test(`${user.role} signs in and sees the demo projects`, async ({ page, screenshot }) => {
      await signIn(page, user.email, user.password);
      await page.goto("/projects");
      for (const p of DEMO_PROJECTS) {
        await expectVisible(page.getByText(p.code, { exact: true }), `project ${p.code} in the list`);
      }
      await expectVisible(page.getByText(user.name), `the signed-in user's name (${user.name})`);
      if (user.role === "engineer") await screenshot("projects-list-engineer", page);
    });
  }

  test("a wrong password is refused with a message and no session", async ({ page, screenshot }) => {
    await page.goto("/login");
    await screenshot("sign-in", page);
    await fillSignIn(page, "viewer@wrenfield.example", "not-the-password");
    await expectVisible(signInError(page), "an error message on the sign-in page");
    assert.match(await signInError(page).innerText(), /e-?mail|password|incorrect|wrong|not match/i);
    assert.match(new URL(page.url()).pathname, /^\/login/);
    await screenshot("sign-in-refused", page);
    // Still signed out: a protected page sends the visitor back to sign-in.
    await page.goto("/projects");
    assert.match(new URL(page.url()).pathname, /^\/login/);
  });

  test("five failed attempts lock the e-mail, even against the right password", async ({ page, unique, screenshot }) => {
    const email = `throttle-${unique}@wrenfield.example`;
    const password = `right-password-${unique}`;
    await createUser(await demoOrganisationId(), email, password, "viewer", "Throttle Probe");
    for (let i = 1; i <= 5; i++) {
      await fillSignIn(page, email, `wrong-password-${i}`);
      await expectVisible(signInError(page), `the refusal of attempt ${i}`);
    }
    await fillSignIn(page, email, password);
    await expectVisible(page.getByText(/too many failed sign-ins/i), "the throttling message");
    assert.match(new URL(page.url()).pathname, /^\/login/);
    await screenshot("sign-in-throttled", page);
  });
});
