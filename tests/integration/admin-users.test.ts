import { describe, expect, it } from "vitest";
import * as newUser from "~/routes/admin.users.new";
import * as editUser from "~/routes/admin.users.$userId";
import * as outbox from "~/routes/admin.outbox";
import * as setPasswordRoute from "~/routes/set-password.$token";
import * as forgot from "~/routes/forgot-password";
import * as settings from "~/routes/settings";
import * as login from "~/routes/login";
import { CaughtMail, listCaughtMail } from "~/models/caught-mail.server";
import {
  PasswordToken,
  TOKEN_LIFETIME_MS,
  findUsableToken,
  issuePasswordToken,
  redeemPasswordToken,
} from "~/models/password-token.server";
import { User, findUserByEmail, getActiveSessionUser, verifyPassword } from "~/models/user.server";
import { AuditEvent } from "~/models/audit-event.server";
import { settleBackgroundWork } from "~/utils/background.server";
import { callRoute, getRequest, makeUser, postForm, TEST_PASSWORD } from "../support/factories";

function linkIn(text: string) {
  const match = text.match(/http:\/\/localhost:3000(\/set-password\/[A-Za-z0-9_-]+)/);
  if (!match) throw new Error(`no link in: ${text}`);
  return { path: match[1]!, token: match[1]!.split("/").pop()! };
}

describe("an admin adds a user", () => {
  it("creates the user with their roles, e-mails a single-use link, and the link sets a password", async () => {
    const admin = await makeUser(["admin"], { name: "Ada Admin" });
    const res = await callRoute(
      newUser.action,
      await postForm(
        "/admin/users/new",
        { name: "Nia New", email: "Nia.New@Test.invalid", roles: ["planner", "rigger"] },
        admin,
      ),
    );
    expect(res.status).toBe(302);
    const created = await findUserByEmail("nia.new@test.invalid");
    expect(created?.organisationId).toBe(admin.organisationId);
    expect((await getActiveSessionUser(created!.id))?.roles).toEqual(["planner", "rigger"]);

    await settleBackgroundWork();
    const [mail] = await listCaughtMail(admin.organisationId);
    expect(mail?.toAddress).toContain("nia.new@test.invalid");
    expect(mail?.subject).toMatch(/added to Plumbline/);
    const { path, token } = linkIn(mail!.textBody);

    const page = await callRoute(setPasswordRoute.loader, await getRequest(path), { token });
    expect(page.data).toMatchObject({ valid: true, email: "nia.new@test.invalid" });

    const set = await callRoute(
      setPasswordRoute.action,
      await postForm(path, { password: "a-new-password-1", confirm: "a-new-password-1" }),
      { token },
    );
    expect(set.status).toBe(302);
    expect(await verifyPassword(created!.id, "a-new-password-1")).toBe(true);
    const signIn = await callRoute(
      login.action,
      await postForm("/login", { email: "nia.new@test.invalid", password: "a-new-password-1" }),
    );
    expect(signIn.status).toBe(303);

    const again = await callRoute(
      setPasswordRoute.action,
      await postForm(path, { password: "another-password", confirm: "another-password" }),
      { token },
    );
    expect(again.status).toBe(410);
    expect(await verifyPassword(created!.id, "another-password")).toBe(false);
  });

  it("refuses a user without roles or with a taken address, writing nothing", async () => {
    const admin = await makeUser(["admin"]);
    const before = await User.count();
    const noRoles = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "X", email: "x@test.invalid" }, admin),
    );
    expect(noRoles.status).toBe(400);
    expect(noRoles.data).toMatchObject({ errors: { roles: ["Give the user at least one role."] } });
    const taken = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Y", email: admin.email, roles: "rigger" }, admin),
    );
    expect(taken.status).toBe(400);
    const badRole = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Z", email: "z@test.invalid", roles: "superuser" }, admin),
    );
    expect(badRole.status).toBe(400);
    expect(await User.count()).toBe(before);
    await settleBackgroundWork();
    expect(await CaughtMail.count({ where: { organisationId: admin.organisationId } })).toBe(0);
  });

  it("is for admins only", async () => {
    const planner = await makeUser(["planner"]);
    const res = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "X", email: "x2@test.invalid", roles: "rigger" }, planner),
    );
    expect(res.status).toBe(403);
    expect(await findUserByEmail("x2@test.invalid")).toBeNull();
  });
});

describe("an admin manages users", () => {
  it("changes roles and deactivates, with each change in the audit trail", async () => {
    const admin = await makeUser(["admin"]);
    const user = await makeUser(["rigger"], { organisationId: admin.organisationId });
    const roles = await callRoute(
      editUser.action,
      await postForm(`/admin/users/${user.id}`, { intent: "roles", roles: ["planner", "approver"] }, admin),
      { userId: String(user.id) },
    );
    expect(roles.status).toBe(302);
    expect((await getActiveSessionUser(user.id))?.roles).toEqual(["planner", "approver"]);
    const off = await callRoute(
      editUser.action,
      await postForm(`/admin/users/${user.id}`, { intent: "deactivate" }, admin),
      { userId: String(user.id) },
    );
    expect(off.status).toBe(302);
    expect(await getActiveSessionUser(user.id)).toBeNull();
    expect(await User.findByPk(user.id)).not.toBeNull();
    const actions = (
      await AuditEvent.findAll({ where: { entity: "user", entityId: user.id }, order: [["id", "ASC"]] })
    ).map((e) => e.action);
    expect(actions).toEqual(["created", "roles changed", "deactivated"]);
  });

  it("keeps at least one admin and never lets an admin deactivate themself", async () => {
    const admin = await makeUser(["admin"]);
    const drop = await callRoute(
      editUser.action,
      await postForm(`/admin/users/${admin.id}`, { intent: "roles", roles: "planner" }, admin),
      { userId: String(admin.id) },
    );
    expect(drop.status).toBe(400);
    expect((await getActiveSessionUser(admin.id))?.roles).toEqual(["admin"]);
    const self = await callRoute(
      editUser.action,
      await postForm(`/admin/users/${admin.id}`, { intent: "deactivate" }, admin),
      { userId: String(admin.id) },
    );
    expect(self.status).toBe(400);
    expect(await getActiveSessionUser(admin.id)).not.toBeNull();
  });

  it("cannot see or change a user of another organisation", async () => {
    const admin = await makeUser(["admin"]);
    const stranger = await makeUser(["rigger"]);
    const page = await callRoute(editUser.loader, await getRequest(`/admin/users/${stranger.id}`, admin), {
      userId: String(stranger.id),
    });
    expect(page.status).toBe(404);
    const change = await callRoute(
      editUser.action,
      await postForm(`/admin/users/${stranger.id}`, { intent: "deactivate" }, admin),
      { userId: String(stranger.id) },
    );
    expect(change.status).toBe(404);
    expect(await getActiveSessionUser(stranger.id)).not.toBeNull();
  });

  it("reads only its own organisation's caught mail in the outbox", async () => {
    const admin = await makeUser(["admin"]);
    const other = await makeUser(["admin"]);
    await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Mine", email: "mine@test.invalid", roles: "rigger" }, admin),
    );
    await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Theirs", email: "theirs@test.invalid", roles: "rigger" }, other),
    );
    await settleBackgroundWork();
    const res = await callRoute(outbox.loader, await getRequest("/admin/outbox", admin));
    const messages = (res.data as { messages: Array<{ to: string }> }).messages;
    expect(messages.map((m) => m.to)).toEqual([expect.stringContaining("mine@test.invalid")]);
  });
});

describe("password links", () => {
  it("expire after 72 hours", async () => {
    const user = await makeUser(["rigger"]);
    const issuedAt = new Date("2026-01-01T00:00:00Z");
    const token = await issuePasswordToken(user.id, "reset", issuedAt);
    expect(await findUsableToken(token, new Date(issuedAt.getTime() + TOKEN_LIFETIME_MS - 1000))).not.toBeNull();
    expect(await findUsableToken(token, new Date(issuedAt.getTime() + TOKEN_LIFETIME_MS + 1000))).toBeNull();
    expect(
      await redeemPasswordToken(token, "late-password-1", new Date(issuedAt.getTime() + TOKEN_LIFETIME_MS + 1000)),
    ).toBeNull();
  });

  it("store only a hash of the token", async () => {
    const user = await makeUser(["rigger"]);
    const token = await issuePasswordToken(user.id, "invite");
    const rows = await PasswordToken.findAll({ where: { userId: user.id } });
    expect(rows).toHaveLength(1);
    expect(rows[0]!.tokenHash).not.toContain(token);
  });

  it("a reset request mails a link for a known address and answers the same for an unknown one", async () => {
    const user = await makeUser(["planner"]);
    const known = await callRoute(forgot.action, await postForm("/forgot-password", { email: user.email }));
    const unknown = await callRoute(forgot.action, await postForm("/forgot-password", { email: "ghost@test.invalid" }));
    expect(known.data).toEqual(unknown.data);
    await settleBackgroundWork();
    const mails = await listCaughtMail(user.organisationId);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe("Reset your Plumbline password");
    const { token } = linkIn(mails[0]!.textBody);
    expect(await redeemPasswordToken(token, "reset-password-1")).toBe(user.id);
    expect(await verifyPassword(user.id, "reset-password-1")).toBe(true);
  });

  it("refuses mismatched or short passwords without spending the link", async () => {
    const user = await makeUser(["planner"]);
    const token = await issuePasswordToken(user.id, "reset");
    const short = await callRoute(
      setPasswordRoute.action,
      await postForm(`/set-password/${token}`, { password: "short", confirm: "short" }),
      { token },
    );
    expect(short.status).toBe(400);
    const differ = await callRoute(
      setPasswordRoute.action,
      await postForm(`/set-password/${token}`, { password: "long-enough-1", confirm: "long-enough-2" }),
      { token },
    );
    expect(differ.status).toBe(400);
    expect(await findUsableToken(token)).not.toBeNull();
  });
});

describe("settings", () => {
  it("changes the unit preference", async () => {
    const user = await makeUser(["planner"]);
    const res = await callRoute(
      settings.action,
      await postForm("/settings", { intent: "units", units: "imperial" }, user),
    );
    expect(res.status).toBe(302);
    expect((await getActiveSessionUser(user.id))?.units).toBe("imperial");
    const bad = await callRoute(
      settings.action,
      await postForm("/settings", { intent: "units", units: "cubits" }, user),
    );
    expect(bad.status).toBe(400);
    expect((await getActiveSessionUser(user.id))?.units).toBe("imperial");
  });

  it("changes the password only with the current one", async () => {
    const user = await makeUser(["planner"]);
    const wrong = await callRoute(
      settings.action,
      await postForm(
        "/settings",
        { intent: "password", current: "nope", password: "brand-new-pass", confirm: "brand-new-pass" },
        user,
      ),
    );
    expect(wrong.status).toBe(400);
    expect(await verifyPassword(user.id, TEST_PASSWORD)).toBe(true);
    const right = await callRoute(
      settings.action,
      await postForm(
        "/settings",
        { intent: "password", current: TEST_PASSWORD, password: "brand-new-pass", confirm: "brand-new-pass" },
        user,
      ),
    );
    expect(right.status).toBe(302);
    expect(await verifyPassword(user.id, "brand-new-pass")).toBe(true);
  });
});
