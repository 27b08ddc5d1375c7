// Server-side sessions: the cookie carries a random token, the server keeps its hash; sign-out, a password change,
// a reset, a deactivation and an admin end sessions, so a copied cookie stops working; idle and absolute lifetimes;
// users see and end their own sessions. The session user costs one indexed read.
import { afterEach, describe, expect, it, vi } from "vitest";
import * as dashboard from "~/routes/_index";
import * as adminUser from "~/routes/admin.users.$userId";
import * as login from "~/routes/login";
import * as logout from "~/routes/logout";
import * as setPasswordRoute from "~/routes/set-password.$token";
import * as settings from "~/routes/settings";
import { AuditEvent } from "~/models/audit-event.server";
import { issuePasswordToken } from "~/models/password-token.server";
import { Session, TOUCH_INTERVAL_MS } from "~/models/session.server";
import { setUserActive } from "~/models/user.server";
import { getOrganisation, updateOrganisationSettings } from "~/models/organisation.server";
import { sequelize } from "~/utils/db.server";
import { env } from "~/utils/env.server";
import { getUser } from "~/utils/session.server";
import { createAppHandler } from "../support/app-handler";
import { statementsWhile } from "../support/statements";
import { callRoute, makeUser, postForm, sessionCookie, TEST_PASSWORD } from "../support/factories";

const BASE = "http://localhost:3000";
const T0 = new Date("2030-05-06T07:00:00Z").getTime();
const HOUR = 60 * 60 * 1000;

afterEach(() => {
  vi.useRealTimers();
});

function setClock(at: number) {
  vi.useFakeTimers({ toFake: ["Date"] });
  vi.setSystemTime(at);
}

/** Signs in through the form as a browser would and returns the Cookie header that browser then sends. */
async function signInBrowser(
  email: string,
  password = TEST_PASSWORD,
  userAgent = "Mozilla/5.0 (X11; Linux) Firefox/140.0",
) {
  const request = await postForm("/login", { email, password });
  request.headers.set("User-Agent", userAgent);
  const res = await callRoute(login.action, request);
  expect(res.status, "sign-in").toBe(303);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

/** Whether a browser sending `cookie` is signed in: the dashboard answers 200, or sends it to sign in. */
async function isSignedIn(cookie: string) {
  const res = await callRoute(dashboard.loader, new Request(`${BASE}/`, { headers: { Cookie: cookie } }));
  if (res.status === 200) return true;
  expect(res.headers.get("Location")).toMatch(/^\/login\?redirectTo=/);
  return false;
}

function post(path: string, fields: Record<string, string>, cookie: string) {
  return new Request(BASE + path, {
    method: "POST",
    body: new URLSearchParams(fields),
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: BASE, Cookie: cookie },
  });
}

/** The cookie header after a response that set a new session cookie. */
function replaced(cookie: string, setCookie: string[]) {
  const fresh = setCookie.map((c) => c.split(";")[0]!);
  const names = new Set(fresh.map((c) => c.split("=")[0]));
  return [...cookie.split("; ").filter((c) => !names.has(c.split("=")[0])), ...fresh].join("; ");
}

describe("the session cookie", () => {
  it("carries a random token and nothing about the user; the server keeps only the token's hash", async () => {
    const user = await makeUser(["planner"]);
    const cookie = await signInBrowser(user.email);
    const rows = await Session.findAll({ where: { userId: user.id } });
    expect(rows).toHaveLength(1);
    const value = decodeURIComponent(cookie.match(/__plumbline_session=([^;]+)/)![1]!);
    const payload = JSON.parse(Buffer.from(value.split(".")[0]!, "base64").toString("utf8")) as Record<string, unknown>;
    expect(Object.keys(payload)).toEqual(["sessionToken"]);
    expect(String(payload.sessionToken)).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(rows[0]!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(rows[0]!.tokenHash).not.toContain(String(payload.sessionToken));
  });

  it("a new sign-in never keeps the token the browser came with", async () => {
    const user = await makeUser(["planner"]);
    const first = await signInBrowser(user.email);
    const request = await postForm("/login", { email: user.email, password: TEST_PASSWORD });
    request.headers.set("Cookie", first);
    const again = await callRoute(login.action, request);
    expect(again.status).toBe(303);
    expect(await isSignedIn(first)).toBe(false);
    expect(await isSignedIn(replaced(first, again.headers.getSetCookie()))).toBe(true);
  });
});

describe("ending sessions", () => {
  it("a cookie copied before sign-out stops working at sign-out", async () => {
    const user = await makeUser(["planner"]);
    const cookie = await signInBrowser(user.email);
    const copied = cookie;
    expect(await isSignedIn(copied)).toBe(true);
    const out = await callRoute(logout.action, post("/logout", {}, cookie));
    expect(out.status).toBe(303);
    expect(await isSignedIn(copied)).toBe(false);
  });

  it("a password change signs out every other browser and gives this one a new session", async () => {
    const user = await makeUser(["planner"]);
    const laptop = await signInBrowser(user.email);
    const phone = await signInBrowser(user.email);
    const res = await callRoute(
      settings.action,
      post(
        "/settings",
        { intent: "password", current: TEST_PASSWORD, password: "a new password 1", confirm: "a new password 1" },
        laptop,
      ),
    );
    expect(res.status).toBe(302);
    expect(await isSignedIn(phone)).toBe(false);
    expect(await isSignedIn(laptop)).toBe(false);
    expect(await isSignedIn(replaced(laptop, res.headers.getSetCookie()))).toBe(true);
    expect(await Session.count({ where: { userId: user.id } })).toBe(1);
  });

  it("a password reset through a mailed link signs the user out everywhere", async () => {
    const user = await makeUser(["rigger"]);
    const browsers = [await signInBrowser(user.email), await signInBrowser(user.email)];
    const token = await issuePasswordToken(user.id, "reset");
    const res = await callRoute(
      setPasswordRoute.action,
      await postForm(`/set-password/${token}`, { password: "reset password 1", confirm: "reset password 1" }),
      { token },
    );
    expect(res.status).toBe(302);
    for (const cookie of browsers) expect(await isSignedIn(cookie)).toBe(false);
    expect(await Session.count({ where: { userId: user.id } })).toBe(0);
  });

  it("an admin signs a user of their organisation out everywhere, audited; another organisation's admin cannot", async () => {
    const admin = await makeUser(["admin"]);
    const user = await makeUser(["rigger"], { organisationId: admin.organisationId });
    const stranger = await makeUser(["admin"]);
    const browser = await signInBrowser(user.email);
    const adminBrowser = await signInBrowser(admin.email);
    const strangerBrowser = await signInBrowser(stranger.email);
    const page = await callRoute(
      adminUser.loader,
      new Request(`${BASE}/admin/users/${user.id}`, { headers: { Cookie: adminBrowser } }),
      {
        userId: String(user.id),
      },
    );
    expect(page.data).toMatchObject({ sessionCount: 1 });
    const refused = await callRoute(
      adminUser.action,
      post(`/admin/users/${user.id}`, { intent: "end-sessions" }, strangerBrowser),
      {
        userId: String(user.id),
      },
    );
    expect(refused.status).toBe(404);
    expect(await isSignedIn(browser)).toBe(true);
    const ended = await callRoute(
      adminUser.action,
      post(`/admin/users/${user.id}`, { intent: "end-sessions" }, adminBrowser),
      {
        userId: String(user.id),
      },
    );
    expect(ended.status).toBe(302);
    expect(await isSignedIn(browser)).toBe(false);
    expect(await isSignedIn(adminBrowser)).toBe(true);
    const audit = await AuditEvent.findOne({ where: { entity: "user", entityId: user.id, action: "sessions ended" } });
    expect(audit?.userId).toBe(admin.id);
  });

  it("deactivating a user removes their sessions", async () => {
    const admin = await makeUser(["admin"]);
    const user = await makeUser(["rigger"], { organisationId: admin.organisationId });
    await signInBrowser(user.email);
    await setUserActive(admin.organisationId, user.id, false, admin.id);
    expect(await Session.count({ where: { userId: user.id } })).toBe(0);
  });
});

describe("lifetimes", () => {
  it("a session ends after its idle time without a request; each request keeps it alive", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    const busy = await signInBrowser(user.email);
    const idle = await signInBrowser(user.email);
    const idleMs = env.sessionIdleMs;
    expect(idleMs).toBe(12 * HOUR);
    setClock(T0 + idleMs - HOUR);
    expect(await isSignedIn(busy)).toBe(true);
    setClock(T0 + idleMs + HOUR);
    expect(await isSignedIn(busy)).toBe(true);
    expect(await isSignedIn(idle)).toBe(false);
  });

  it("a session ends at its absolute lifetime however busy it is", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    const cookie = await signInBrowser(user.email);
    expect(env.sessionMaxMs).toBe(7 * 24 * HOUR);
    for (let at = T0 + 10 * HOUR; at < T0 + env.sessionMaxMs; at += 10 * HOUR) {
      setClock(at);
      expect(await isSignedIn(cookie), new Date(at).toISOString()).toBe(true);
    }
    setClock(T0 + env.sessionMaxMs + 1000);
    expect(await isSignedIn(cookie)).toBe(false);
  });
});

describe("the user's own sessions in settings", () => {
  it("lists each browser with this one marked, ends another, and keeps this one", async () => {
    const user = await makeUser(["planner"]);
    const laptop = await signInBrowser(
      user.email,
      TEST_PASSWORD,
      "Mozilla/5.0 (Windows NT 10.0) Chrome/140.0 Safari/537.36",
    );
    const phone = await signInBrowser(user.email, TEST_PASSWORD, "Mozilla/5.0 (iPhone) Version/18.0 Safari/604.1");
    const page = await callRoute(settings.loader, new Request(`${BASE}/settings`, { headers: { Cookie: laptop } }));
    const { sessions, currentSessionId } = page.data as {
      sessions: Array<{ id: number; userAgent: string }>;
      currentSessionId: number;
    };
    expect(sessions).toHaveLength(2);
    const phoneSession = sessions.find((s) => s.id !== currentSessionId)!;
    expect(phoneSession.userAgent).toContain("iPhone");

    const own = await callRoute(
      settings.action,
      post("/settings", { intent: "end-session", sessionId: String(currentSessionId) }, laptop),
    );
    expect(own.status).toBe(400);
    const ended = await callRoute(
      settings.action,
      post("/settings", { intent: "end-session", sessionId: String(phoneSession.id) }, laptop),
    );
    expect(ended.status).toBe(302);
    expect(await isSignedIn(phone)).toBe(false);
    expect(await isSignedIn(laptop)).toBe(true);
  });

  it("cannot end another user's session by its number", async () => {
    const user = await makeUser(["planner"]);
    const other = await makeUser(["planner"], { organisationId: user.organisationId });
    const mine = await signInBrowser(user.email);
    const theirs = await signInBrowser(other.email);
    const theirId = (await Session.findOne({ where: { userId: other.id } }))!.id;
    const res = await callRoute(
      settings.action,
      post("/settings", { intent: "end-session", sessionId: String(theirId) }, mine),
    );
    expect(res.status).toBe(400);
    expect(await isSignedIn(theirs)).toBe(true);
  });

  it("signs out every other browser at once", async () => {
    const user = await makeUser(["planner"]);
    const browsers = [
      await signInBrowser(user.email),
      await signInBrowser(user.email),
      await signInBrowser(user.email),
    ];
    const res = await callRoute(settings.action, post("/settings", { intent: "end-other-sessions" }, browsers[0]!));
    expect(res.status).toBe(302);
    expect(await Promise.all(browsers.map(isSignedIn))).toEqual([true, false, false]);
  });
});

describe("the cost of a signed-in request", () => {
  /** How many times the session user is looked up by token while `run` runs. */
  const sessionLookups = async (run: () => Promise<unknown>) =>
    (await statementsWhile(run)).filter((s) => /FROM sessions s/.test(s.sql)).length;

  it("a page's root loader and its own loader share one read of the session user", async () => {
    const handle = await createAppHandler();
    const user = await makeUser(["planner"]);
    const cookie = await sessionCookie(user);
    const page = (path: string) => handle(new Request(`${BASE}${path}`, { headers: { Cookie: cookie } }));
    let res: Response | undefined;
    expect(await sessionLookups(async () => (res = await page("/components")))).toBe(1);
    expect(res?.status).toBe(200);
    // The same for a client navigation's data request, which runs both loaders too.
    expect(await sessionLookups(async () => (res = await page("/components.data")))).toBe(1);
    expect(res?.status).toBe(200);
    // Each request reads afresh: a session ended between two pages is not carried from one to the next.
    expect(await sessionLookups(() => page("/components"))).toBe(1);
  });

  it("the organisation's settings come with the session user: a page does not read them again, the next page reads them afresh", async () => {
    const handle = await createAppHandler();
    const user = await makeUser(["planner"]);
    const cookie = await sessionCookie(user);
    const org = (await getOrganisation(user.organisationId))!;
    // The register judges "overdue" by the organisation's calendar day. These two zones are 25 hours apart, so
    // their calendar days differ at every instant.
    const overdueBefore = async (timeZone: string) => {
      await updateOrganisationSettings(user.organisationId, { name: org.name, allowSelfApproval: false, timeZone });
      let res: Response | undefined;
      const statements = await statementsWhile(async () => {
        res = await handle(new Request(`${BASE}/gear`, { headers: { Cookie: cookie } }));
      });
      expect(res?.status).toBe(200);
      expect(statements.filter((s) => /FROM [`"]?organisations/.test(s.sql) && !/FROM sessions s/.test(s.sql))).toEqual(
        [],
      );
      return /next_due_on[`"]? < '(\d{4}-\d{2}-\d{2})'/.exec(statements.map((s) => s.sql).join("\n"))?.[1];
    };
    const east = await overdueBefore("Pacific/Kiritimati");
    const west = await overdueBefore("Pacific/Pago_Pago");
    expect(east).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(west).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(east! > west!).toBe(true);
  });

  it("is one statement, found through the token's index; the last-seen time is written at most every few minutes", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    const cookie = await signInBrowser(user.email);
    setClock(T0 + TOUCH_INTERVAL_MS - 1000);
    let found: Awaited<ReturnType<typeof getUser>> = null;
    const first = await statementsWhile(async () => {
      found = await getUser(new Request(`${BASE}/`, { headers: { Cookie: cookie } }));
    });
    expect(found!.id).toBe(user.id);
    expect(first).toHaveLength(1);
    setClock(T0 + TOUCH_INTERVAL_MS + 1000);
    const later = await statementsWhile(() => getUser(new Request(`${BASE}/`, { headers: { Cookie: cookie } })));
    expect(later).toHaveLength(2);
    expect(later[1]!.sql).toMatch(/^UPDATE sessions SET last_seen_at_ms/);
    const bind = { tokenHash: "x", now: 0, idleCutoff: 0 };
    if (sequelize.getDialect() === "postgres") {
      // PostgreSQL's plan for a near-empty table may scan it; with sequential scans off it must still find an index.
      const plan = await sequelize.transaction(async (transaction) => {
        await sequelize.query("SET LOCAL enable_seqscan = off", { transaction });
        return (await sequelize.query(`EXPLAIN ${first[0]!.sql}`, { bind, type: "SELECT", transaction })) as Array<{
          "QUERY PLAN": string;
        }>;
      });
      expect(plan.map((p) => p["QUERY PLAN"]).join("\n")).toMatch(/Index Scan using \S*token_hash\S* on sessions s/);
      return;
    }
    const plan = (await sequelize.query(`EXPLAIN QUERY PLAN ${first[0]!.sql}`, {
      bind,
      type: "SELECT",
    })) as Array<{ detail: string }>;
    const onSessions = plan.map((p) => p.detail).find((d) => /\bs\b/.test(d) || /sessions/.test(d));
    expect(onSessions).toMatch(/^SEARCH s USING INDEX/);
  });
});
