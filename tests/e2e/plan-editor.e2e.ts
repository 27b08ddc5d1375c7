import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser({ width: 1440, height: 1000 });
});
afterAll(async () => {
  await browser.close();
});

/** The screen position of a lift point's marker in one of the editor's Konva views. */
async function liftPointOnScreen(page: Page, view: "elevation" | "plan", label: string) {
  const local = await page.evaluate(
    ([v, l]) => {
      const konva = (window as unknown as { Konva: { stages: Array<{ name(): string; findOne(sel: string): { getAbsolutePosition(): { x: number; y: number } } | undefined }> } }).Konva;
      const stage = konva.stages.find((s) => s.name() === `view-${v}`);
      return stage?.findOne(`.lift-point-${l}`)?.getAbsolutePosition() ?? null;
    },
    [view, label] as const,
  );
  if (!local) throw new Error(`no lift point ${label} in the ${view} view`);
  const box = await page.locator(`[data-testid=view-${view}] canvas`).first().boundingBox();
  return { x: box!.x + local.x, y: box!.y + local.y };
}

async function legTension(page: Page, label: string) {
  const text = await page.getByTestId("leg-table").evaluate((table, l) => {
    const row = [...table.querySelectorAll("tbody tr")].find((tr) => tr.querySelector("td")?.textContent?.trim() === l);
    return row?.textContent ?? "";
  }, label);
  return Number(/([\d.]+) kN/.exec(text)?.[1]);
}

describe("a planner lays out a lift in the editor", () => {
  it("drags a lift point and sees the leg tension change, then undoes it", async () => {
    const { page } = browser;
    await signIn(page, "planner@example.com");
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    const before = await legTension(page, "A");
    expect(before).toBeGreaterThan(0);
    await screenshot(page, "editor-desktop");

    const start = await liftPointOnScreen(page, "elevation", "A");
    await page.mouse.move(start.x, start.y);
    await page.mouse.down();
    await page.mouse.move(start.x + 40, start.y, { steps: 8 });
    await page.mouse.move(start.x + 90, start.y, { steps: 8 });
    await page.mouse.up();
    // Moving A towards the CoG gives it a larger share of the weight.
    await expect.poll(() => legTension(page, "A"), { timeout: 10_000 }).toBeGreaterThan(before + 0.05);
    await expect.poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 }).toMatch(/Saved · version \d+/);

    await page.keyboard.press("Control+z");
    await expect.poll(() => legTension(page, "A"), { timeout: 10_000 }).toBeCloseTo(before, 2);
  });

  it("the saved layout survives a reload", async () => {
    const { page } = browser;
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    const version = await page.getByTestId("save-status").innerText();
    expect(version).toMatch(/Version \d+/);
  });

  it("fits a tablet width", async () => {
    const tablet = await openBrowser({ width: 820, height: 1180 });
    try {
      await signIn(tablet.page, "planner@example.com");
      await tablet.page.goto("/plans/3/edit");
      await hydrated(tablet.page);
      await tablet.page.locator("[data-testid=view-plan] canvas").first().waitFor();
      await expect.poll(() => tablet.page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
      const overflow = await tablet.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(tablet.page, "editor-tablet");
    } finally {
      await tablet.close();
    }
  });
});
