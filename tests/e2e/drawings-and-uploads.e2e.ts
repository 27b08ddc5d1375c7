// A planner traces a lift point over the component's drawing, and an admin's oversized certificate is
// refused in the browser before a byte is sent.
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

/** Screen position of a pixel of the drawing put behind the elevation view, through the image node's own transform. */
async function drawingPixelOnScreen(page: Page, pixel: { x: number; y: number }) {
  const local = await page.evaluate((p) => {
    type Node = { getAbsoluteTransform(): { point(p: { x: number; y: number }): { x: number; y: number } } };
    const konva = (
      window as unknown as { Konva: { stages: Array<{ name(): string; findOne(s: string): Node | undefined }> } }
    ).Konva;
    const stage = konva.stages.find((s) => s.name() === "view-elevation");
    return stage?.findOne(".backdrop")?.getAbsoluteTransform().point(p) ?? null;
  }, pixel);
  if (!local) throw new Error("no drawing behind the elevation view");
  const canvas = page.locator("[data-testid=view-elevation] canvas").first();
  await canvas.scrollIntoViewIfNeeded();
  const box = await canvas.boundingBox();
  return { x: box!.x + local.x, y: box!.y + local.y };
}

async function liftPointOnScreen(page: Page, label: string) {
  const local = await page.evaluate((l) => {
    type Node = { getAbsolutePosition(): { x: number; y: number } };
    const konva = (
      window as unknown as { Konva: { stages: Array<{ name(): string; findOne(s: string): Node | undefined }> } }
    ).Konva;
    return (
      konva.stages
        .find((s) => s.name() === "view-elevation")
        ?.findOne(`.lift-point-${l}`)
        ?.getAbsolutePosition() ?? null
    );
  }, label);
  if (!local) throw new Error(`no lift point ${label}`);
  const canvas = page.locator("[data-testid=view-elevation] canvas").first();
  await canvas.scrollIntoViewIfNeeded();
  const box = await canvas.boundingBox();
  return { x: box!.x + local.x, y: box!.y + local.y };
}

type SavedPlan = {
  version: number;
  snapshot: { liftPoints: Array<{ label: string; position: { x: number; z: number } }> };
};

async function savedPlan(page: Page) {
  return (await (await page.request.get("/api/plans/1")).json()) as SavedPlan;
}

// The demo drawing GA-2210 (db/seeders/demo-drawing.ts) is drawn at 0.6 px/mm with the element's left end at
// x = 160 px; its "1000" dimension runs between the two eyebolts, 1,000 mm apart (pixels 280 and 880).
const PX_PER_MM = 0.6;
const DIMENSION_Y = 760 - 860 * PX_PER_MM - 110;

describe("a planner traces over the component's drawing", () => {
  it("puts the drawing behind the elevation, sets its scale with two clicks and a distance, and places a lift point on it", async () => {
    const { page } = browser;
    await signIn(page, "planner@example.com");
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
    await page.getByRole("button", { name: "Put GA-2210 elevation behind" }).click();
    await expect.poll(() => page.getByText("Set its scale").isVisible(), { timeout: 10_000 }).toBe(true);

    for (const x of [280, 880]) {
      const at = await drawingPixelOnScreen(page, { x, y: DIMENSION_Y });
      await page.mouse.click(at.x, at.y);
    }
    await page.getByLabel(/Distance between them/).fill("1000");
    await expect.poll(() => page.getByText("Set its scale").innerText()).toContain("2 of 2 clicked");
    await page.getByRole("button", { name: "Set the scale" }).click();

    // Now 600 drawing pixels (1,000 mm on the sheet) span exactly as far on screen as 1 m of the model does.
    const left = await drawingPixelOnScreen(page, { x: 280, y: DIMENSION_Y });
    const right = await drawingPixelOnScreen(page, { x: 880, y: DIMENSION_Y });
    const a = await liftPointOnScreen(page, "A");
    const b = await liftPointOnScreen(page, "B");
    // Other tests may have moved the demo's lift points: take their distance apart from the saved plan.
    const saved = (await savedPlan(page)).snapshot.liftPoints;
    const apartM = Math.abs(
      saved.find((p) => p.label === "B")!.position.x - saved.find((p) => p.label === "A")!.position.x,
    );
    const metreOnScreen = Math.abs(b.x - a.x) / apartM;
    expect(Math.abs(right.x - left.x)).toBeCloseTo(metreOnScreen, 0);
    await screenshot(page, "editor-tracing");

    // Drag lift point B onto the drawing's eyebolt B, with snapping off so it lands where the drawing says.
    const before = await savedPlan(page);
    await page.getByLabel(/Snap to grid/).uncheck();
    const eyeboltB = await drawingPixelOnScreen(page, { x: 880, y: 760 - 860 * PX_PER_MM });
    await page.mouse.move(b.x, b.y);
    await page.mouse.down();
    await page.mouse.move((b.x + eyeboltB.x) / 2, (b.y + eyeboltB.y) / 2, { steps: 6 });
    await page.mouse.move(eyeboltB.x, eyeboltB.y, { steps: 6 });
    await page.mouse.up();
    await expect.poll(async () => (await savedPlan(page)).version, { timeout: 15_000 }).toBeGreaterThan(before.version);
    const placed = (await savedPlan(page)).snapshot.liftPoints.find((p) => p.label === "B")!;
    const onScreen = await liftPointOnScreen(page, "B");
    expect(Math.abs(onScreen.x - eyeboltB.x)).toBeLessThan(2);
    expect(Math.abs(onScreen.y - eyeboltB.y)).toBeLessThan(2);
    const moved = before.snapshot.liftPoints.find((p) => p.label === "B")!;
    expect(placed.position.x).not.toBeCloseTo(moved.position.x, 3);

    // Put the demo back as it was for the tests after this one.
    await page.keyboard.press("Control+z");
    await expect
      .poll(async () => (await savedPlan(page)).snapshot.liftPoints.find((p) => p.label === "B")!.position.x, {
        timeout: 15_000,
      })
      .toBeCloseTo(moved.position.x, 6);
  });
});

describe("an admin records an examination", () => {
  it("is told at once that an 11 MB certificate is over the 10 MB limit, and nothing is sent", async () => {
    const { page } = browser;
    await browser.context.clearCookies();
    await signIn(page, "admin@example.com");
    await page.goto("/gear");
    await hydrated(page);
    await page.getByRole("link", { name: "KR-SH-325-01" }).first().click();
    await hydrated(page);
    const posts: string[] = [];
    page.on("request", (r) => {
      if (r.method() === "POST") posts.push(r.url());
    });
    const certificate = page.getByLabel("Certificate (PDF, up to 10 MB)");
    await certificate.setInputFiles({
      name: "big-certificate.pdf",
      mimeType: "application/pdf",
      buffer: Buffer.alloc(11 * 1024 * 1024, 0x25),
    });
    expect(await certificate.evaluate((el) => (el as HTMLInputElement).validationMessage)).toContain(
      "big-certificate.pdf is 11.0 MB: the limit is 10 MB",
    );
    await page.getByLabel("Examiner (competent person)").fill("Ruth Calloway");
    await page.getByRole("button", { name: "Record examination" }).click();
    await page.waitForTimeout(500);
    expect(posts).toEqual([]);
  });
});
