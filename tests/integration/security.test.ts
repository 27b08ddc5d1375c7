import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import * as forgotPassword from "~/routes/forgot-password";
import { CaughtMail } from "~/models/caught-mail.server";
import { getOrganisation, updateOrganisationSettings } from "~/models/organisation.server";
import { Plan, PlanRevision } from "~/models/plan.server";
import { SignInAttempt } from "~/models/sign-in-attempt.server";
import { getActiveSessionUser } from "~/models/user.server";
import { settleBackgroundWork } from "~/utils/background.server";
import { addressKeyOf, clientAddressKey, isCrossSiteMutation, securityHeaders } from "~/utils/security.server";
import { checkUpload, transactionWithFiles } from "~/utils/uploads.server";
import { createAppHandler } from "../support/app-handler";
import { callRoute, makeUser, sessionCookie, TEST_PASSWORD } from "../support/factories";
import { PNG_BYTES } from "../support/gear";
import { makePlan } from "../support/plans";

const BASE = "http://localhost:3000";
const EVIL = "https://evil.example";

afterEach(() => {
  vi.useRealTimers();
});

describe("the client's address", () => {
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

describe("the Host header decides nothing", () => {
  it("a reset link in mail names PUBLIC_URL's origin (here the listening address) whatever Host the request gave", async () => {
    const user = await makeUser(["planner"]);
    const request = new Request("http://evil.example/forgot-password", {
      method: "POST",
      body: new URLSearchParams({ email: user.email }),
      headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: "http://evil.example" },
    });
    expect((await callRoute(forgotPassword.action, request)).data).toMatchObject({ sent: true });
    await settleBackgroundWork();
    const [mail] = await CaughtMail.findAll({ where: { organisationId: user.organisationId } });
    expect(mail?.textBody).toMatch(/http:\/\/localhost:3000\/set-password\/[A-Za-z0-9_-]+/);
    expect(mail?.textBody).not.toContain("evil.example");
  });

  it("the same-origin check compares with PUBLIC_URL's origin, not with the origin the Host header claims", async () => {
    const handle = await createAppHandler();
    const admin = await makeUser(["admin"]);
    const forged = await handle(
      new Request("http://evil.example/admin/settings", {
        method: "POST",
        body: new URLSearchParams({ name: "Renamed via Host" }),
        headers: {
          "Content-Type": "application/x-www-form-urlencoded",
          Origin: "http://evil.example",
          Cookie: await sessionCookie(admin),
        },
      }),
    );
    expect(forged.status).toBe(403);
    expect((await getOrganisation(admin.organisationId))?.name).not.toBe("Renamed via Host");
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
      expect(isCrossSiteMutation(post({ Origin: "null" }))).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "::::" }))).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "http://localhost:3001" }))).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "https://localhost:3000" }))).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: BASE }))).toBe(false);
      // Outside production a loopback origin's other names on the same port are the same server (the demo is
      // opened as localhost or 127.0.0.1); another port, scheme or host is not.
      expect(isCrossSiteMutation(post({ Origin: "http://127.0.0.1:3000" }), "http://localhost:3000")).toBe(false);
      expect(isCrossSiteMutation(post({ Origin: "http://[::1]:3000" }), "http://localhost:3000")).toBe(false);
      expect(isCrossSiteMutation(post({ Origin: "http://127.0.0.1:3001" }), "http://localhost:3000")).toBe(true);
      expect(isCrossSiteMutation(post({ Origin: "http://127.0.0.2.example:3000" }), "http://localhost:3000")).toBe(
        true,
      );
      expect(isCrossSiteMutation(post({ Origin: "http://localhost:3000" }), "https://plumbline.example.com")).toBe(
        true,
      );
      // Behind a TLS proxy the request URL says http; PUBLIC_URL says what the browser sees.
      const proxied = post({ Origin: "https://plumbline.example.com" }, "http://plumbline.example.com/login");
      expect(isCrossSiteMutation(proxied, "http://localhost:3000")).toBe(true);
      expect(isCrossSiteMutation(proxied, "https://plumbline.example.com")).toBe(false);
      expect(isCrossSiteMutation(new Request(`${BASE}/login`, { headers: { Origin: EVIL, Cookie: "x=1" } }))).toBe(
        false,
      );
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
        "worker-src 'self'",
        "manifest-src 'self'",
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

  describe("methods", () => {
    it("a method no page takes gets 405 with Allow before any action runs, on a form route too", async () => {
      const user = await makeUser(["planner"]);
      const cookie = await sessionCookie(user);
      for (const [method, path] of [
        ["DELETE", "/settings"],
        ["PUT", "/settings"],
        ["PATCH", "/sites/new"],
        ["OPTIONS", "/"],
        ["PROPFIND", "/login"],
      ] as const) {
        const res = await send(path, {
          method,
          headers: { ...FORM, Cookie: cookie, Origin: BASE },
          body: method === "OPTIONS" ? undefined : form({ intent: "units", units: "imperial", name: "Via " + method }),
        });
        expect(res.status, `${method} ${path}`).toBe(405);
        expect(res.headers.get("Allow"), `${method} ${path}`).toBe("GET, HEAD, POST");
        // React Router refuses methods outside the fetch standard's list itself, with its error page.
        if (!["OPTIONS", "PROPFIND"].includes(method))
          expect(await res.text()).toMatch(/^Plumbline's pages do not take \w+ requests/);
        expect(res.headers.get("X-Content-Type-Options")).toBe("nosniff");
      }
      expect((await getActiveSessionUser(user.id))?.units).toBe("metric");
    });

    it("a POST to a page without a form, and a wrong method on the API, say which methods they take", async () => {
      const user = await makeUser(["planner"]);
      const cookie = await sessionCookie(user);
      const reference = await send("/reference", {
        method: "POST",
        headers: { ...FORM, Cookie: cookie, Origin: BASE },
      });
      expect(reference.status).toBe(405);
      expect(reference.headers.get("Allow")).toBe("GET, HEAD");
      const ping = await send("/api/ping", { method: "DELETE", headers: { Cookie: cookie, Origin: BASE } });
      expect(ping.status).toBe(405);
      expect(ping.headers.get("Allow")).toBe("GET, HEAD");
      expect(await ping.json()).toEqual({ error: "This address answers GET only, not DELETE." });
      const solve = await send("/api/solve", { method: "DELETE", headers: { Cookie: cookie, Origin: BASE } });
      expect(solve.status).toBe(405);
      expect(solve.headers.get("Allow")).toBe("POST");
    });
  });

  describe("caching", () => {
    it("signed-in pages, data requests, API answers and the sign-in page are never stored", async () => {
      const user = await makeUser(["admin", "planner"]);
      const cookie = await sessionCookie(user);
      await updateOrganisationSettings(user.organisationId, { name: "Cache test", allowSelfApproval: false });
      for (const [path, headers] of [
        ["/", { Cookie: cookie }],
        ["/settings", { Cookie: cookie }],
        ["/admin", { Cookie: cookie }],
        ["/_.data", { Cookie: cookie }],
        ["/api/ping", { Cookie: cookie }],
        ["/api/plans", { Cookie: cookie }],
        ["/api/ping", {}],
        ["/login", {}],
        ["/no/such/page", { Cookie: cookie }],
      ] as const) {
        const res = await send(path, { headers });
        expect(res.headers.get("Cache-Control"), path).toBe("no-store");
      }
      const solved = await send("/api/solve", {
        method: "POST",
        headers: { ...JSON_BODY, Cookie: cookie, Origin: BASE },
        body: solveBody,
      });
      expect(solved.headers.get("Cache-Control")).toBe("no-store");
    });
  });
});
