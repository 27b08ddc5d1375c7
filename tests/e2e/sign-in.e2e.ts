import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, mainNavLabels, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser.close();
});

describe("signing in to the demo", () => {
  it("an anonymous visitor to / is sent to sign in", async () => {
    const { page } = browser;
    await page.goto("/");
    expect(new URL(page.url()).pathname).toBe("/login");
    await expect.poll(() => page.getByRole("heading", { name: "Sign in" }).isVisible()).toBe(true);
    await screenshot(page, "sign-in");
  });

  it("a wrong password gets a clear message and stays on the form", async () => {
    const { page } = browser;
    await page.goto("/login");
    await hydrated(page);
    await page.getByLabel("E-mail").fill("planner@example.com");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect.poll(() => page.getByRole("alert").innerText()).toContain("do not match an active account");
    expect(new URL(page.url()).pathname).toBe("/login");
  });

  const navByUser: Array<[string, string[]]> = [
    ["admin@example.com", ["Dashboard", "Jobs", "Gear", "Components", "Sites", "Admin"]],
    ["planner@example.com", ["Dashboard", "Jobs", "Gear", "Components", "Sites"]],
    ["approver@example.com", ["Dashboard", "Jobs", "Gear", "Components"]],
    ["rigger@example.com", ["Dashboard", "Jobs", "Gear", "Components"]],
  ];
  for (const [email, expected] of navByUser) {
    it(`${email} signs in and sees their role's navigation`, async () => {
      const { page, context } = browser;
      await context.clearCookies();
      await signIn(page, email);
      expect(await mainNavLabels(page)).toEqual(expected);
      await screenshot(page, `dashboard-${email.split("@")[0]}`);
    });
  }

  it("a rigger at /admin gets a 403 page naming the role needed", async () => {
    const { page, context } = browser;
    await context.clearCookies();
    await signIn(page, "rigger@example.com");
    const response = await page.goto("/admin");
    expect(response?.status()).toBe(403);
    await expect.poll(() => page.getByRole("alert").innerText()).toContain("needs the Admin role");
    await screenshot(page, "rigger-admin-403");
  });

  it("works at phone width for the rigger", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      await signIn(phone.page, "rigger@example.com");
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(phone.page, "rigger-phone-dashboard");
    } finally {
      await phone.close();
    }
  });

  it("requests nothing from outside the machine", () => {
    expect(browser.externalRequests).toEqual([]);
  });
});
