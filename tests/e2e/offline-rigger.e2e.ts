// A rigger in a plant room without signal, on a phone (390 x 844): the plan kept on the phone opens, ticks,
// the lift record and a defect report are kept through reloads and a closed tab, and when signal returns each
// arrives once; gear quarantined in between is reported beside the record. Runs its own server on a fresh demo
// database so the plan's state does not depend on the other browser tests.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { startBuiltServer, type BuiltServer } from "../support/built-server";
import { DEMO_PASSWORD } from "./browser";

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

let server: BuiltServer;
let profile: string;
let phone: BrowserContext;
let desk: BrowserContext;

async function open(viewport: { width: number; height: number }, dir: string) {
  return chromium.launchPersistentContext(dir, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: CHROMIUM_ARGS,
    viewport,
    baseURL: server.baseUrl,
  });
}

async function signIn(page: Page, email: string) {
  await page.goto("/login");
  await page.waitForSelector("html[data-hydrated='true']");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"));
}

const hydrated = (page: Page) => page.waitForSelector("html[data-hydrated='true']");

beforeAll(async () => {
  server = await startBuiltServer();
  profile = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-phone-"));
  phone = await open({ width: 390, height: 844 }, profile);
  desk = await open({ width: 1280, height: 900 }, fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-desk-")));
}, 120_000);

afterAll(async () => {
  await phone?.close();
  await desk?.close();
  await server?.stop();
  fs.rmSync(profile, { recursive: true, force: true });
});

describe("a rigger without signal", () => {
  it("keeps the plan, records the lift and a defect offline, and every record arrives once when signal returns", async () => {
    let page = phone.pages()[0] ?? (await phone.newPage());
    await signIn(page, "rigger@example.com");
    const { plans } = (await (await page.request.get("/api/plans")).json()) as {
      plans: Array<{ id: number; title: string; status: string }>;
    };
    const plan = plans.find((p) => p.title.startsWith("Lift the B1 gearbox off") && p.status === "approved");
    expect(plan, "the demo's gearbox plan is approved and assigned to the rigger").toBeDefined();
    const liftUrl = `/plans/${plan!.id}/lift`;

    // With signal: open the plan and keep it on the phone (the page, its checklist and the printed plan).
    await page.goto(liftUrl);
    await hydrated(page);
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
    });
    // The first load is not yet the worker's; once it controls the page the kept copies go through it.
    await page.reload();
    await hydrated(page);
    await page.getByRole("button", { name: "Keep on this phone" }).click();
    // Keeping prints the plan's PDF on the server, which takes a few seconds on a busy machine.
    await expect
      .poll(() => page.getByTestId("keep-on-phone").innerText(), { timeout: 45_000 })
      .toContain("Kept on this phone");
    const gearIds = await page
      .locator("input[name^='gear-']")
      .evaluateAll((els) => els.map((e) => Number((e as HTMLInputElement).name.slice(5))));
    expect(gearIds.length).toBeGreaterThan(1);

    // Every box and button a gloved hand needs is at least 44 px tall.
    for (const row of await page.locator("[data-testid='lift-form'] label:has(input[type=checkbox])").all())
      expect((await row.boundingBox())!.height).toBeGreaterThanOrEqual(44);
    const submit = page.getByRole("button", { name: "Record the lift as done" });
    expect((await submit.boundingBox())!.height).toBeGreaterThanOrEqual(48);

    // Signal drops. The kept plan opens from the phone, and says when it was last checked, not that it is fit now.
    await phone.setOffline(true);
    await page.reload();
    await hydrated(page);
    await expect.poll(() => page.getByTestId("offline-banner").innerText()).toContain("No signal since");
    await expect
      .poll(() => page.getByTestId("offline-currency").innerText())
      .toMatch(/Last checked current at \d\d:\d\d; offline since \d\d:\d\d/);

    // Tick by tapping the text of each row (the whole row toggles), then reload: the ticks are still there.
    const checks = page.locator("[data-testid='lift-form'] input[name^='check-'][type=checkbox]");
    const checkCount = await checks.count();
    for (let i = 0; i < checkCount; i++) await checks.nth(i).locator("xpath=..").locator("span").first().click();
    for (const id of gearIds) await page.locator(`input[name='gear-${id}']`).check();
    await page.waitForTimeout(300);
    await page.reload();
    await hydrated(page);
    await expect.poll(() => checks.evaluateAll((els) => els.every((e) => (e as HTMLInputElement).checked))).toBe(true);

    // Fill the hold points and notes, then close the tab and open the plan again, still without signal.
    const past = new Date(Date.now() - 30 * 60_000);
    const pad = (n: number) => String(n).padStart(2, "0");
    // The demo organisation's zone is Europe/London: in winter that is UTC (The Summer Time Order 2002).
    const siteTime = `${past.getUTCFullYear()}-${pad(past.getUTCMonth() + 1)}-${pad(past.getUTCDate())}T${pad(past.getUTCHours())}:${pad(past.getUTCMinutes())}`;
    for (const field of await page.locator("input[name^='hold-'][name$='-at']").all()) await field.fill(siteTime);
    await page.getByLabel("Notes").fill("Landed on the skid in the plant room, no signal.");
    await page.waitForTimeout(300);
    await page.close();
    page = await phone.newPage();
    await page.goto(liftUrl);
    await hydrated(page);
    await expect
      .poll(() => page.getByLabel("Notes").inputValue())
      .toBe("Landed on the skid in the plant room, no signal.");
    await expect.poll(() => page.locator("input[name^='hold-'][name$='-at']").first().inputValue()).toBe(siteTime);

    // Record the lift: it is saved on the phone and waits.
    await page.getByRole("button", { name: "Record the lift as done" }).click();
    await expect.poll(() => page.getByTestId("lift-saved").innerText()).toContain("waiting to send");

    // Report a defect on the first item, still without signal.
    const firstCode = (
      await page.locator("summary").filter({ hasText: "Report a defect on" }).first().innerText()
    ).replace("Report a defect on ", "");
    await page.locator("summary").filter({ hasText: "Report a defect on" }).first().click();
    await page.getByLabel(`What is wrong with ${firstCode}`).fill("Sheave guard cracked on the hook block side");
    await page.getByRole("button", { name: "Save the defect report" }).first().click();
    await expect.poll(() => page.getByTestId("outbox").innerText()).toContain("2 waiting to send");

    // A reload and a closed tab later, both are still waiting.
    await page.reload();
    await hydrated(page);
    await expect.poll(() => page.getByTestId("outbox").innerText()).toContain("2 waiting to send");

    // Meanwhile, at the office, the admin quarantines another item of the plan.
    const office = desk.pages()[0] ?? (await desk.newPage());
    await signIn(office, "admin@example.com");
    const quarantined = await office.request.post(`/gear/${gearIds[gearIds.length - 1]}`, {
      form: { intent: "status", status: "quarantined", reason: "Found with a distorted link at the store" },
      headers: { Origin: server.baseUrl },
      maxRedirects: 0,
    });
    expect(quarantined.status()).toBe(302);

    // Signal returns: the records go, once each, in order.
    await phone.setOffline(false);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await expect
      .poll(() => page.locator("[data-testid='outbox'] li[data-state='sent']").count(), { timeout: 20_000 })
      .toBe(2);
    const outbox = await page.getByTestId("outbox").innerText();
    expect(outbox).toContain("Changed after it was made");
    expect(outbox).toContain("quarantined");

    // The phone sends the lift record again (its answer lost on the way back): the server knows it.
    const again = await page.evaluate(async () => {
      const db = await new Promise<IDBDatabase>((resolve, reject) => {
        const req = indexedDB.open("plumbline");
        req.onsuccess = () => resolve(req.result);
        req.onerror = () => reject(req.error);
      });
      const rows = await new Promise<
        Array<{ kind: string; clientId: string; madeAt: string; planId: number; fields: Array<[string, string]> }>
      >((resolve) => {
        const all = db.transaction("outbox").objectStore("outbox").getAll();
        all.onsuccess = () => resolve(all.result);
      });
      const lift = rows.find((r) => r.kind === "lift")!;
      const body = new FormData();
      body.set("clientId", lift.clientId);
      body.set("kind", "lift");
      body.set("madeAt", lift.madeAt);
      body.set("planId", String(lift.planId));
      for (const [n, v] of lift.fields) body.append(n, v);
      const res = await fetch("/api/sync", { method: "POST", body });
      return { status: res.status, body: (await res.json()) as { outcome: string; message: string } };
    });
    expect(again.status).toBe(200);
    expect(again.body.message).toContain("already arrived");

    // At the office: the plan is completed with one lift record, the change shown beside it; the defect arrived once.
    await office.goto(`/plans/${plan!.id}`);
    await expect
      .poll(() => office.getByTestId("arrived-from-phone").innerText())
      .toContain("Changed after it was made");
    await office.goto(`/plans/${plan!.id}/history`);
    const history = await office.getByTestId("history").innerText();
    expect(history.match(/lift recorded/g)).toHaveLength(1);
    await office.goto(`/gear/${gearIds[0]}`);
    const itemPage = await office.locator("main").innerText();
    expect(itemPage.match(/Sheave guard cracked on the hook block side/g)?.length ?? 0).toBeGreaterThanOrEqual(1);
    expect(itemPage).toMatch(/Quarantined/i);
  }, 180_000);
});
