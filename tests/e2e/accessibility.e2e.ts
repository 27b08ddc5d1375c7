// The main pages as each role sees them, checked with axe-core (WCAG 2.1 A and AA, and axe's best
// practices): no serious or critical violation anywhere. One browser; each role signs in once.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { axeFindings, describeFindings } from "./axe";
import { DEMO_PASSWORD, hydrated, openBrowser, sendComponentWithBadMass, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser.close();
});

const DESKTOP = { width: 1280, height: 860 };
const PHONE = { width: 390, height: 844 };

/** Signs the one browser in as someone else, at the given viewport. */
async function actAs(email: string | null, viewport = DESKTOP) {
  const { page, context } = browser;
  await context.clearCookies();
  await page.setViewportSize(viewport);
  if (email) await signIn(page, email);
  return page;
}

/** A page to audit: its path, what to wait for or do before the audit, and the status it answers with (200 unless said). */
type Visit = string | { path: string; ready?: (page: Page) => Promise<void>; status?: number };

/** Opens the page, waits for hydration (and whatever the visit waits for) and returns what axe finds, as text. */
async function audit(page: Page, visit: Visit) {
  const { path, ready, status = 200 } = typeof visit === "string" ? { path: visit } : visit;
  const response = await page.goto(path);
  expect(response?.status(), `GET ${path}`).toBe(status);
  await hydrated(page);
  await ready?.(page);
  return describeFindings(path, await axeFindings(page));
}

/** Audits every page in turn and fails once, listing every finding on every page. */
async function auditAll(page: Page, visits: Visit[]) {
  const report: string[] = [];
  for (const visit of visits) report.push(await audit(page, visit));
  expect(report.filter(Boolean).join("\n")).toBe("");
}

/** The first link in the main content whose address matches, e.g. the first item of a list page. */
async function firstLink(page: Page, listPath: string, pattern: RegExp) {
  await page.goto(listPath);
  const hrefs = await page
    .locator("main a[href]")
    .evaluateAll((links) => links.map((a) => a.getAttribute("href") ?? ""));
  const href = hrefs.find((h) => pattern.test(h));
  if (!href) throw new Error(`no link matching ${pattern} on ${listPath}`);
  return href;
}

async function planByTitle(page: Page, start: string) {
  const { plans } = (await (await page.request.get("/api/plans")).json()) as {
    plans: Array<{ id: number; title: string; status: string }>;
  };
  const plan = plans.find((p) => p.title.startsWith(start));
  if (!plan) throw new Error(`no plan titled ${start}…`);
  return plan;
}

/** The component form with a lift point row and a composite part row added, then sent with a bad mass so errors show beside the fields. */
const componentFormWithRowsAndErrors = async (page: Page) => {
  await page.getByRole("button", { name: "Add a lift point" }).click();
  await page.getByRole("button", { name: "Add a part" }).click();
  await sendComponentWithBadMass(page, "Audit casing");
};

const editorReady = async (page: Page) => {
  await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
  await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
};

describe("accessibility of the main pages (axe-core, WCAG 2.1 AA)", () => {
  it("signing in and resetting a password, with and without an error shown", async () => {
    const page = await actAs(null);
    const report = [await audit(page, "/login"), await audit(page, "/forgot-password")];
    await page.goto("/login");
    await hydrated(page);
    await page.getByLabel("E-mail").fill("planner@example.com");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByRole("alert").waitFor();
    report.push(describeFindings("/login with a wrong password", await axeFindings(page)));
    expect(report.filter(Boolean).join("\n")).toBe("");
  });

  it("the planner's pages: dashboard, jobs, components, gear, sites, a draft plan and its editor, reference, settings", async () => {
    const page = await actAs("planner@example.com");
    const draft = await planByTitle(page, "Lift the C2 element");
    const job = await firstLink(page, "/jobs", /^\/jobs\/\d+$/);
    const component = await firstLink(page, "/components", /^\/components\/\d+$/);
    const item = await firstLink(page, "/gear", /^\/gear\/\d+$/);
    const site = await firstLink(page, "/sites", /^\/sites\/\d+$/);
    await auditAll(page, [
      "/",
      "/jobs",
      job,
      `${job}/edit`,
      "/jobs/new",
      "/components",
      component,
      `${component}/edit`,
      { path: "/components/new", ready: componentFormWithRowsAndErrors },
      "/gear",
      item,
      "/sites",
      site,
      "/sites/new",
      "/plans/new",
      `/plans/${draft.id}`,
      `/plans/${draft.id}/details`,
      { path: `/plans/${draft.id}/edit`, ready: editorReady },
      `/plans/${draft.id}/submit`,
      `/plans/${draft.id}/history`,
      "/reference",
      "/settings",
      { path: "/plans/999999", status: 404 },
    ]);
  });

  // The appointed person approves the plan in review and assigns the rigger, so the rigger's lift page has a plan
  // whatever the other browser tests have done to the demo's approved plans.
  it("the appointed person's pages: dashboard, a plan in review, its approval form, and the approved plan with the rigger to assign", async () => {
    const page = await actAs("approver@example.com");
    const inReview = await planByTitle(page, "Lift the B1 gearbox top cover");
    await auditAll(page, [
      "/",
      `/plans/${inReview.id}`,
      `/plans/${inReview.id}/review`,
      `/plans/${inReview.id}/history`,
    ]);
    await page.goto(`/plans/${inReview.id}/review`);
    await hydrated(page);
    await page.getByLabel("Your password, entered again").fill(DEMO_PASSWORD);
    await page.getByLabel(/Type your name/).fill("Priya Okonedo");
    await page.getByRole("button", { name: "Approve this revision" }).click();
    await page.waitForURL(`**/plans/${inReview.id}`);
    await hydrated(page);
    const approved = describeFindings(`/plans/${inReview.id} approved`, await axeFindings(page));
    await page.getByLabel(/Rigger for the lift/).selectOption({ label: "Dale Hutton" });
    await page.getByRole("button", { name: "Assign and tell them" }).click();
    await expect.poll(() => page.getByRole("status").first().innerText()).toContain("rigger is assigned");
    expect(approved).toBe("");
  });

  it("the rigger's pages at phone width: dashboard, the assigned plan, its lift page and the gear register", async () => {
    const page = await actAs("rigger@example.com", PHONE);
    const assigned = await planByTitle(page, "Lift the B1 gearbox top cover");
    await auditAll(page, ["/", `/plans/${assigned.id}`, `/plans/${assigned.id}/lift`, "/gear"]);
  });

  it("the admin's pages: users, settings, outbox, and the gear register's forms", async () => {
    const page = await actAs("admin@example.com");
    const user = await firstLink(page, "/admin", /^\/admin\/users\/\d+$/);
    const mail = await firstLink(page, "/admin/outbox", /^\/admin\/outbox\/\d+$/);
    const item = await firstLink(page, "/gear", /^\/gear\/\d+$/);
    await auditAll(page, [
      "/",
      "/admin",
      user,
      "/admin/users/new",
      "/admin/settings",
      "/admin/outbox",
      mail,
      "/gear",
      item,
      `${item}/edit`,
      "/gear/new",
      "/gear/import",
    ]);
  });
});
