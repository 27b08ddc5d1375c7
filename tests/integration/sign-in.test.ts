import { describe, expect, it } from "vitest";
import * as login from "~/routes/login";
import * as logout from "~/routes/logout";
import * as adminHome from "~/routes/admin._index";
import * as dashboard from "~/routes/_index";
import * as ping from "~/routes/api.ping";
import { setUserActive } from "~/models/user.server";
import { getUser, safeRedirectPath } from "~/utils/session.server";
import { callRoute, getRequest, makeUser, postForm, TEST_PASSWORD } from "../support/factories";

describe("signing in", () => {
  it("a user with the right password gets a 303 and an httpOnly, SameSite=Lax session cookie", async () => {
    const user = await makeUser(["planner"]);
    const res = await callRoute(
      login.action,
      await postForm("/login", { email: user.email, password: TEST_PASSWORD, redirectTo: "/jobs" }),
    );
    expect(res.status).toBe(303);
    expect(res.headers.get("Location")).toBe("/jobs");
    const cookie = res.headers.get("Set-Cookie") ?? "";
    expect(cookie).toMatch(/^__plumbline_session=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const signedIn = await getUser(new Request("http://localhost/", { headers: { Cookie: cookie.split(";")[0]! } }));
    expect(signedIn?.id).toBe(user.id);
  });

  it("accepts the e-mail in any case and with spaces around it", async () => {
    const user = await makeUser(["rigger"]);
    const res = await callRoute(
      login.action,
      await postForm("/login", { email: `  ${user.email.toUpperCase()} `, password: TEST_PASSWORD }),
    );
    expect(res.status).toBe(303);
  });

  it("a wrong password gets the form again with a clear message and 401", async () => {
    const user = await makeUser(["planner"]);
    const res = await callRoute(login.action, await postForm("/login", { email: user.email, password: "not it" }));
    expect(res.status).toBe(401);
    expect(res.data).toMatchObject({
      error: "That e-mail and password do not match an active account.",
      email: user.email,
    });
    expect(res.headers.get("Set-Cookie")).toBeNull();
  });

  it("an unknown address gets the same message as a wrong password", async () => {
    const res = await callRoute(
      login.action,
      await postForm("/login", { email: "nobody@test.invalid", password: "whatever" }),
    );
    expect(res.status).toBe(401);
    expect(res.data).toMatchObject({ error: "That e-mail and password do not match an active account." });
  });

  it("an empty form is refused with what to fill in", async () => {
    const res = await callRoute(login.action, await postForm("/login", {}));
    expect(res.status).toBe(401);
    expect((res.data as { error: string }).error).toMatch(/e-mail/i);
  });

  it("a deactivated user can no longer sign in, and their open session stops working", async () => {
    const admin = await makeUser(["admin"]);
    const user = await makeUser(["rigger"], { organisationId: admin.organisationId });
    const before = await getRequest("/", user);
    await setUserActive(admin.organisationId, user.id, false, admin.id);
    const res = await callRoute(login.action, await postForm("/login", { email: user.email, password: TEST_PASSWORD }));
    expect(res.status).toBe(401);
    const page = await callRoute(dashboard.loader, before);
    expect(page.status).toBe(302);
    expect(page.headers.get("Location")).toMatch(/^\/login/);
  });

  it("redirectTo is honoured only for same-site paths", async () => {
    const user = await makeUser(["planner"]);
    for (const target of ["https://evil.example/", "//evil.example/x", "/\\evil.example", "javascript:alert(1)"]) {
      const res = await callRoute(
        login.action,
        await postForm("/login", { email: user.email, password: TEST_PASSWORD, redirectTo: target }),
      );
      expect(res.headers.get("Location"), target).toBe("/");
    }
    expect(safeRedirectPath("/jobs/3?tab=lifts")).toBe("/jobs/3?tab=lifts");
    expect(safeRedirectPath(undefined, "/x")).toBe("/x");
  });

  it("sign-out is a POST that clears the session; a GET only goes home", async () => {
    const user = await makeUser(["planner"]);
    const res = await callRoute(logout.action, await postForm("/logout", {}, user));
    expect(res.status).toBe(303);
    expect(res.headers.get("Location")).toBe("/login");
    expect(res.headers.get("Set-Cookie")).toMatch(/Expires=Thu, 01 Jan 1970/);
    const get = await callRoute(logout.loader, await getRequest("/logout", user));
    expect(get.status).toBe(302);
    expect(get.headers.get("Location")).toBe("/");
  });
});

describe("guards", () => {
  it("an anonymous page request is sent to sign in, remembering where it was going", async () => {
    const res = await callRoute(dashboard.loader, await getRequest("/?x=1"));
    expect(res.status).toBe(302);
    expect(res.headers.get("Location")).toBe("/login?redirectTo=%2F%3Fx%3D1");
  });

  it("an anonymous API request gets 401 JSON", async () => {
    const res = await callRoute(ping.loader, new Request("http://localhost:3000/api/ping"));
    expect(res.status).toBe(401);
    expect(res.headers.get("Content-Type")).toMatch(/application\/json/);
    expect(res.data).toEqual({ error: expect.stringMatching(/sign in/i) });
  });

  it("a rigger at /admin gets a 403 that names the Admin role", async () => {
    const rigger = await makeUser(["rigger"]);
    const res = await callRoute(adminHome.loader, await getRequest("/admin", rigger));
    expect(res.status).toBe(403);
    expect((res.data as { message: string }).message).toMatch(/needs the Admin role/);
  });

  it("a user holding several roles gets in through any of them", async () => {
    const user = await makeUser(["rigger", "admin"]);
    const res = await callRoute(adminHome.loader, await getRequest("/admin", user));
    expect(res.status).toBe(200);
  });
});
