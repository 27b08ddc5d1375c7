// Sign-in limits throttle whoever guesses, not the account's owner: no address limit where addresses cannot be
// trusted, a growing delay (never a lock) for browsers the account does not know, per-address and per
// account-and-address limits behind a trusted proxy, 429 with Retry-After and a sentence, and a mail to the owner.
import { afterEach, describe, expect, it, vi } from "vitest";
import * as forgotPassword from "~/routes/forgot-password";
import * as login from "~/routes/login";
import { CaughtMail } from "~/models/caught-mail.server";
import {
  ACCOUNT_RESET_MAIL_LIMIT,
  ACCOUNT_SOURCE_LIMIT,
  ADDRESS_LIMIT,
  ATTEMPT_WINDOW_MS,
  FREE_FAILURES,
  MAX_DELAY_MS,
  NOTICE_AFTER_FAILURES,
  SignInAttempt,
  startPasswordResetRequest,
  startSignInAttempt,
} from "~/models/sign-in-attempt.server";
import { settleBackgroundWork } from "~/utils/background.server";
import { env } from "~/utils/env.server";
import { callRoute, makeUser, postForm, TEST_PASSWORD } from "../support/factories";

const T0 = new Date("2030-03-04T08:00:00Z");
const SECOND = 1000;
const MINUTE = 60 * SECOND;

afterEach(async () => {
  vi.useRealTimers();
  env.trustedProxyHops = 0;
  await settleBackgroundWork();
});

/** Freezes the clock the routes read (only Date: timers, bcrypt and SQLite run as usual). */
function setClock(at: Date | number) {
  vi.useFakeTimers({ toFake: ["Date"] });
  vi.setSystemTime(at);
}

type Client = { address?: string; cookie?: string };

async function signIn(email: string, password: string, client: Client = {}) {
  const request = await postForm("/login", { email, password });
  if (client.address) request.headers.set("X-Forwarded-For", client.address);
  if (client.cookie) request.headers.set("Cookie", client.cookie);
  return callRoute(login.action, request);
}

/** The Cookie header a browser sends after a response's Set-Cookie headers. */
function cookiesFrom(headers: Headers) {
  return headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

describe("without a trusted proxy (every client looks the same)", () => {
  it("a hundred failed sign-ins with random addresses do not stop another user's right password", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    for (let i = 0; i < 100; i++)
      expect((await signIn(`guess-${i}@test.invalid`, "guess")).status, `guess ${i}`).toBe(401);
    const res = await signIn(user.email, TEST_PASSWORD);
    expect(res.status).toBe(303);
  });

  it("wrong passwords from anyone only slow the account down: the owner gets in after a second, not 15 minutes", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    for (let i = 0; i < FREE_FAILURES; i++) expect((await signIn(user.email, "not it")).status).toBe(401);
    const held = await signIn(user.email, TEST_PASSWORD);
    expect(held.status).toBe(429);
    expect(held.headers.get("Retry-After")).toBe("1");
    expect(held.data).toMatchObject({
      error: "Several sign-ins to this account have failed; wait 1 second and try again.",
      email: user.email,
    });
    expect(held.headers.get("Set-Cookie")).toBeNull();
    setClock(T0.getTime() + SECOND);
    const right = await signIn(user.email, TEST_PASSWORD);
    expect(right.status).toBe(303);
    expect(right.headers.get("Set-Cookie")).toMatch(/^__plumbline_session=/);
  });

  it("each further failure doubles the wait up to a minute; a refused try does not add to it", async () => {
    const user = await makeUser(["rigger"]);
    let now = T0.getTime();
    setClock(now);
    for (let i = 0; i < FREE_FAILURES; i++) await signIn(user.email, "not it");
    const waits: number[] = [];
    for (let k = 0; k < 9; k++) {
      const refused = await signIn(user.email, "not it");
      expect(refused.status).toBe(429);
      const wait = Number(refused.headers.get("Retry-After"));
      waits.push(wait);
      // Trying again too soon changes nothing.
      setClock((now += 500));
      expect(Number((await signIn(user.email, "not it")).headers.get("Retry-After"))).toBe(wait);
      setClock((now += wait * SECOND - 500));
      expect((await signIn(user.email, "not it")).status).toBe(401);
    }
    expect(waits).toEqual([1, 2, 4, 8, 16, 32, 60, 60, 60]);
    expect(MAX_DELAY_MS).toBe(60 * SECOND);
    // An hour of the slowest guessing is about 60 tries, well under 100 (OWASP ASVS 4.0.3, 2.2.1).
    expect(Math.ceil((60 * MINUTE) / MAX_DELAY_MS)).toBeLessThan(100);
  });

  it("the browser the owner signed in with before is not slowed by a stranger's failures", async () => {
    const user = await makeUser(["planner"]);
    setClock(T0);
    const first = await signIn(user.email, TEST_PASSWORD);
    expect(first.status).toBe(303);
    const ownBrowser = cookiesFrom(first.headers).replace(/__plumbline_session=[^;]*;?\s*/, "");
    expect(ownBrowser).toMatch(/^__plumbline_device=/);
    let now = T0.getTime();
    for (let i = 0; i < FREE_FAILURES + 4; i++) {
      setClock((now += MAX_DELAY_MS));
      expect((await signIn(user.email, "not it")).status).toBe(401);
    }
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(429);
    expect((await signIn(user.email, TEST_PASSWORD, { cookie: ownBrowser })).status).toBe(303);
    // A device cookie for one account says nothing about another.
    const other = await makeUser(["rigger"]);
    for (let i = 0; i < FREE_FAILURES; i++) await signIn(other.email, "not it");
    expect((await signIn(other.email, TEST_PASSWORD, { cookie: ownBrowser })).status).toBe(429);
  });

  it("a NUL in the e-mail is a failed sign-in with a sentence, never a 500", async () => {
    for (const email of ["a\u0000@test.invalid", "\u0000", "x'--@test.invalid"]) {
      const res = await signIn(email, "whatever");
      expect(res.status, JSON.stringify(email)).toBe(401);
      expect((res.data as { error: string }).error).toMatch(/\S/);
    }
  });

  it("attempts made at the same moment count against each other, so a burst gets exactly the free ones through", async () => {
    const burst = await Promise.all(
      Array.from({ length: 12 }, () => startSignInAttempt({ email: "burst@test.invalid", addressKey: "direct" }, T0)),
    );
    expect(burst.filter((r) => r.ok)).toHaveLength(FREE_FAILURES);
    expect(await SignInAttempt.count({ where: { accountKey: "burst@test.invalid" } })).toBe(FREE_FAILURES);
  });

  it("the owner is mailed once when failures pass the mark; an address without an account gets nothing", async () => {
    const user = await makeUser(["planner"]);
    let now = T0.getTime();
    for (let i = 0; i < NOTICE_AFTER_FAILURES + 2; i++) {
      setClock((now += MAX_DELAY_MS));
      expect((await signIn(user.email, "not it")).status).toBe(401);
      expect((await signIn("nobody-here@test.invalid", "not it")).status).toBe(401);
    }
    await settleBackgroundWork();
    const mails = await CaughtMail.findAll({ where: { organisationId: user.organisationId } });
    expect(mails.map((m) => m.subject)).toEqual(["Failed sign-ins to your Plumbline account"]);
    expect(mails[0]!.textBody).toContain(`${NOTICE_AFTER_FAILURES} attempts to sign in`);
    expect(mails[0]!.textBody).toContain("http://localhost:3000/settings");
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
});

describe("behind a trusted proxy (TRUST_PROXY=1)", () => {
  it("one address gets a fixed number of failures across accounts; other addresses go on", async () => {
    env.trustedProxyHops = 1;
    const user = await makeUser(["planner"]);
    setClock(T0);
    for (let i = 0; i < ADDRESS_LIMIT; i++)
      expect((await signIn(`spray-${i}@test.invalid`, "x", { address: "203.0.113.9" })).status).toBe(401);
    setClock(T0.getTime() + 5 * MINUTE);
    const refused = await signIn(user.email, TEST_PASSWORD, { address: "203.0.113.9" });
    expect(refused.status).toBe(429);
    expect(refused.headers.get("Retry-After")).toBe("600");
    expect(refused.data).toMatchObject({
      error: "Too many failed sign-ins from this address; wait 10 minutes and try again.",
    });
    expect((await signIn(user.email, TEST_PASSWORD, { address: "198.51.100.4" })).status).toBe(303);
    // The client's own entry is its say-so: only the one our proxy appended counts.
    expect((await signIn(user.email, TEST_PASSWORD, { address: "203.0.113.9, 198.51.100.5" })).status).toBe(303);
  });

  it("one account from one address gets a fixed number of failures; the owner elsewhere only waits the delay", async () => {
    env.trustedProxyHops = 1;
    const user = await makeUser(["planner"]);
    let now = T0.getTime();
    for (let i = 0; i < ACCOUNT_SOURCE_LIMIT; i++) {
      setClock((now += MAX_DELAY_MS));
      expect((await signIn(user.email, "not it", { address: "203.0.113.20" })).status).toBe(401);
    }
    setClock(now + MAX_DELAY_MS);
    const refused = await signIn(user.email, TEST_PASSWORD, { address: "203.0.113.20" });
    expect(refused.status).toBe(429);
    expect((refused.data as { error: string }).error).toMatch(
      /^Too many failed sign-ins to this account from here; wait \d+ minutes? and try again\.$/,
    );
    expect((await signIn(user.email, TEST_PASSWORD, { address: "198.51.100.7" })).status).toBe(303);
  });

  it("/forgot-password is limited per address, with 429, Retry-After and the same kind of sentence", async () => {
    env.trustedProxyHops = 1;
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
          expect.stringMatching(
            /^Too many password reset requests from this address; wait \d+ (seconds|minutes?) and try again\.$/,
          ),
        ],
      },
    });
    expect(Number(refused.headers.get("Retry-After"))).toBeGreaterThan(0);
    expect((await ask("203.0.113.51", "nobody-y@test.invalid")).status).toBe(200);
    expect((await ask("203.0.113.50", "not an address")).status).toBe(400);
  });
});

it("an account gets a few reset mails per window; past that the answer is the same but nothing is sent", async () => {
  const results = [];
  for (let i = 0; i < ACCOUNT_RESET_MAIL_LIMIT + 2; i++)
    results.push(
      await startPasswordResetRequest({ email: "Someone@Test.invalid", addressKey: `192.0.2.${10 + i}` }, T0),
    );
  expect(results.map((r) => r.ok && r.sendMail)).toEqual([true, true, true, false, false]);
});
