import http from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hydrated, openBrowser, signIn, type BrowserSession } from "./browser";

let browser: BrowserSession;
const violations: string[] = [];

beforeAll(async () => {
  browser = await openBrowser({ width: 1440, height: 1000 });
  // Injected by the browser driver, so it runs before the page's own scripts and is not itself subject to the CSP.
  await browser.context.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (event) => {
      console.error(
        `securitypolicyviolation: ${event.effectiveDirective} blocked ${event.blockedURI || "inline"} at ${event.sourceFile}:${event.lineNumber}`,
      );
    });
  });
  browser.page.on("console", (message) => {
    const text = message.text();
    if (/securitypolicyviolation|Content Security Policy/i.test(text))
      violations.push(`${browser.page.url()}: ${text}`);
  });
});
afterAll(async () => {
  await browser.close();
});

describe("the served pages under their Content-Security-Policy", () => {
  it("a page's response carries a CSP with a fresh nonce, and its scripts carry that nonce", async () => {
    const { page } = browser;
    const response = await page.goto("/login");
    const csp = response?.headers()["content-security-policy"] ?? "";
    const nonce = /script-src 'self' 'nonce-([^']+)'/.exec(csp)?.[1];
    expect(nonce, csp).toBeTruthy();
    expect(csp).toContain("frame-ancestors 'none'");
    await hydrated(page);
    const scriptNonces = await page.evaluate(() =>
      [...document.querySelectorAll("script")].filter((s) => !s.src).map((s) => s.nonce),
    );
    expect(scriptNonces.length).toBeGreaterThan(0);
    expect(new Set(scriptNonces)).toEqual(new Set([nonce]));
    const second = await page.goto("/login");
    expect(second?.headers()["content-security-policy"]).not.toContain(nonce!);
  });

  it("the dashboard and the plan editor load, hydrate and draw with no CSP violation", async () => {
    const { page } = browser;
    await signIn(page, "planner@example.com");
    await page.goto("/");
    await hydrated(page);
    await page.waitForLoadState("networkidle");
    await page.goto("/plans/1/edit");
    await hydrated(page);
    await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
    // The live figures come from /api/solve, so the leg table proves connect-src lets the editor talk to the server.
    await expect.poll(() => page.getByTestId("leg-table").isVisible(), { timeout: 10_000 }).toBe(true);
    await page.waitForLoadState("networkidle");
    expect(violations).toEqual([]);
  });

  it("the built server refuses a cross-site sign-in and a cross-site plan save with 403 and a sentence", async () => {
    const { baseUrl } = browser;
    const signInElsewhere = await fetch(`${baseUrl}/login`, {
      method: "POST",
      body: new URLSearchParams({ email: "planner@example.com", password: "plumbline-demo" }),
      headers: { Origin: "https://evil.example" },
      redirect: "manual",
    });
    expect(signInElsewhere.status).toBe(403);
    expect(signInElsewhere.headers.get("set-cookie")).toBeNull();
    expect(await signInElsewhere.text()).toMatch(
      /^Plumbline refused this request because it did not come from one of its own pages\./,
    );
    const save = await fetch(`${baseUrl}/api/plans/1`, {
      method: "PUT",
      body: "{}",
      headers: { Origin: "https://evil.example", "Content-Type": "application/json" },
    });
    expect(save.status).toBe(403);
    expect(((await save.json()) as { error: string }).error).toMatch(/did not come from one of its own pages/);
  });

  it("the built server answers TRACE, OPTIONS, PROPFIND and a DELETE to a form with 405 and Allow, never a 500", async () => {
    const { baseUrl } = browser;
    const url = new URL(baseUrl);
    const send = (method: string, path: string) =>
      new Promise<{ status?: number; allow?: string; cache?: string }>((resolve, reject) => {
        const request = http.request({ host: url.hostname, port: url.port, path, method }, (res) => {
          res.resume();
          res.on("end", () =>
            resolve({ status: res.statusCode, allow: res.headers.allow, cache: res.headers["cache-control"] }),
          );
        });
        request.on("error", reject);
        request.end();
      });
    for (const method of ["TRACE", "OPTIONS", "PROPFIND"]) {
      expect(await send(method, "/"), method).toEqual({ status: 405, allow: "GET, HEAD, POST", cache: "no-store" });
      expect((await send(method, "/api/solve")).status, method).toBe(405);
    }
    const deleted = await fetch(`${baseUrl}/settings`, { method: "DELETE", headers: { Origin: baseUrl } });
    expect(deleted.status).toBe(405);
    expect(deleted.headers.get("allow")).toBe("GET, HEAD, POST");
  });
});
