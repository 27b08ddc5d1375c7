import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import * as forgotPassword from "~/routes/forgot-password";
import * as login from "~/routes/login";
import { env } from "~/utils/env.server";
import { getOrganisation } from "~/models/organisation.server";
import { Plan, PlanRevision } from "~/models/plan.server";
import {
  ACCOUNT_FAILURE_LIMIT,
  ADDRESS_LIMIT,
  ATTEMPT_WINDOW_MS,
  SHARED_ADDRESS_KEY,
  SHARED_ADDRESS_LIMIT,
  SignInAttempt,
  startPasswordResetRequest,
  startSignInAttempt,
} from "~/models/sign-in-attempt.server";
import { addressKeyOf, clientAddressKey, isCrossSiteMutation, securityHeaders } from "~/utils/security.server";
import { checkUpload, transactionWithFiles } from "~/utils/uploads.server";
import { createAppHandler } from "../support/app-handler";
import { callRoute, makeUser, postForm, sessionCookie, TEST_PASSWORD } from "../support/factories";
import { PNG_BYTES } from "../support/gear";
import { makePlan } from "../support/plans";

const BASE = "http://localhost:3000";
const EVIL = "https://evil.example";
const T0 = new Date("2030-03-04T08:00:00Z");
const MINUTE = 60_000;

afterEach(() => {
  vi.useRealTimers();
});

/** Freezes the clock the routes read (only Date: timers, bcrypt and SQLite run as usual). */
function setClock(at: Date) {
  vi.useFakeTimers({ toFake: ["Date"] });
  vi.setSystemTime(at);
}

async function signIn(email: string, password: string) {
  return callRoute(login.action, await postForm("/login", { email, password }));
}

describe("sign-in attempt limits", () => {
  it("the sixth attempt on an account within 15 minutes gets 429, the right password too, until the window has passed", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    for (let i = 0; i < ACCOUNT_FAILURE_LIMIT; i++) expect((await signIn(user.email, "not it")).status).toBe(401);

    const sixth = await signIn(user.email, "not it");
    expect(sixth.status).toBe(429);
    expect(sixth.data).toMatchObject({
      error: "Too many sign-in attempts for this account; try again in 15 minutes.",
      email: user.email,
    });
    expect(sixth.headers.get("Retry-After")).toBe("900");
    expect(sixth.headers.get("Set-Cookie")).toBeNull();

    const right = await signIn(user.email.toUpperCase(), TEST_PASSWORD);
    expect(right.status).toBe(429);
    expect(right.headers.get("Set-Cookie")).toBeNull();

    setClock(new Date(T0.getTime() + 14 * MINUTE + 30_000));
    expect((await signIn(user.email, TEST_PASSWORD)).data).toMatchObject({
      error: "Too many sign-in attempts for this account; try again in 1 minute.",
    });

    // Another account from the same address is not held up by this one's failures.
    const colleague = await makeUser(["rigger"]);
    expect((await signIn(colleague.email, TEST_PASSWORD)).status).toBe(303);

    setClock(new Date(T0.getTime() + ATTEMPT_WINDOW_MS + 1000));
    const later = await signIn(user.email, TEST_PASSWORD);
    expect(later.status).toBe(303);
    expect(later.headers.get("Set-Cookie")).toMatch(/^__plumbline_session=/);
  });

  it("a successful sign-in clears the account's failures", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    for (let i = 0; i < ACCOUNT_FAILURE_LIMIT - 1; i++) expect((await signIn(user.email, "not it")).status).toBe(401);
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(303);
    expect(await SignInAttempt.count({ where: { accountKey: user.email } })).toBe(0);
    for (let i = 0; i < ACCOUNT_FAILURE_LIMIT; i++) expect((await signIn(user.email, "not it")).status).toBe(401);
    expect((await signIn(user.email, "not it")).status).toBe(429);
  });

  it("one address is limited across accounts; the shared key of unknown addresses has a higher ceiling", async () => {
    for (let i = 0; i < ADDRESS_LIMIT; i++) {
      expect(await startSignInAttempt({ email: `guess-${i}@test.invalid`, addressKey: "203.0.113.9" }, T0)).toEqual({
        ok: true,
      });
    }
    const refused = await startSignInAttempt(
      { email: "one-more@test.invalid", addressKey: "203.0.113.9" },
      new Date(T0.getTime() + 5 * MINUTE),
    );
    expect(refused).toEqual({
      ok: false,
      message: "Too many sign-in attempts from this address; try again in 10 minutes.",
      retryAfterSeconds: 600,
    });
    expect(await startSignInAttempt({ email: "one-more@test.invalid", addressKey: "198.51.100.4" }, T0)).toEqual({
      ok: true,
    });
    expect(
      await startSignInAttempt(
        { email: "one-more@test.invalid", addressKey: "203.0.113.9" },
        new Date(T0.getTime() + ATTEMPT_WINDOW_MS + 1),
      ),
    ).toEqual({ ok: true });

    for (let i = 0; i < ADDRESS_LIMIT; i++)
      await startSignInAttempt({ email: `shared-${i}@test.invalid`, addressKey: SHARED_ADDRESS_KEY }, T0);
    expect((await startSignInAttempt({ email: "shared-x@test.invalid", addressKey: SHARED_ADDRESS_KEY }, T0)).ok).toBe(
      true,
    );
    expect(SHARED_ADDRESS_LIMIT).toBeGreaterThan(ADDRESS_LIMIT);
  });

  it("attempts made at the same moment count against each other, so a burst gets exactly the limit through", async () => {
    const burst = await Promise.all(
      Array.from({ length: 12 }, () =>
        startSignInAttempt({ email: "burst@test.invalid", addressKey: "192.0.2.1" }, T0),
      ),
    );
    expect(burst.filter((r) => r.ok)).toHaveLength(ACCOUNT_FAILURE_LIMIT);
    expect(await SignInAttempt.count({ where: { accountKey: "burst@test.invalid" } })).toBe(ACCOUNT_FAILURE_LIMIT);
  });

  it("rows that have left the window are pruned", async () => {
    await startSignInAttempt({ email: "old@test.invalid", addressKey: "192.0.2.2" }, T0);
    await startPasswordResetRequest({ email: "old@test.invalid", addressKey: "192.0.2.2" }, T0);
    expect(await SignInAttempt.count({ where: { addressKey: "192.0.2.2" } })).toBe(2);
    await startSignInAttempt(
      { email: "new@test.invalid", addressKey: "192.0.2.3" },
      new Date(T0.getTime() + ATTEMPT_WINDOW_MS + 1),
    );
    expect(await SignInAttempt.count({ where: { addressKey: "192.0.2.2" } })).toBe(0);
  });

  it("/forgot-password is limited per address (behind a trusted proxy), with 429 and the same sentence shape", async () => {
    const hops = env.trustedProxyHops;
    env.trustedProxyHops = 1;
    try {
      const ask = async (address: string, email: string) => {
        const request = await postForm("/forgot-password", { email });
        request.headers.set("X-Forwarded-For", `10.9.9.9, ${address}`);
        return callRoute(forgotPassword.action, request);
      };
      for (let i = 0; i < ADDRESS_LIMIT; i++)
        expect((await ask("203.0.113.50", `nobody-${i}@test.invalid`)).data).toMatchObject({ sent: true });
      const refused = await ask("203.0.113.50", "nobody-x@test.invalid");
      expect(refused.status).toBe(429);
      expect(refused.data).toMatchObject({
        sent: false,
        errors: {
          _form: [
            expect.stringMatching(/^Too many password reset requests from this address; try again in \d+ minutes?\.$/),
          ],
        },
      });
      expect(Number(refused.headers.get("Retry-After"))).toBeGreaterThan(0);
      // The client's own first entry is its say-so: only the one our proxy appended counts.
      expect((await ask("203.0.113.51", "nobody-y@test.invalid")).status).toBe(200);
      const invalid = await ask("203.0.113.50", "not an address");
      expect(invalid.status).toBe(400);
    } finally {
      env.trustedProxyHops = hops;
    }
  });

  it("an account gets a few reset mails per window; past that the answer is the same but nothing is sent", async () => {
    const results = [];
    for (let i = 0; i < 5; i++)
      results.push(
        await startPasswordResetRequest({ email: "Someone@Test.invalid", addressKey: `192.0.2.${10 + i}` }, T0),
      );
    expect(results).toEqual([
      { ok: true, sendMail: true },
      { ok: true, sendMail: true },
      { ok: true, sendMail: true },
      { ok: true, sendMail: false },
      { ok: true, sendMail: false },
    ]);
  });

  it("reads the client address from X-Forwarded-For only as far as TRUST_PROXY trusts it", () => {
    const request = (xff?: string) => new Request(`${BASE}/login`, { headers: xff ? { "X-Forwarded-For": xff } : {} });
    expect(clientAddressKey(request("203.0.113.7"), 0)).toBe("direct");
    expect(clientAddressKey(request(), 1)).toBe("direct");
    expect(clientAddressKey(request("203.0.113.7"), 1)).toBe("203.0.113.7");
    expect(clientAddressKey(request("1.1.1.1, 203.0.113.7"), 1)).toBe("203.0.113.7");
    expect(clientAddressKey(request("1.1.1.1, 203.0.113.7, 10.0.0.2"), 2)).toBe("203.0.113.7");
    expect(clientAddressKey(request("203.0.113.7"), 2)).toBe("direct");
    expect(clientAddressKey(request("not-an-address"), 1)).toBe("direct");
    expect(addressKeyOf("::ffff:203.0.113.7")).toBe("203.0.113.7");
    expect(addressKeyOf("203.0.113.7:51234")).toBe("203.0.113.7");
    expect(addressKeyOf("2001:db8:aa:bb:1:2:3:4")).toBe("2001:db8:aa:bb::/64");
    expect(addressKeyOf("[2001:db8:aa:bb::9]:443")).toBe("2001:db8:aa:bb::/64");
    expect(addressKeyOf("2001:db8::1")).toBe("2001:db8:0:0::/64");
    expect(addressKeyOf("64:ff9b::203.0.113.7")).toBe("64:ff9b:0:0::/64");
    expect(addressKeyOf("fe80::1%eth0")).toBe("fe80:0:0:0::/64");
    expect(addressKeyOf("<script>")).toBeNull();
  });
});

describe("the app as served", () => {
  let handle: (request: Request) => Promise<Response>;
  beforeAll(async () => {
    handle = await createAppHandler();
  });

  function send(pathname: string, init: { method?: string; headers?: Record<string, string>; body?: string } = {}) {
    return handle(
      new Request(BASE + pathname, { method: init.method ?? "GET", headers: init.headers, body: init.body }),
    );
  }

  const form = (fields: Record<string, string>) => new URLSearchParams(fields).toString();
  const FORM = { "Content-Type": "application/x-www-form-urlencoded" };
  const JSON_BODY = { "Content-Type": "application/json" };
  const solveBody = JSON.stringify({
    load: { massKg: 2000, cog: { x: 0, y: 0, z: 0 } },
    liftPoints: [
      { id: "A", x: -0.8, y: 0, z: 0 },
      { id: "B", x: 0.2, y: 0, z: 0 },
    ],
    hook: { z: 0.8 },
  });
  const REFUSAL = /^Plumbline refused this request because it did not come from one of its own pages\./;

  describe("cross-site requests", () => {
    it("a cross-site POST or PUT is refused with 403 before any action: sign-in, an admin action and the API; nothing is written", async () => {
      const admin = await makeUser(["admin", "planner"]);
      const cookie = await sessionCookie(admin);
      const { plan } = await makePlan(admin);
      const planBody = (await (await send(`/api/plans/${plan.id}`, { headers: { Cookie: cookie } })).json()) as Record<
        string,
        unknown
      >;
      const put = JSON.stringify({
        version: planBody.version,
        title: "Renamed from elsewhere",
        arrangement: planBody.arrangement,
        rigging: planBody.rigging,
        details: planBody.details,
      });
      const attemptsBefore = await SignInAttempt.count();

      const requests = [
        {
          path: "/login",
          method: "POST",
          headers: FORM,
          body: form({ email: admin.email, password: TEST_PASSWORD }),
          ok: 303,
        },
        {
          path: "/admin/settings",
          method: "POST",
          headers: { ...FORM, Cookie: cookie },
          body: form({ name: "Renamed works" }),
          ok: 302,
        },
        { path: `/api/plans/${plan.id}`, method: "PUT", headers: { ...JSON_BODY, Cookie: cookie }, body: put, ok: 200 },
        { path: "/api/solve", method: "POST", headers: { ...JSON_BODY, Cookie: cookie }, body: solveBody, ok: 200 },
      ];
      for (const r of requests) {
        const res = await send(r.path, { method: r.method, headers: { ...r.headers, Origin: EVIL }, body: r.body });
        expect(res.status, r.path).toBe(403);
        expect(res.headers.get("Set-Cookie"), r.path).toBeNull();
        const text = await res.text();
        if (r.path.startsWith("/api/")) expect(JSON.parse(text).error, r.path).toMatch(REFUSAL);
        else expect(text, r.path).toMatch(REFUSAL);
      }
      expect(await SignInAttempt.count()).toBe(attemptsBefore);
      expect((await getOrganisation(admin.organisationId))?.name).not.toBe("Renamed works");
      expect((await Plan.findByPk(plan.id))?.title).not.toBe("Renamed from elsewhere");
      expect((await PlanRevision.findOne({ where: { planId: plan.id } }))?.version).toBe(planBody.version);

      // The same requests from Plumbline's own pages go through.
      for (const r of requests) {
        const res = await send(r.path, { method: r.method, headers: { ...r.headers, Origin: BASE }, body: r.body });
        expect(res.status, r.path).toBe(r.ok);
      }
      expect((await getOrganisation(admin.organisationId))?.name).toBe("Renamed works");
      expect((await Plan.findByPk(plan.id))?.title).toBe("Renamed from elsewhere");
    });

    it("a data request from another site is refused too, and GET never is", async () => {
      const res = await send("/login.data", {
        method: "POST",
        headers: { ...FORM, Origin: EVIL },
        body: form({ email: "a@test.invalid", password: "x" }),
      });
      expect(res.status).toBe(403);
      expect((await send("/login", { headers: { Origin: EVIL } })).status).toBe(200);
    });

    it("without Origin the Referer decides; with neither, a request carrying cookies is refused and one without goes on", async () => {
      const admin = await makeUser(["admin"]);
      const cookie = await sessionCookie(admin);
      const settings = (headers: Record<string, string>) =>
        send("/admin/settings", {
          method: "POST",
          headers: { ...FORM, Cookie: cookie, ...headers },
          body: form({ name: "Via referer" }),
        });
      expect((await settings({ Referer: `${EVIL}/page` })).status).toBe(403);
      expect((await settings({})).status).toBe(403);
      expect((await getOrganisation(admin.organisationId))?.name).not.toBe("Via referer");
      expect((await settings({ Referer: `${BASE}/admin/settings` })).status).toBe(302);
      expect((await getOrganisation(admin.organisationId))?.name).toBe("Via referer");
      const anonymous = await send("/login", {
        method: "POST",
        headers: FORM,
        body: form({ email: admin.email, password: "not it" }),
      });
      expect(anonymous.status).toBe(401);
    });

    it("refuses an opaque or malformed Origin and accepts PUBLIC_URL's origin behind a TLS proxy", () => {
      const post = (headers: Record<string, string>, url = `${BASE}/login`) =>
        new Request(url, { method: "POST", headers });
      expect(isCrossSiteMutation(post({ Origin: "null" }), null)).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "::::" }), null)).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "http://localhost:3001" }), null)).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "https://localhost:3000" }), null)).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: BASE }), null)).toBe(false);
      const proxied = post({ Origin: "https://plumbline.example.com" }, "http://plumbline.example.com/login");
      expect(isCrossSiteMutation(proxied, null)).toBe(true);
      expect(isCrossSiteMutation(proxied, "https://plumbline.example.com")).toBe(false);
      expect(
        isCrossSiteMutation(new Request(`${BASE}/login`, { headers: { Origin: EVIL, Cookie: "x=1" } }), null),
      ).toBe(false);
    });
  });

  describe("security headers", () => {
    function expectCommonHeaders(res: Response) {
      expect(res.headers.get("X-Content-Type-Options")).toBe("nosniff");
      expect(res.headers.get("Referrer-Policy")).toBe("same-origin");
      expect(res.headers.get("X-Frame-Options")).toBe("DENY");
      expect(res.headers.get("Permissions-Policy")).toBe("camera=(), microphone=(), geolocation=()");
      expect(res.headers.get("Cross-Origin-Opener-Policy")).toBe("same-origin");
      // Not production: the demo and development are served over plain http.
      expect(res.headers.get("Strict-Transport-Security")).toBeNull();
    }

    it("a page carries a CSP whose nonce is on every inline script, fresh for each response", async () => {
      const user = await makeUser(["planner"]);
      const res = await send("/", { headers: { Cookie: await sessionCookie(user) } });
      expect(res.status).toBe(200);
      expect(res.headers.get("Content-Type")).toMatch(/^text\/html/);
      expectCommonHeaders(res);
      const csp = res.headers.get("Content-Security-Policy") ?? "";
      const nonce = csp.match(/script-src 'self' 'nonce-([A-Za-z0-9+/=]{22,})'/)?.[1];
      expect(nonce).toBeDefined();
      for (const directive of [
        "default-src 'self'",
        "img-src 'self' data: blob:",
        "style-src 'self' 'unsafe-inline'",
        "font-src 'self'",
        "connect-src 'self'",
        "frame-ancestors 'none'",
        "base-uri 'self'",
        "form-action 'self'",
        "object-src 'none'",
      ]) {
        expect(csp).toContain(directive);
      }
      const html = await res.text();
      const scripts = html.match(/<script\b[^>]*>/g) ?? [];
      expect(scripts.length).toBeGreaterThan(1);
      for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
      const again = await send("/login");
      expect(again.headers.get("Content-Security-Policy")).not.toContain(nonce!);
    });

    it("API answers, data requests, refusals and the not-found page carry them too", async () => {
      const user = await makeUser(["planner"]);
      const cookie = await sessionCookie(user);
      const solved = await send("/api/solve", {
        method: "POST",
        headers: { ...JSON_BODY, Cookie: cookie, Origin: BASE },
        body: solveBody,
      });
      expect(solved.status).toBe(200);
      expect(solved.headers.get("Content-Security-Policy")).toMatch(/^default-src 'self'/);
      expectCommonHeaders(solved);
      for (const res of [
        // The root's data URL (future.v8_trailingSlashAwareDataRequests; it was /_root.data).
        await send("/_.data", { headers: { Cookie: cookie } }),
        await send("/api/solve", { method: "POST", headers: { ...JSON_BODY, Origin: EVIL }, body: solveBody }),
        await send("/no/such/page", { headers: { Cookie: cookie } }),
      ]) {
        expect(res.headers.get("Content-Security-Policy")).toMatch(/^default-src 'self'/);
        expectCommonHeaders(res);
      }
      expect(securityHeaders("n", true)["Strict-Transport-Security"]).toBe("max-age=31536000");
    });

    it("a stored file keeps its own stricter CSP and gets the other headers", async () => {
      const user = await makeUser(["admin"]);
      const checked = await checkUpload(new File([PNG_BYTES as Uint8Array<ArrayBuffer>], "photo.png"), ["png"]);
      if (!checked.ok) throw new Error(checked.message);
      const file = await transactionWithFiles((_t, store) =>
        store(checked.upload, { organisationId: user.organisationId, purpose: "drawing", uploadedBy: user.id }),
      );
      const res = await send(`/files/${file.id}`, { headers: { Cookie: await sessionCookie(user) } });
      expect(res.status).toBe(200);
      expect(res.headers.get("Content-Security-Policy")).toBe("default-src 'none'; sandbox");
      expectCommonHeaders(res);
    });
  });
});
