import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, mainNavLabels, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser.close();
});

describe("an admin invites a new rigger", () => {
  it("the invitation is caught, its link sets a password, and the new user signs in", async () => {
    const { page, context } = browser;
    await signIn(page, "admin@example.com");
    await page.goto("/admin/users/new");
    await hydrated(page);
    await page.getByLabel("Name").fill("Sian Castell");
    await page.getByLabel("E-mail").fill("sian.castell@example.com");
    await page.getByLabel("Rigger").check();
    await page.getByRole("button", { name: "Add and send invitation" }).click();
    await page.waitForURL("**/admin");
    await expect
      .poll(() => page.getByRole("status").innerText())
      .toContain("invitation to set a password is on its way to sian.castell@example.com");
    await screenshot(page, "admin-users");

    // The invitation is sent after the answer, so the outbox may need a moment.
    await expect
      .poll(async () => {
        await page.goto("/admin/outbox");
        return page.getByRole("link", { name: /added to Plumbline/ }).count();
      })
      .toBeGreaterThan(0);
    await page
      .getByRole("link", { name: /added to Plumbline/ })
      .first()
      .click();
    await page.waitForURL("**/admin/outbox/*");
    const body = await page.getByTestId("mail-body").innerText();
    expect(body).toContain("Hello Sian Castell");
    const link = body.match(/https?:\/\/\S+\/set-password\/\S+/)?.[0];
    expect(link).toBeDefined();
    await screenshot(page, "outbox-invitation");

    await context.clearCookies();
    await page.goto(link!);
    await hydrated(page);
    await page.getByLabel("New password").fill("rigging-is-fun-1");
    await page.getByLabel("Repeat it").fill("rigging-is-fun-1");
    await page.getByRole("button", { name: "Set password" }).click();
    await page.waitForURL("**/login");
    await expect.poll(() => page.getByRole("status").innerText()).toContain("Your password is set");

    await signIn(page, "sian.castell@example.com", "rigging-is-fun-1");
    expect(await mainNavLabels(page)).toEqual(["Dashboard", "Jobs", "Gear", "Components"]);

    await page.goto(link!);
    await expect.poll(() => page.getByRole("heading", { name: "This link no longer works" }).isVisible()).toBe(true);
  });
});
