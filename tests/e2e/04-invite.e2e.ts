import assert from "node:assert/strict";
import { describe, test } from "./harness";
import { DEMO_PROJECTS, demoUser } from "./support/fixtures";
import { waitForMail } from "./support/mailbox";
import { expectVisible, signIn } from "./support/pages";

describe("invitations", () => {
  test("admin invites an engineer; the mail arrives; the link sets name and password; the new user signs in", async ({
    page,
    newPage,
    services,
    unique,
    screenshot,
  }) => {
    const admin = demoUser("admin");
    const email = `new-engineer-${unique}@wrenfield.example`;
    const password = `welcome-${unique}-aboard`;

    await signIn(page, admin.email, admin.password);
    await page.goto("/admin/users");
    const form = page.locator("form").filter({ has: page.getByRole("button", { name: /send invitation/i }) });
    await form.getByLabel(/e-?mail/i).fill(email);
    await form.getByLabel(/role/i).selectOption("engineer");
    await form.getByRole("button", { name: /send invitation/i }).click();
    await expectVisible(page.getByText(email), "the pending invitation in the admin page");

    // The outbox sender delivers to the fake SMTP server, which stores one JSON file per message.
    const mail = await waitForMail(services.mailboxDir, email);
    const link = /https?:\/\/[^\s<>"]+\/invite\/[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
    assert.ok(link, `the invitation mail contains an /invite/<token> link:\n${mail.text}`);
    assert.ok(link.startsWith(services.baseURL), `the link points at the app (${link})`);

    // The admin mailbox shows the same message.
    await page.goto("/admin/mailbox");
    await expectVisible(page.getByText(mail.subject).first(), "the invitation's subject in the admin mailbox");
    await expectVisible(page.getByText(email).first(), "the recipient in the admin mailbox");
    await screenshot("admin-mailbox", page);

    // The invited person, in a browser of their own.
    const invited = await newPage();
    await invited.goto(link);
    await screenshot("invite-accept", invited);
    await invited.getByLabel(/name/i).first().fill("Nadia Quorrel");
    const passwordFields = invited.getByLabel(/password/i);
    const n = await passwordFields.count();
    assert.ok(n >= 1, "the invitation page asks for a password");
    for (let i = 0; i < n; i++) await passwordFields.nth(i).fill(password);
    await invited.getByRole("button", { name: /create|accept|join|set password|continue/i }).click();
    await invited.waitForURL((url) => !url.pathname.startsWith("/invite/"), { timeout: 20_000 });

    // The link is single-use.
    await invited.goto(link);
    assert.equal(await invited.getByLabel(/password/i).count(), 0, "a used invitation link no longer offers the form");

    const fresh = await newPage();
    await signIn(fresh, email, password);
    await fresh.goto("/projects");
    await expectVisible(fresh.getByText(DEMO_PROJECTS[0].code, { exact: true }), "the demo projects for the new engineer");
    await expectVisible(fresh.getByText("Nadia Quorrel"), "the new user's name");
  });
});
