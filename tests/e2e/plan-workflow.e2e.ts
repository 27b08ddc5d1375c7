import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD, hydrated, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let desk: BrowserSession;
beforeAll(async () => {
  desk = await openBrowser({ width: 1280, height: 900 });
});
afterAll(async () => {
  await desk.close();
});

async function planIdByTitle(start: string) {
  const { page } = desk;
  const res = await page.request.get("/api/plans");
  const { plans } = (await res.json()) as {
    plans: Array<{ id: number; title: string; status: string; revision: number }>;
  };
  const plan = plans.find((p) => p.title.startsWith(start));
  if (!plan) throw new Error(`no plan ${start}`);
  return plan;
}

describe("planner -> appointed person -> rigger on the demo scenario", () => {
  let planId = 0;
  let revision = 0;

  it("the planner starts a new revision of the approved gearbox plan and submits it, acknowledging each warning", async () => {
    const { page, context } = desk;
    await context.clearCookies();
    await signIn(page, "planner@example.com");
    const plan = await planIdByTitle("Lift the B1 gearbox off");
    planId = plan.id;
    await page.goto(`/plans/${planId}`);
    await hydrated(page);
    await page.getByRole("button", { name: "Start a new revision" }).click();
    await page.waitForURL(`**/plans/${planId}/edit`);
    await page.goto(`/plans/${planId}/submit`);
    await hydrated(page);
    const boxes = page.locator("textarea[name^='ack-']");
    const count = await boxes.count();
    for (let i = 0; i < count; i++) await boxes.nth(i).fill("Examination booked and in date on the day of the lift.");
    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.waitForURL(`**/plans/${planId}`);
    await expect.poll(() => page.getByRole("status").first().innerText()).toContain("Submitted for review");
    revision = (await planIdByTitle("Lift the B1 gearbox off")).revision;
    expect((await planIdByTitle("Lift the B1 gearbox off")).status).toBe("in_review");
  });

  it("the appointed person finds it waiting, is refused on a wrong password, then approves with password and name", async () => {
    const { page, context } = desk;
    await context.clearCookies();
    await signIn(page, "approver@example.com");
    await expect.poll(() => page.locator("main").innerText()).toContain(`revision ${revision} · In review`);
    await page.goto(`/plans/${planId}/review`);
    await hydrated(page);
    await page.getByLabel("Your password, entered again").fill("not-my-password");
    await page.getByLabel(/Type your name/).fill("Priya Okonedo");
    await page.getByRole("button", { name: "Approve this revision" }).click();
    await expect.poll(() => page.locator("main").innerText()).toContain("That is not your password");
    await page.getByLabel("Your password, entered again").fill(DEMO_PASSWORD);
    await page.getByLabel(/Type your name/).fill("Priya Okonedo");
    await screenshot(page, "review-approve");
    await page.getByRole("button", { name: "Approve this revision" }).click();
    await page.waitForURL(`**/plans/${planId}`);
    await expect
      .poll(() => page.getByTestId("approval").innerText())
      .toContain("approved by Priya Okonedo (appointed person)");
    await page.getByLabel(/Rigger for the lift/).selectOption({ label: "Dale Hutton" });
    await page.getByRole("button", { name: "Assign and tell them" }).click();
    await expect.poll(() => page.getByRole("status").first().innerText()).toContain("rigger is assigned");
    await screenshot(page, "plan-approved");
  });

  it("the rigger, on a phone, ticks the pre-lift checks and records the lift, which completes the plan", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      const { page } = phone;
      await signIn(page, "rigger@example.com");
      await expect.poll(() => page.locator("main").innerText()).toContain("Lift the B1 gearbox off");
      await page.goto(`/plans/${planId}/lift`);
      await hydrated(page);
      await expect.poll(() => page.getByTestId("schedule").innerText()).toMatch(/KR-/);
      await page.getByRole("button", { name: "Record the lift as done" }).click();
      await expect.poll(() => page.getByRole("alert").first().innerText()).toContain("Tick every pre-lift check");
      for (const box of await page.locator("input[type=checkbox][name^='check-']").all()) await box.check();
      for (const box of await page.locator("input[name^='gear-']").all()) await box.check();
      // Each hold point is released by the lift supervisor (filled in) at a time the rigger gives.
      const past = new Date(Date.now() - 30 * 60_000);
      const local = `${past.getFullYear()}-${String(past.getMonth() + 1).padStart(2, "0")}-${String(past.getDate()).padStart(2, "0")}T${String(past.getHours()).padStart(2, "0")}:${String(past.getMinutes()).padStart(2, "0")}`;
      for (const field of await page.locator("input[name^='hold-'][name$='-at']").all()) await field.fill(local);
      await page.getByLabel("Notes").fill("Gearbox landed on the skid and chocked.");
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(page, "rigger-at-the-lift");
      await page.getByRole("button", { name: "Record the lift as done" }).click();
      await page.waitForURL(`**/plans/${planId}`);
      await expect.poll(() => page.getByTestId("workflow").innerText()).toContain("Completed");
      await expect.poll(() => page.getByTestId("lift-record").innerText()).toContain("Lift recorded by Dale Hutton");
    } finally {
      await phone.close();
    }
  });

  it("every step is in the plan's history and the mails are in the catcher", async () => {
    const { page, context } = desk;
    await context.clearCookies();
    await signIn(page, "admin@example.com");
    await page.goto(`/plans/${planId}/history`);
    const history = await page.getByTestId("history").innerText();
    for (const step of [
      "new revision started",
      "warning acknowledged",
      "submitted for review",
      "approved",
      "rigger assigned",
      "lift recorded",
    ])
      expect(history).toContain(step);
    await page.goto("/admin/outbox");
    const outbox = await page.locator("main").innerText();
    expect(outbox).toContain(`Lift plan to review: Lift the B1 gearbox off`);
    expect(outbox).toContain(`Lift plan approved: Lift the B1 gearbox off`);
    expect(outbox).toContain(`Lift assigned to you: Lift the B1 gearbox off`);
  });
});
