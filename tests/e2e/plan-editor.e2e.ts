import type { Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { axeFindings, describeFindings } from "./axe";
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
      const konva = (
        window as unknown as {
          Konva: {
            stages: Array<{
              name(): string;
              findOne(sel: string): { getAbsolutePosition(): { x: number; y: number } } | undefined;
            }>;
          };
        }
      ).Konva;
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
    await expect
      .poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 })
      .toMatch(/Saved · version \d+/);

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

  it("figures follow a move in the next frame with nothing sent, and a run of moves is one save after the pause", async () => {
    const { page } = browser;
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    const requests: string[] = [];
    const listener = (request: { method(): string; url(): string }) => {
      const { pathname } = new URL(request.url());
      if (pathname.startsWith("/api/")) requests.push(`${request.method()} ${pathname}`);
    };
    page.on("request", listener);
    try {
      const before = await legTension(page, "A");
      const elevation = page.getByRole("application", { name: /^Elevation drawing/ });
      await elevation.focus();
      // One move (lift point A ten grid steps away from the CoG) and the leg table read back by the next frame.
      const frame = await page.evaluate(async () => {
        const table = () => document.querySelector("[data-testid=leg-table] tbody")?.textContent ?? "";
        const was = table();
        const t0 = performance.now();
        document.activeElement!.dispatchEvent(
          new KeyboardEvent("keydown", { key: "ArrowLeft", shiftKey: true, bubbles: true, cancelable: true }),
        );
        await new Promise((resolve) => requestAnimationFrame(resolve));
        return { changed: table() !== was, ms: performance.now() - t0 };
      });
      expect(frame.changed).toBe(true);
      // A run of nine more moves of one grid step, quicker than the pause: the plan is saved once.
      for (let i = 0; i < 9; i++) await page.keyboard.press("ArrowLeft", { delay: 20 });
      expect(await legTension(page, "A")).not.toBeCloseTo(before, 2);
      await expect
        .poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 })
        .toMatch(/Saved · version \d+/);
      await page.waitForTimeout(1500);
      expect(requests).toEqual(["PUT /api/plans/1"]);
      // The server worked the saved plan out to the same figures as the editor, so no note says otherwise.
      expect(await page.getByTestId("figures-differ").count()).toBe(0);
      // Ten undo steps bring the layout back, saved once more.
      for (let i = 0; i < 10; i++) await page.keyboard.press("Control+z");
      await expect.poll(() => legTension(page, "A"), { timeout: 10_000 }).toBeCloseTo(before, 2);
      await expect
        .poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 })
        .toMatch(/Saved · version \d+/);
      await page.waitForTimeout(1200);
      expect(requests).toEqual(["PUT /api/plans/1", "PUT /api/plans/1"]);
    } finally {
      page.off("request", listener);
    }
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

/** Presses Tab (Shift+Tab backwards) until the target has focus: it fails when the control cannot be reached in the tab order. */
async function tabTo(page: Page, target: Locator, { backwards = false, limit = 150 } = {}) {
  for (let i = 0; i <= limit; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press(backwards ? "Shift+Tab" : "Tab");
  }
  throw new Error(`${target} was not reached in ${limit} presses of ${backwards ? "Shift+Tab" : "Tab"}`);
}

async function isFocused(target: Locator) {
  return target.evaluate((el) => el === document.activeElement);
}

type SavedPlan = {
  version: number;
  snapshot: {
    cog: { x: number; y: number; z: number };
    liftPoints: Array<{ label: string; position: { x: number; y: number; z: number } }>;
  };
  loadOverride: { reason: string } | null;
  arrangement: { hookHeightM: number };
  rigging: { legs: Record<string, { eyeboltItemId?: number }> };
};

async function savedPlan(page: Page, planId: number) {
  return (await (await page.request.get(`/api/plans/${planId}`)).json()) as SavedPlan;
}

async function gearIdByCode(page: Page, code: string) {
  const { items } = (await (
    await page.request.get(`/api/gear?role=eyebolt&query=${encodeURIComponent(code)}`)
  ).json()) as { items: Array<{ id: number; itemCode: string }> };
  const item = items.find((i) => i.itemCode === code);
  if (!item) throw new Error(`no eyebolt ${code}`);
  return item.id;
}

/** Opens a leg's eyebolt picker from the keyboard, searches for the thread and picks the first result whose code is not `avoid`. */
async function pickEyeboltByKeyboard(page: Page, leg: string, thread: string, avoid?: string) {
  const trigger = page.getByRole("button", { name: new RegExp(`^Eyebolt for leg ${leg}:`) });
  await tabTo(page, trigger);
  await page.keyboard.press("Enter");
  const search = page.getByLabel("Search eyebolts by id, description or thread");
  await expect.poll(() => isFocused(search)).toBe(true);
  await page.keyboard.type(thread);
  const results = page.getByRole("list", { name: "Eyebolts in the register" }).getByRole("button");
  await expect.poll(() => results.first().innerText(), { timeout: 10_000 }).toContain(thread);
  await page.keyboard.press("ArrowDown");
  let code = "";
  for (let i = 0; i < 10; i++) {
    // A result's text starts with the item's code.
    const focused = await page.evaluate(() => (document.activeElement?.textContent ?? "").trim().split(/\s/)[0] ?? "");
    if (focused && focused !== "Remove" && focused !== avoid) {
      code = focused;
      break;
    }
    await page.keyboard.press("ArrowDown");
  }
  expect(code, "a result to pick has focus").not.toBe("");
  await page.keyboard.press("Enter");
  await expect.poll(() => isFocused(trigger)).toBe(true);
  expect(await trigger.innerText()).toContain(code);
  return code;
}

describe("a planner lays out a lift from the keyboard alone", () => {
  it("chooses handles, moves a lift point and the hook, overrides the CoG with a reason, undoes and redoes, picks eyebolts and saves", async () => {
    const { page, context } = browser;
    await context.clearCookies();
    await signIn(page, "planner@example.com");
    // A fresh draft of its own, so nothing here depends on what other tests did to the demo plans.
    await page.goto("/plans/new");
    await hydrated(page);
    const jobs = await page.getByLabel("Job").locator("option").allInnerTexts();
    await page.getByLabel("Job").selectOption({ label: jobs.find((o) => o.startsWith("KR-24117"))! });
    const components = await page.getByLabel("Component to lift").locator("option").allInnerTexts();
    await page
      .getByLabel("Component to lift")
      .selectOption({ label: components.find((o) => o.startsWith("C2 compression element"))! });
    await page.getByLabel("Title of the lift").fill("Keyboard layout of the C2 element");
    await page.getByRole("button", { name: "Start the plan" }).click();
    await page.waitForURL(/\/plans\/\d+$/);
    const planId = Number(new URL(page.url()).pathname.split("/")[2]);
    const before = await savedPlan(page, planId);
    const b0 = before.snapshot.liftPoints.find((p) => p.label === "B")!.position;

    await page.goto(`/plans/${planId}/edit`);
    await hydrated(page);
    await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    const elevation = page.getByRole("application", { name: /^Elevation drawing/ });
    const planView = page.getByRole("application", { name: /^Plan drawing/ });
    const handle = (name: string) =>
      page.getByRole("group", { name: "The arrow keys move" }).getByRole("radio", { name, exact: true });

    // Choose lift point B with the arrow keys in the radio group, then Tab into the elevation and move it 2 grid steps along x.
    await tabTo(page, handle("Lift point A"));
    await page.keyboard.press("ArrowRight");
    expect(await handle("Lift point B").isChecked()).toBe(true);
    await page.keyboard.press("Tab");
    expect(await isFocused(elevation)).toBe(true);
    // The focus ring is drawn over the canvas, 3 px wide, only while the drawing has keyboard focus.
    const ring = (locator: Locator) =>
      locator.locator("[data-focus-ring]").evaluate((el) => ({
        style: getComputedStyle(el).outlineStyle,
        width: parseFloat(getComputedStyle(el).outlineWidth),
      }));
    expect(await ring(elevation)).toEqual({ style: "solid", width: 3 });
    expect((await ring(planView)).style).toBe("none");
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await expect
      .poll(() => page.getByLabel("B x", { exact: true }).inputValue())
      .toBe(String(Math.round(b0.x * 1000 + 100)));
    await screenshot(page, "editor-keyboard-drawing-focus");

    // The hook: three grid steps up. The first lands on the grid line nearest one step up; each after adds one step.
    await page.keyboard.press("Shift+Tab");
    await page.keyboard.press("ArrowRight");
    expect(await handle("Hook").isChecked()).toBe(true);
    await page.keyboard.press("Tab");
    for (let i = 0; i < 3; i++) await page.keyboard.press("ArrowUp");
    const hookExpectedM = Math.round((before.arrangement.hookHeightM + 0.05) / 0.05) * 0.05 + 0.1;
    const hookInput = page.getByLabel("Hook height z (mm)");
    await expect.poll(() => hookInput.inputValue()).toBe(String(Math.round(hookExpectedM * 1000)));

    // Undo takes the last step back, redo puts it again: Ctrl+Z in the drawing, then the Redo button reached with Shift+Tab.
    await page.keyboard.press("Control+z");
    await expect.poll(() => hookInput.inputValue()).toBe(String(Math.round((hookExpectedM - 0.05) * 1000)));
    await tabTo(page, page.getByRole("button", { name: "Redo" }), { backwards: true });
    await page.keyboard.press("Enter");
    await expect.poll(() => hookInput.inputValue()).toBe(String(Math.round(hookExpectedM * 1000)));

    // The CoG is the component's: the arrow keys do not offer it. It moves only by an override with a reason.
    expect(await handle("CoG").count()).toBe(0);
    await page.getByRole("button", { name: "Override the mass or CoG" }).click();
    const cogExpectedX = before.snapshot.cog.x + 0.05;
    await page.getByLabel("Planned CoG x (mm)").fill(String(Math.round(cogExpectedX * 1000)));
    await page.getByRole("button", { name: "Apply the override" }).click();
    await expect
      .poll(() => page.getByTestId("load-override-form").innerText())
      .toContain("Give the reason for overriding the component's mass or CoG.");
    await page.getByLabel("Reason for the override").fill("Coupling half removed before the lift");
    await page.getByRole("button", { name: "Apply the override" }).click();
    await expect.poll(() => page.getByTestId("load-override").innerText()).toContain("CoG differs from the component");
    await expect.poll(() => page.getByLabel("CoG x (mm)").inputValue()).toBe(String(Math.round(cogExpectedX * 1000)));

    // Eyebolts for both legs from the pickers; Escape closes a picker and gives focus back to its button.
    const codeA = await pickEyeboltByKeyboard(page, "A", "M20");
    const triggerB = page.getByRole("button", { name: /^Eyebolt for leg B:/ });
    await tabTo(page, triggerB);
    await page.keyboard.press("Enter");
    await expect.poll(() => isFocused(page.getByLabel("Search eyebolts by id, description or thread"))).toBe(true);
    const withPicker = await axeFindings(page);
    expect(describeFindings("the editor with a gear picker open", withPicker)).toBe("");
    await page.keyboard.press("Escape");
    await expect.poll(() => isFocused(triggerB)).toBe(true);
    expect(await triggerB.getAttribute("aria-expanded")).toBe("false");
    await page.keyboard.press("Shift+Tab");
    const codeB = await pickEyeboltByKeyboard(page, "B", "M20", codeA);

    // Ctrl+S saves, sending at once whatever the autosave is still holding.
    await page.keyboard.press("Control+s");
    await expect
      .poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 })
      .toMatch(/Saved · version \d+/);

    const after = await savedPlan(page, planId);
    expect(after.version).toBeGreaterThan(before.version);
    const b1 = after.snapshot.liftPoints.find((p) => p.label === "B")!.position;
    expect(b1.x).toBeCloseTo(b0.x + 0.1, 6);
    expect(b1.z).toBeCloseTo(b0.z, 9);
    expect(after.snapshot.liftPoints.find((p) => p.label === "A")!.position).toEqual(
      before.snapshot.liftPoints.find((p) => p.label === "A")!.position,
    );
    expect(after.arrangement.hookHeightM).toBeCloseTo(hookExpectedM, 6);
    expect(after.snapshot.cog.x).toBeCloseTo(cogExpectedX, 6);
    expect(after.loadOverride?.reason).toBe("Coupling half removed before the lift");
    expect(after.rigging.legs.A?.eyeboltItemId).toBe(await gearIdByCode(page, codeA));
    expect(after.rigging.legs.B?.eyeboltItemId).toBe(await gearIdByCode(page, codeB));

    // And the editor opens on what was saved.
    await page.reload();
    await hydrated(page);
    await expect
      .poll(() => page.getByLabel("B x", { exact: true }).inputValue())
      .toBe(String(Math.round(b0.x * 1000 + 100)));
    expect(await page.getByRole("button", { name: /^Eyebolt for leg A:/ }).innerText()).toContain(codeA);
  });

  it("on slings of given lengths the elevation hangs the load as it tilts and says which leg to shorten", async () => {
    const { page } = browser;
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    await page.getByLabel("Given sling lengths: find the tilt").check();
    const a = page.getByLabel("Sling length to A", { exact: true });
    await a.waitFor();
    await a.fill(String(Number((await a.inputValue()).replace(/,/g, "")) + 50));
    await a.press("Tab");
    // A sling 50 mm longer tilts the load: the core's levelling names the legs to shorten.
    await expect
      .poll(() => page.getByTestId("levelling").innerText(), { timeout: 10_000 })
      .toMatch(/shorten leg \w by \d/);
    const tilted = await page.evaluate(() => {
      const konva = (
        window as unknown as { Konva: { stages: Array<{ name(): string; findOne(sel: string): unknown }> } }
      ).Konva;
      return konva.stages.find((s) => s.name() === "view-elevation")?.findOne(".hang-tilt") !== undefined;
    });
    expect(tilted).toBe(true);
    await screenshot(page, "editor-given-lengths-tilted");
    // Back to a level lift, saved, for the tests that follow.
    await page.getByLabel("Level lift: the hook height gives the leg lengths").check();
    await expect
      .poll(() => page.getByTestId("save-status").innerText(), { timeout: 10_000 })
      .toMatch(/Saved · version \d+/);
  });
});
