import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, openBrowser, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser.close();
});

/** The JavaScript a page loads, with whether any of it carries Konva. */
async function scriptsOf(path: string) {
  const { page } = browser;
  const urls: string[] = [];
  const listener = (response: { url(): string; request(): { resourceType(): string } }) => {
    if (response.request().resourceType() === "script") urls.push(response.url());
  };
  page.on("response", listener);
  await page.goto(path);
  await hydrated(page);
  await page.waitForLoadState("networkidle");
  page.off("response", listener);
  const bodies = await Promise.all(urls.map(async (u) => (await fetch(u)).text()));
  return { urls, hasKonva: bodies.some((b) => b.includes("Konva.Stage") || b.includes("_injectGlobal")) };
}

describe("the drawing library ships only with the editor", () => {
  it("pages other than the editor load no Konva", async () => {
    await signIn(browser.page, "planner@example.com");
    for (const path of ["/", "/jobs", "/components", "/gear", "/plans/1", "/plans/1/details"]) {
      const { hasKonva, urls } = await scriptsOf(path);
      expect(hasKonva, `${path} loaded ${urls.join(", ")}`).toBe(false);
    }
  });

  it("the editor loads it", async () => {
    const { hasKonva } = await scriptsOf("/plans/1/edit");
    expect(hasKonva).toBe(true);
  });
});

describe("mathjs stays on the server", () => {
  it("no file of the browser build carries it, while the server build does (utils/quantities.ts)", () => {
    // "hogshead" is one of mathjs's unit names: a string no minifier renames and nothing else here says.
    const carriesMathjs = (dir: string) =>
      fs
        .readdirSync(dir)
        .filter((f) => f.endsWith(".js"))
        .filter((f) => fs.readFileSync(path.join(dir, f), "utf8").includes("hogshead"));
    expect(carriesMathjs("build/client/assets")).toEqual([]);
    expect(carriesMathjs("build/server/assets").length).toBeGreaterThan(0);
  });
});
