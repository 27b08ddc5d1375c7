// The approved plan is a sealed record with the gear's state beside it. The test builds its own approved
// plan (the demo gearbox's layout, but its own master link, so no other file's plan is touched), has it
// approved on the review page, then quarantines the master link in the register and finds the plan NOT
// FIT TO LIFT on the verify page, the rigger's lift page and the printed PDF, with the three mails caught. A
// second plan on the same link, left in review, shows the appointed person why it cannot be approved, with no
// password asked for, and is returned so the demo's plans in review stay as they were.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD, hydrated, openBrowser, screenshot, signIn, type BrowserSession } from "./browser";

let desk: BrowserSession;
beforeAll(async () => {
  desk = await openBrowser({ width: 1280, height: 900 });
});
afterAll(async () => {
  await desk.close();
});

/** Waits on the page as long as a loaded, shared machine may need (expect.poll gives up after one second). */
const poll = <T>(read: () => Promise<T>) => expect.poll(read, { timeout: 20_000 });

const LINK_CODE = `SEAL-ML-${Date.now().toString(36).toUpperCase()}`;
const TITLE = `Sealed record check: B1 gearbox on its own master link ${LINK_CODE}`;

type PlanDoc = {
  id: number;
  version: number;
  title: string;
  job: { id: number };
  componentId: number;
  arrangement: unknown;
  rigging: { masterLinkItemId?: number; hookTakesLegs?: boolean } & Record<string, unknown>;
  details: unknown;
};

async function as(email: string) {
  await desk.context.clearCookies();
  await signIn(desk.page, email);
}

/** The PDF's text in reading order (pdftotext from poppler-utils): a wrapped line's pieces stay together. */
async function pdfText(url: string): Promise<string> {
  const res = await desk.page.request.get(url);
  expect(res.status()).toBe(200);
  expect(res.headers()["content-type"]).toContain("application/pdf");
  const file = path.join(os.tmpdir(), `plumbline-sealed-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, await res.body());
  try {
    const out = spawnSync("pdftotext", [file, "-"], { encoding: "utf8" });
    expect(out.status).toBe(0);
    return out.stdout;
  } finally {
    fs.rmSync(file, { force: true });
  }
}

/** The planner's new plan from the model's job and component, saved with the model's layout on `linkId`, and submitted. */
async function layOutAndSubmit(model: PlanDoc, title: string, linkId: number): Promise<number> {
  const { page, baseUrl } = desk;
  await page.goto("/plans/new");
  await hydrated(page);
  await page.getByLabel("Job").selectOption(String(model.job.id));
  await page.getByLabel("Component to lift").selectOption(String(model.componentId));
  await page.getByLabel("Title of the lift").fill(title);
  await page.getByRole("button", { name: "Start the plan" }).click();
  await page.waitForURL(/\/plans\/\d+$/);
  const id = Number(new URL(page.url()).pathname.split("/").pop());

  // The editor's own save: the gearbox's arrangement, rigging and details, with this test's master link on top.
  const fresh = (await (await page.request.get(`/api/plans/${id}`)).json()) as PlanDoc;
  const rigging = { ...model.rigging, masterLinkItemId: linkId };
  delete rigging.hookTakesLegs;
  const saved = await page.request.put(`/api/plans/${id}`, {
    headers: { Origin: new URL(baseUrl).origin, "Content-Type": "application/json" },
    data: {
      version: fresh.version,
      title,
      arrangement: model.arrangement,
      rigging,
      details: model.details,
    },
  });
  expect(saved.status(), await saved.text()).toBe(200);

  await page.goto(`/plans/${id}/submit`);
  await hydrated(page);
  const boxes = page.locator("textarea[name^='ack-']");
  const count = await boxes.count();
  for (let i = 0; i < count; i++) await boxes.nth(i).fill("Examination booked and in date on the day of the lift.");
  await page.getByRole("button", { name: "Submit for review" }).click();
  await page.waitForURL(`**/plans/${id}`);
  await poll(() => page.getByRole("status").first().innerText()).toContain("Submitted for review");
  return id;
}

describe(
  "an approved plan whose allocated item is quarantined is not fit to lift wherever it is seen",
  { timeout: 120_000 },
  () => {
    let itemId = 0;
    let planId = 0;
    let waitingId = 0;

    it("the admin registers a master link and records its thorough examination", async () => {
      const { page } = desk;
      await as("admin@example.com");
      await page.goto("/gear/new");
      await hydrated(page);
      await page.getByLabel("Item id").fill(LINK_CODE);
      await page.getByLabel("Kind").selectOption({ label: "Master link" });
      await page.getByLabel("WLL", { exact: true }).fill("10");
      await page.getByLabel("Unit").selectOption("t");
      await page.getByRole("button", { name: "Add to the register" }).click();
      await page.waitForURL(/\/gear\/\d+$/);
      itemId = Number(new URL(page.url()).pathname.split("/").pop());
      await hydrated(page);
      await page.getByLabel("Examiner (competent person)").fill("I. Examiner");
      await page.getByRole("button", { name: "Record examination" }).click();
      await poll(() => page.getByRole("status").allInnerTexts()).toContainEqual(
        expect.stringContaining("Examination recorded: pass"),
      );
    });

    it("the planner lays the lift out like the demo gearbox on that master link and submits it", async () => {
      const { page } = desk;
      await as("planner@example.com");
      const { plans: list } = (await (await page.request.get("/api/plans")).json()) as {
        plans: Array<{ id: number; title: string }>;
      };
      const gearbox = list.find((p) => p.title.startsWith("Lift the B1 gearbox off"))!;
      const model = (await (await page.request.get(`/api/plans/${gearbox.id}`)).json()) as PlanDoc;

      planId = await layOutAndSubmit(model, TITLE, itemId);
      // A second lift on the same master link, left in review for the appointed person to find after the quarantine.
      waitingId = await layOutAndSubmit(model, `${TITLE} (second lift)`, itemId);
    });

    it("the appointed person sees the whole plan on the review page, signs, and assigns the rigger", async () => {
      const { page } = desk;
      await as("approver@example.com");
      await page.goto(`/plans/${planId}/review`);
      await hydrated(page);
      const main = page.locator("main");
      // The drawing to scale, both views, drawn in the browser.
      await poll(() => page.getByTestId("plan-drawing").locator("canvas").count()).toBeGreaterThanOrEqual(2);
      // Each view's canvas fits the frame that shows it (a canvas laid out for a wider column is cut off, hook and
      // all, at this desk width).
      const spill = await page
        .getByTestId("plan-drawing")
        .locator("figure")
        .evaluateAll((figures) =>
          figures.map((f) => (f.querySelector("canvas")?.getBoundingClientRect().width ?? Infinity) - f.clientWidth),
        );
      expect(spill).toHaveLength(2);
      for (const px of spill) expect(px).toBeLessThanOrEqual(0);
      const gear = await page.getByTestId("review-gear").innerText();
      expect(gear).toContain(LINK_CODE);
      expect(gear).not.toContain("not fit to lift");
      for (const heading of ["The figures", "Checks", "Sequence and hold points", "Hazards and controls", "People"])
        expect(await main.innerText()).toContain(heading);
      expect(await page.getByTestId("approval-refusals").count()).toBe(0);
      await screenshot(page, "review-whole-plan");
      await page.getByLabel("Your password, entered again").fill(DEMO_PASSWORD);
      await page.getByLabel(/Type your name/).fill("Priya Okonedo");
      await page.getByRole("button", { name: "Approve this revision" }).click();
      await page.waitForURL(`**/plans/${planId}`);
      await hydrated(page);
      await poll(() => page.getByTestId("approval").innerText()).toContain("approved by Priya Okonedo");
      await page.getByLabel(/Rigger for the lift/).selectOption({ label: "Dale Hutton" });
      await page.getByRole("button", { name: "Assign and tell them" }).click();
      await poll(() => page.getByRole("status").allInnerTexts()).toContainEqual(
        expect.stringContaining("rigger is assigned"),
      );
    });

    it("the admin quarantines the master link in the register", async () => {
      const { page } = desk;
      await as("admin@example.com");
      await page.goto(`/gear/${itemId}`);
      await hydrated(page);
      await page.getByLabel("New status").selectOption("quarantined");
      await page.getByRole("textbox", { name: "Reason" }).fill("Gouge on the link found at pre-use check");
      await page.getByRole("button", { name: "Change status" }).click();
      await poll(() => page.getByRole("status").allInnerTexts()).toContainEqual(
        expect.stringContaining(`${LINK_CODE} is now quarantined`),
      );
    });

    it("the printed plan says NOT FIT TO LIFT naming the item, and its QR target says so too", async () => {
      const { page } = desk;
      const text = await pdfText(`/plans/${planId}/print.pdf`);
      const flat = text.replace(/\s+/g, " ");
      expect(flat).toContain("NOT FIT TO LIFT");
      expect(flat).toContain(LINK_CODE);
      // The QR code's address is printed beside it, wrapped to its column: the token is 24 characters after /verify/.
      const after = text.slice(text.indexOf("/verify/") + "/verify/".length);
      const token = (after.match(/[A-Za-z0-9_-]/g) ?? []).slice(0, 24).join("");
      expect(token).toHaveLength(24);

      // Whoever scans it, signed in or not.
      await desk.context.clearCookies();
      expect((await page.goto(`/verify/${token}`))?.status()).toBe(200);
      const notFit = page.getByTestId("not-fit");
      await poll(() => notFit.innerText()).toContain("NOT FIT TO LIFT");
      expect(await notFit.innerText()).toContain(`${LINK_CODE} (Master link) has been quarantined since`);
      await screenshot(page, "verify-not-fit");
    });

    it("the rigger's lift page shows it at the top and offers no record of the lift", async () => {
      const phone = await openBrowser({ width: 390, height: 844 });
      try {
        const { page } = phone;
        await signIn(page, "rigger@example.com");
        await page.goto(`/plans/${planId}/lift`);
        await hydrated(page);
        const notFit = page.getByTestId("not-fit");
        await poll(() => notFit.innerText()).toContain("NOT FIT TO LIFT");
        expect(await notFit.innerText()).toContain(LINK_CODE);
        // At the top: above the gear schedule and everything else the rigger reads.
        const banner = (await notFit.boundingBox())!;
        const schedule = (await page.getByTestId("schedule").boundingBox())!;
        expect(banner.y).toBeLessThan(schedule.y);
        expect(banner.y).toBeLessThan(400);
        expect(await page.getByRole("button", { name: "Record the lift as done" }).count()).toBe(0);
        expect(await page.getByTestId("no-record").innerText()).toMatch(/^NOT FIT TO LIFT: .*quarantined/);
        await screenshot(page, "lift-page-not-fit");
      } finally {
        await phone.close();
      }
    });

    it("the planner, the appointed person and the assigned rigger are each mailed once", async () => {
      const { page } = desk;
      await as("admin@example.com");
      await page.goto("/admin/outbox");
      await hydrated(page);
      const rows = await page.locator("tbody tr").allInnerTexts();
      const notFit = rows.filter((r) => r.includes(`NOT FIT TO LIFT: ${TITLE}`));
      for (const email of ["planner@example.com", "approver@example.com", "rigger@example.com"])
        expect(
          notFit.filter((r) => r.includes(email)),
          email,
        ).toHaveLength(1);
    });

    it("the second lift on the quarantined link, still in review, tells the appointed person why before any password", async () => {
      const { page } = desk;
      await as("approver@example.com");
      await page.goto(`/plans/${waitingId}/review`);
      await hydrated(page);
      const reasons = page.getByTestId("approval-refusals");
      await poll(() => reasons.innerText()).toContain(`${LINK_CODE} (Master link) has been quarantined since`);
      expect(await page.getByLabel("Your password, entered again").count()).toBe(0);
      expect(await page.getByRole("button", { name: "Approve this revision" }).count()).toBe(0);
      expect(await page.getByTestId("review-gear").innerText()).toContain("Quarantined: not fit to lift");
      await screenshot(page, "review-refused-before-password");
      // Returned, so the demo's list of plans waiting in review is as it was.
      await page
        .getByLabel("What should the planner change?")
        .fill("The master link is quarantined: allocate another.");
      await page.getByRole("button", { name: "Return to the planner" }).click();
      await page.waitForURL(`**/plans/${waitingId}`);
      await poll(() => page.getByRole("status").allInnerTexts()).toContainEqual(
        expect.stringContaining("Returned to the planner"),
      );
    });
  },
);
