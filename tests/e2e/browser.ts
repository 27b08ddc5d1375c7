import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { expect, inject } from "vitest";

export const DEMO_PASSWORD = "plumbline-demo";

/** Flags for Debian's Chromium running as root on a closed network. */
const CHROMIUM_ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-dev-shm-usage",
];

export const SCREENSHOT_DIR = path.resolve("test-results/screenshots");

export type BrowserSession = {
  context: BrowserContext;
  page: Page;
  baseUrl: string;
  close: () => Promise<void>;
  externalRequests: string[];
};

/** A fresh Chromium profile at the given viewport; records any request that leaves the app's origin. */
/** Chromium on the run's shared server, or on `baseUrl` (a server of the test file's own). */
export async function openBrowser(
  viewport = { width: 1280, height: 860 },
  baseUrl: string = inject("baseUrl"),
): Promise<BrowserSession> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: CHROMIUM_ARGS,
    viewport,
    baseURL: baseUrl,
  });
  const externalRequests: string[] = [];
  context.on("request", (req) => {
    const url = req.url();
    if (!url.startsWith(baseUrl) && !url.startsWith("data:") && !url.startsWith("blob:")) externalRequests.push(url);
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    baseUrl,
    externalRequests,
    close: async () => {
      await context.close();
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Waits until React has hydrated the page, so clicks reach their handlers. */
export async function hydrated(page: Page) {
  await page.waitForSelector("html[data-hydrated='true']");
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/login");
  await hydrated(page);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"));
  await hydrated(page);
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}

export async function mainNavLabels(page: Page) {
  const nav = page.getByRole("navigation", { name: "Main" });
  await expect.poll(async () => nav.getByRole("link").count()).toBeGreaterThan(0);
  return nav.getByRole("link").allInnerTexts();
}

/** Fills the component form's name and figures with a mass it must refuse, sends it, and waits for the refusal beside the field. */
export async function sendComponentWithBadMass(page: Page, name: string) {
  await page.getByLabel("Name", { exact: true }).fill(name);
  await page.getByLabel("Mass (kg)").fill("-3");
  await page.getByLabel("Length along x (mm)").fill("1000");
  await page.getByLabel("Width along y (mm)").fill("500");
  await page.getByLabel("Height along z (mm)").fill("500");
  await page.getByLabel("CoG z (mm)").fill("200");
  await page.getByRole("button", { name: "Save component" }).click();
  await expect.poll(() => page.locator("main").innerText()).toContain("The mass must be more than zero.");
}
