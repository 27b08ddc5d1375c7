import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, openBrowser, screenshot, sendComponentWithBadMass, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser.close();
});

describe("a planner builds a component", () => {
  it("with lift points and a CoG from the composite calculator", async () => {
    const { page } = browser;
    await signIn(page, "planner@example.com");
    await page.goto("/components/new");
    await hydrated(page);
    await page.getByLabel("Name").fill("Pump casing, test");
    await page.getByLabel("Length along x (mm)").fill("1200");
    await page.getByLabel("Width along y (mm)").fill("600");
    await page.getByLabel("Height along z (mm)").fill("700");

    // Two parts: 900 kg at x = 0 and 300 kg at x = 400 mm put G at x = 100 mm (lever rule).
    await page.getByRole("button", { name: "Add a part" }).click();
    await page.getByLabel("Part 1 name").fill("Casing");
    await page.getByLabel("Part 1 mass").fill("900");
    await page.getByLabel("Part 1 z").fill("300");
    await page.getByRole("button", { name: "Add a part" }).click();
    await page.getByLabel("Part 2 name").fill("Impeller and shaft");
    await page.getByLabel("Part 2 mass").fill("300");
    await page.getByLabel("Part 2 x").fill("400");
    await page.getByLabel("Part 2 z").fill("300");
    await expect.poll(() => page.getByTestId("composite-result").innerText()).toContain("1,200 kg");
    await page.getByRole("button", { name: "Use as the component's mass and CoG" }).click();
    expect(await page.getByLabel("Mass (kg)").inputValue()).toBe("1200");
    expect(await page.getByLabel("CoG x (mm)").inputValue()).toBe("100");

    await page.getByRole("button", { name: "Add a lift point" }).click();
    await page.getByLabel("Lift point 1 x").fill("-400");
    await page.getByLabel("Lift point 1 y").fill("0");
    await page.getByLabel("Lift point 1 thread", { exact: true }).fill("M16");
    await page.getByRole("button", { name: "Add a lift point" }).click();
    await page.getByLabel("Lift point 2 x").fill("500");
    await page.getByLabel("Lift point 2 y").fill("0");
    await page.getByLabel("Lift point 2 thread", { exact: true }).fill("M16");
    await screenshot(page, "component-new");
    await page.getByRole("button", { name: "Save component" }).click();
    await page.waitForURL(/\/components\/\d+$/);
    await hydrated(page);
    const text = await page.locator("main").innerText();
    expect(text).toContain("1,200 kg");
    expect(text).toContain("Calculated from drawings");
    expect(text).toContain("100 mm, 0 mm, 300 mm");
    expect(text).toMatch(/A\s+-400 mm, 0 mm, 700 mm/);
    await screenshot(page, "component-saved");
  });

  it("a bad figure is named beside its field and nothing is saved", async () => {
    const { page } = browser;
    await page.goto("/components/new");
    await hydrated(page);
    await sendComponentWithBadMass(page, "Broken");
    expect(new URL(page.url()).pathname).toBe("/components/new");
  });
});
