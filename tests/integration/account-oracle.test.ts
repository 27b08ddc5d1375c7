// Nobody learns from Plumbline's answers whether an address has an account: the reset form and invitations answer
// in the same words whether or not it exists and without waiting for mail; an invitation to an address registered
// with another organisation says only that it could not be sent.
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import * as adminUser from "~/routes/admin.users.$userId";
import * as newUser from "~/routes/admin.users.new";
import * as forgotPassword from "~/routes/forgot-password";
import { User } from "~/models/user.server";
import { settleBackgroundWork } from "~/utils/background.server";
import { sendMail } from "~/utils/mail.server";
import { callRoute, makeUser, postForm } from "../support/factories";

// Mail is held at a gate the test opens: an answer that waited for it would never come.
const gate = vi.hoisted(() => {
  let open: () => void = () => undefined;
  let opened = new Promise<void>((resolve) => (open = resolve));
  return {
    wait: () => opened,
    open: () => open(),
    close: () => {
      opened = new Promise<void>((resolve) => (open = resolve));
    },
  };
});
vi.mock("~/utils/mail.server", async (importOriginal) => ({
  ...(await importOriginal<typeof import("~/utils/mail.server")>()),
  sendMail: vi.fn(async () => {
    await gate.wait();
  }),
}));

beforeEach(() => {
  gate.close();
  vi.mocked(sendMail).mockClear();
});
afterEach(async () => {
  gate.open();
  await settleBackgroundWork();
});

/** The answer, or "still waiting" if it does not come within a second (it would be waiting for the mail). */
async function answerOf(pending: Promise<Awaited<ReturnType<typeof callRoute>>>) {
  const late = new Promise<"still waiting">((resolve) => setTimeout(() => resolve("still waiting"), 1000));
  return Promise.race([pending, late]);
}

describe("asking for a password reset", () => {
  it("answers a known and an unknown address alike, before any mail is sent", async () => {
    const user = await makeUser(["planner"]);
    const known = await answerOf(
      callRoute(forgotPassword.action, await postForm("/forgot-password", { email: user.email })),
    );
    const unknown = await answerOf(
      callRoute(forgotPassword.action, await postForm("/forgot-password", { email: "nobody-at-all@test.invalid" })),
    );
    expect(known).not.toBe("still waiting");
    expect(unknown).not.toBe("still waiting");
    if (known === "still waiting" || unknown === "still waiting") return;
    expect(known.status).toBe(unknown.status);
    expect(known.data).toEqual(unknown.data);
    expect([...known.headers.keys()]).toEqual([...unknown.headers.keys()]);
    gate.open();
    await settleBackgroundWork();
    expect(vi.mocked(sendMail).mock.calls.map(([mail]) => mail.to)).toEqual([`${user.name} <${user.email}>`]);
  });
});

describe("inviting a user", () => {
  it("to an address of another organisation says only that the invitation could not be sent, and changes nothing", async () => {
    const elsewhere = await makeUser(["rigger"], { email: "kept.elsewhere@test.invalid" });
    const admin = await makeUser(["admin"]);
    const before = await User.count();
    const res = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Kim", email: "Kept.Elsewhere@test.invalid", roles: "rigger" }, admin),
    );
    expect(res.status).toBe(400);
    const message = (res.data as { errors: { email: string[] } }).errors.email.join(" ");
    expect(message).toBe(
      "The invitation could not be sent to that address. Check it with the person, or use another address.",
    );
    expect(message).not.toMatch(/account|exists|registered|already|organisation/i);
    expect(await User.count()).toBe(before);
    expect((await User.findByPk(elsewhere.id))?.organisationId).toBe(elsewhere.organisationId);
    await settleBackgroundWork();
    expect(sendMail).not.toHaveBeenCalled();
  });

  it("to a new address answers before the invitation is sent, which follows", async () => {
    const admin = await makeUser(["admin"]);
    const res = await answerOf(
      callRoute(
        newUser.action,
        await postForm("/admin/users/new", { name: "Noor", email: "noor.new@test.invalid", roles: "planner" }, admin),
      ),
    );
    expect(res).not.toBe("still waiting");
    if (res === "still waiting") return;
    expect(res.status).toBe(302);
    const created = await User.findOne({ where: { email: "noor.new@test.invalid" } });
    const again = await answerOf(
      callRoute(adminUser.action, await postForm(`/admin/users/${created!.id}`, { intent: "invite" }, admin), {
        userId: String(created!.id),
      }),
    );
    expect(again).not.toBe("still waiting");
    gate.open();
    await settleBackgroundWork();
    expect(vi.mocked(sendMail).mock.calls.map(([mail]) => mail.subject)).toEqual([
      expect.stringMatching(/^You have been added to Plumbline/),
      expect.stringMatching(/^You have been added to Plumbline/),
    ]);
  });

  it("to an address already in the admin's own organisation says so (the admin sees that list anyway)", async () => {
    const admin = await makeUser(["admin"]);
    const res = await callRoute(
      newUser.action,
      await postForm("/admin/users/new", { name: "Me again", email: admin.email, roles: "rigger" }, admin),
    );
    expect(res.status).toBe(400);
    expect(res.data).toMatchObject({ errors: { email: [expect.stringMatching(/user of your organisation/)] } });
  });
});
