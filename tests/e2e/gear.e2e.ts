import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
  await signIn(browser.page, "admin@example.com");
});
afterAll(async () => {
  await browser.close();
});

describe("the gear register", () => {
  it("an admin sees the demo register with overdue and due-soon items marked in words", async () => {
    const { page } = browser;
    await page.goto("/gear");
    await hydrated(page);
    await expect.poll(() => page.getByRole("heading", { name: "Gear register" }).isVisible()).toBe(true);
    const table = page.getByRole("table");
    await expect.poll(() => table.getByText("OVERDUE").count()).toBeGreaterThan(0);
    await expect.poll(() => table.getByText("Due within 30 days").count()).toBeGreaterThan(0);
    expect(await table.getByText("Quarantined").count()).toBeGreaterThan(0);
    await screenshot(page, "gear-register");
    await page
      .getByRole("link", { name: /OVERDUE/ })
      .first()
      .click();
    await page.waitForURL(/due=overdue/);
    await expect.poll(() => page.getByText("KR-SH-D200").isVisible()).toBe(true);
  });

  it("an admin adds an item and records a thorough examination with the LOLER default due date", async () => {
    const { page } = browser;
    await page.goto("/gear/new");
    await hydrated(page);
    await page.getByLabel("Item id").fill("E2E-SH-01");
    await page.getByLabel("Kind").selectOption("shackle");
    await page.getByLabel("Shackle shape").selectOption("bow");
    await page.getByLabel("Pin").selectOption("bolt");
    await page.getByLabel("WLL", { exact: true }).fill("4.75");
    await screenshot(page, "gear-new");
    await page.getByRole("button", { name: "Add to the register" }).click();
    await page.waitForURL(/\/gear\/\d+$/);
    await hydrated(page);
    await expect.poll(() => page.getByRole("heading", { name: "E2E-SH-01" }).isVisible()).toBe(true);
    await page.getByLabel("Examiner (competent person)").fill("Ivan Petrakis");
    const nextDue = await page.getByLabel("Next examination due").inputValue();
    expect(nextDue).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    await page
      .getByLabel("Certificate (PDF, up to 10 MB)")
      .setInputFiles({ name: "cert.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-1.4\n%%EOF\n") });
    await page.getByRole("button", { name: "Record examination" }).click();
    await expect
      .poll(() => page.getByRole("status").first().innerText())
      .toContain(`Next thorough examination due ${nextDue}`);
    await expect.poll(() => page.getByRole("link", { name: "cert.pdf" }).isVisible()).toBe(true);
    await screenshot(page, "gear-item");
  });

  it("an admin imports a CSV with one bad row, sees its line named, and imports only the valid rows", async () => {
    const { page } = browser;
    await page.goto("/gear/import");
    await hydrated(page);
    const csv = [
      "item_code,kind,wll,wll_unit,shackle_type,pin_type",
      "E2E-IMP-1,shackle,1,t,bow,screw",
      "E2E-IMP-2,shackle,-5,t,bow,screw",
      "E2E-IMP-3,shackle,2,t,dee,screw",
    ].join("\n");
    await page
      .getByLabel(/CSV file/)
      .setInputFiles({ name: "new-gear.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await page.getByRole("button", { name: "Check the file" }).click();
    const problems = page.getByRole("alert").filter({ hasText: "have problems" });
    await expect.poll(() => problems.innerText()).toContain("Line 3");
    expect(await problems.innerText()).toContain("The WLL must be more than zero.");
    await screenshot(page, "gear-import-preview");
    await page.getByRole("button", { name: "Import only the 2 valid rows" }).click();
    await expect
      .poll(() => page.getByText("2 created, 0 updated, 0 unchanged; 1 row(s) with problems skipped.").isVisible())
      .toBe(true);
    await page.goto("/gear?q=E2E-IMP");
    await expect
      .poll(() =>
        page
          .getByRole("table")
          .getByRole("link", { name: /E2E-IMP/ })
          .count(),
      )
      .toBe(2);
  });

  it("a rigger on a phone reads the register and an item without the page overflowing", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      await signIn(phone.page, "rigger@example.com");
      for (const path of ["/gear", "/gear?due=due_soon"]) {
        await phone.page.goto(path);
        await hydrated(phone.page);
        const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
        expect(overflow, path).toBeLessThanOrEqual(0);
      }
      await phone.page.goto("/gear");
      await hydrated(phone.page);
      await screenshot(phone.page, "gear-register-phone");
      await phone.page.getByRole("link", { name: "KR-WS-3T-3M" }).click();
      await phone.page.waitForURL(/\/gear\/\d+$/);
      await hydrated(phone.page);
      await expect.poll(() => phone.page.getByText("QUARANTINED: do not use this item.").isVisible()).toBe(true);
      expect(await phone.page.getByRole("button", { name: "Record examination" }).count()).toBe(0);
      expect(await phone.page.getByRole("button", { name: "Report defect" }).count()).toBe(1);
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(phone.page, "gear-item-phone");
    } finally {
      await phone.close();
    }
  });

  it("requests nothing from outside the machine", () => {
    expect(browser.externalRequests).toEqual([]);
  });
});
