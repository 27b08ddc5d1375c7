// A planner and an approver who work in imperial units see every load, tension and capacity in lb or lbf:
// on the plan page, the review page, the editor and in the printed plan. A metric figure may stand only as a
// WLL marking, shown beside its converted value.
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startBuiltServer, type BuiltServer } from "../support/built-server";
import { hydrated, openBrowser, signIn, type BrowserSession } from "./browser";

// Its own server on a fresh demo database: the shared one's demo plans move on as other files approve and record them.
let server: BuiltServer;
let browser: BrowserSession;
beforeAll(async () => {
  server = await startBuiltServer();
  browser = await openBrowser(undefined, server.baseUrl);
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function chooseUnits(page: Page, units: "metric" | "imperial") {
  await page.goto("/settings");
  await hydrated(page);
  await page.getByLabel("Show and enter figures in").selectOption(units);
  await page.getByRole("button", { name: "Save units" }).click();
  await page.getByText(/Figures now show in/).waitFor();
}

/** The demo plan with this status whose title starts so (ids depend on the seeding order). */
async function planId(page: Page, status: string, title: RegExp) {
  const { plans } = (await (await page.request.get("/api/plans")).json()) as {
    plans: Array<{ id: number; title: string; status: string }>;
  };
  const found = plans.find((p) => p.status === status && title.test(p.title));
  expect(found, `a demo plan ${status}: ${title}`).toBeDefined();
  return found!.id;
}

// A figure in a metric unit of mass or force: "1 649 kg", "16.2 kN", "2 t", "2.5 tonnes". Only a mass may stand
// beside its converted value (a WLL as marked on the item, or in the register's own description of it).
const METRIC = /(?<![\w.,])\d[\d,.\u00a0\u2009 ]*\s?(?:kg|kN|t|tonnes?)(?![\w/])/g;
// Imperial figures that may stand beside a metric marking: "(4 410 lb)", "= 4,410 lbf".
const IMPERIAL_NEAR = /\d[\d,. ]*\s?(?:lb|lbf|US tons?)\b/;

/**
 * Each metric figure in the text with no imperial figure beside it (a few words either side). White space is folded
 * first, so a marking wrapped onto the next line, or a table row's WLL beside the item's own description, still counts.
 */
function bareMetric(text: string): string[] {
  const flat = text.replace(/\s+/g, " ");
  const found: string[] = [];
  for (const m of flat.matchAll(METRIC)) {
    const start = m.index ?? 0;
    const around = flat.slice(Math.max(0, start - 30), start + m[0].length + 30);
    // A force is never a marking: kN has no place in imperial figures, beside lb or not.
    if (m[0].endsWith("kN") || !IMPERIAL_NEAR.test(around))
      found.push(flat.slice(Math.max(0, start - 60), start + m[0].length + 20));
  }
  return found;
}

async function mainText(page: Page, url: string) {
  await page.goto(url);
  await hydrated(page);
  return page.locator("main").innerText();
}

describe("a planner and an approver working in imperial units", () => {
  it("see loads, tensions and capacities in lb and lbf on the plan, review and editor pages and in the PDF", async () => {
    const { page } = browser;

    await signIn(page, "approver@example.com");
    await chooseUnits(page, "imperial");
    const approved = await planId(page, "approved", /gearbox off its baseplate/);
    const inReview = await planId(page, "in_review", /gearbox top cover/);
    const plan = await mainText(page, `/plans/${approved}`);
    expect(plan).toMatch(/\d[\d,]* lb/);
    expect(bareMetric(plan), "plan page").toEqual([]);

    const review = await mainText(page, `/plans/${inReview}/review`);
    expect(review).toMatch(/\d[\d,]* lbf?/);
    expect(bareMetric(review), "review page").toEqual([]);

    const pdf = await page.request.get(`/plans/${approved}/print.pdf`);
    expect(pdf.status()).toBe(200);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-units-"));
    const file = path.join(dir, "plan.pdf");
    fs.writeFileSync(file, await pdf.body());
    const printed = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    fs.rmSync(dir, { recursive: true, force: true });
    expect(printed).toMatch(/\d[\d,]* lb/);
    expect(bareMetric(printed), "printed plan").toEqual([]);

    await page.context().clearCookies();
    await signIn(page, "planner@example.com");
    await chooseUnits(page, "imperial");
    await page.goto("/plans/1/edit");
    await hydrated(page);
    // The live figures arrive from the solve a moment after the page.
    await expect.poll(() => page.locator("main").innerText(), { timeout: 15000 }).toMatch(/\d[\d,]* lbf/);
    expect(bareMetric(await page.locator("main").innerText()), "editor page").toEqual([]);
  });
});
