// Two app servers (two processes on two ports) over one PostgreSQL database, as behind a load balancer: a session,
// a plan's saves and their version check, the sign-in limits and the uploads are the database's (and the shared
// upload folder's), not one server's memory. No browser: plain requests with each server's own Origin.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { signInCookie, startBuiltServer, type BuiltServer } from "../support/built-server";
import { startPostgres, type PostgresServer } from "../support/postgres-server";

let postgres: PostgresServer | undefined;
let uploads: string | undefined;
let a: BuiltServer | undefined;
let b: BuiltServer | undefined;

beforeAll(async () => {
  postgres = await startPostgres();
  await postgres.admin("CREATE DATABASE two_servers");
  uploads = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-shared-uploads-"));
  const extraEnv = {
    DATABASE_URL: postgres.url("two_servers"),
    SESSION_SECRET: randomBytes(24).toString("hex"),
    UPLOAD_DIR: uploads,
    WEB_CONCURRENCY: "1",
  };
  // A sets the database up (migrations and the demo scenario); B serves it as it is.
  a = await startBuiltServer({ extraEnv, startSeconds: 60 });
  b = await startBuiltServer({ extraEnv, seed: false, startSeconds: 60 });
});

afterAll(async () => {
  await b?.stop();
  await a?.stop();
  await postgres?.stop();
  if (uploads) fs.rmSync(uploads, { recursive: true, force: true });
});

/** A request to `server` with `cookie`, its own Origin, and redirects left unfollowed. */
function call(server: BuiltServer, route: string, cookie: string, init: RequestInit = {}) {
  return fetch(`${server.baseUrl}${route}`, {
    ...init,
    redirect: "manual",
    headers: { Cookie: cookie, Origin: server.baseUrl, ...(init.headers as Record<string, string>) },
  });
}

type PlanBody = { id: number; version: number; status: string; title: string } & Record<string, unknown>;

async function readPlan(server: BuiltServer, cookie: string, planId: number) {
  const res = await call(server, `/api/plans/${planId}`, cookie);
  expect(res.status).toBe(200);
  return (await res.json()) as PlanBody;
}

function savePlan(server: BuiltServer, cookie: string, read: PlanBody, title: string) {
  const { version, arrangement, rigging, details } = read;
  return call(server, `/api/plans/${read.id}`, cookie, {
    method: "PUT",
    body: JSON.stringify({ version, title, arrangement, rigging, details }),
    headers: { "Content-Type": "application/json" },
  });
}

describe("two app servers on one PostgreSQL database", () => {
  it("a session signed in through A is good on B, and signing out through B ends it on A", async () => {
    const cookie = await signInCookie(a!.baseUrl, "planner@example.com");
    // Without a session the page sends the visitor to sign in; with A's cookie B serves it.
    const anonymous = await call(b!, "/jobs", "");
    expect(anonymous.status).toBe(302);
    expect(anonymous.headers.get("location")).toMatch(/^\/login/);
    expect((await call(b!, "/jobs", cookie)).status).toBe(200);
    expect((await call(a!, "/jobs", cookie)).status).toBe(200);

    const out = await call(b!, "/logout", cookie, { method: "POST" });
    expect(out.status).toBe(303);
    const onA = await call(a!, "/jobs", cookie);
    expect(onA.status).toBe(302);
    expect(onA.headers.get("location")).toMatch(/^\/login/);
  });

  it("a plan saved through A reads back changed through B; B's save on the version read before gets 409 and changes nothing", async () => {
    const cookie = await signInCookie(a!.baseUrl, "planner@example.com");
    const list = (await (await call(a!, "/api/plans?limit=200", cookie)).json()) as {
      plans: Array<{ id: number; status: string }>;
    };
    const draft = list.plans.find((p) => p.status === "draft");
    expect(draft, "the demo scenario has a draft plan").toBeDefined();

    const before = await readPlan(b!, cookie, draft!.id);
    const savedOnA = await savePlan(a!, cookie, await readPlan(a!, cookie, draft!.id), "Saved through server A");
    expect(savedOnA.status).toBe(200);

    const afterA = await readPlan(b!, cookie, draft!.id);
    expect(afterA.title).toBe("Saved through server A");
    expect(afterA.version).toBe(before.version + 1);

    const stale = await savePlan(b!, cookie, before, "Saved through server B on a stale version");
    expect(stale.status).toBe(409);
    expect(await stale.json()).toMatchObject({ code: "stale", version: before.version + 1 });
    for (const server of [a!, b!]) {
      const now = await readPlan(server, cookie, draft!.id);
      expect(now.title).toBe("Saved through server A");
      expect(now.version).toBe(before.version + 1);
    }
  });

  it("failed sign-ins counted through A hold the account through B", async () => {
    const email = "approver@example.com";
    const signIn = (server: BuiltServer, password: string) =>
      fetch(`${server.baseUrl}/login`, {
        method: "POST",
        body: new URLSearchParams({ email, password, redirectTo: "/" }),
        headers: { Origin: server.baseUrl },
        redirect: "manual",
      });
    // Wrong passwords through A until A makes the account wait (after a few free failures).
    let held: Response | undefined;
    for (let i = 0; i < 20 && !held; i++) {
      const res = await signIn(a!, "not the password");
      if (res.status === 429) held = res;
      else expect(res.status).toBe(401);
    }
    expect(held, "A holds the account after repeated failures").toBeDefined();
    // Asked at once, inside the hold A just answered with, B holds the account too, even for the right password.
    const onB = await signIn(b!, "plumbline-demo");
    expect(onB.status).toBe(429);
    expect(await onB.text()).toMatch(/sign-ins to this account have failed; wait \d+ seconds? and try again/);
    expect(onB.headers.get("set-cookie")).toBeNull();
    expect(Number(onB.headers.get("Retry-After"))).toBeGreaterThan(0);
  });

  it("a file uploaded through A downloads through B, byte for byte", async () => {
    const cookie = await signInCookie(a!.baseUrl, "planner@example.com");
    const page = await (await call(b!, "/components", cookie)).text();
    const componentId = /href="\/components\/(\d+)"/.exec(page)?.[1];
    expect(componentId, "the demo scenario has a component").toBeDefined();
    const filesOn = async (server: BuiltServer) =>
      new Set(
        [...(await (await call(server, `/components/${componentId}`, cookie)).text()).matchAll(/\/files\/(\d+)/g)].map(
          (m) => m[1]!,
        ),
      );
    const earlier = await filesOn(b!);

    const bytes = Buffer.concat([Buffer.from("%PDF-1.4\n% shared upload check\n"), randomBytes(2048)]);
    const form = new FormData();
    form.set("intent", "upload");
    form.set("kind", "drawing");
    form.set("caption", "Uploaded through server A");
    form.set("file", new Blob([bytes], { type: "application/pdf" }), "shared-check.pdf");
    const uploaded = await call(a!, `/components/${componentId}`, cookie, { method: "POST", body: form });
    expect(uploaded.status).toBe(302);

    const added = [...(await filesOn(b!))].filter((id) => !earlier.has(id));
    expect(added).toHaveLength(1);
    const download = await call(b!, `/files/${added[0]}`, cookie);
    expect(download.status).toBe(200);
    expect(Buffer.from(await download.arrayBuffer()).equals(bytes)).toBe(true);
  });
});
