import crypto from "node:crypto";
import { createCookie } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { z } from "zod";
import { normaliseEmail, verifyLogin, type SessionUser } from "~/models/user.server";
import { env } from "~/utils/env.server";
import { safeText } from "~/utils/forms";

/** Thrown by the password strategy with a message safe to show on the sign-in form. */
export class SignInError extends Error {
  override name = "SignInError";
}

const credentialsSchema = z.object({
  email: safeText({ error: "Enter your e-mail address." })
    .trim()
    .min(1, "Enter your e-mail address.")
    .max(320)
    .email("Enter a valid e-mail address."),
  password: safeText({ error: "Enter your password." }).min(1, "Enter your password.").max(200),
});

export const authenticator = new Authenticator<SessionUser>();

authenticator.use(
  new FormStrategy(async ({ form }) => {
    const parsed = credentialsSchema.safeParse({ email: form.get("email"), password: form.get("password") });
    if (!parsed.success) throw new SignInError(parsed.error.issues[0]?.message ?? "Enter your e-mail and password.");
    const user = await verifyLogin(parsed.data.email, parsed.data.password);
    if (!user) throw new SignInError("That e-mail and password do not match an active account.");
    return user;
  }),
  "password",
);

/**
 * A browser that has signed in to an account before carries a signed device cookie naming it (by a hash of the
 * address). Its sign-in attempts count under their own key, so a stranger's failures on that account never slow
 * or block its owner's usual browser.
 */
const deviceCookie = createCookie(env.isProduction ? "__Host-plumbline_device" : "__plumbline_device", {
  httpOnly: true,
  sameSite: "lax",
  path: "/",
  secure: env.isProduction,
  secrets: env.sessionSecrets,
  maxAge: 365 * 24 * 60 * 60,
});

/** The accounts a device cookie may name at once (a shared workshop tablet). */
const DEVICE_ACCOUNTS = 10;

const deviceSchema = z.object({
  id: safeText().regex(/^[A-Za-z0-9_-]{22}$/),
  accounts: z.array(safeText().regex(/^[0-9a-f]{32}$/)).max(DEVICE_ACCOUNTS),
});

function accountTag(email: string) {
  return crypto.createHash("sha256").update(normaliseEmail(email)).digest("hex").slice(0, 32);
}

async function readDevice(request: Request) {
  const parsed = deviceSchema.safeParse(await deviceCookie.parse(request.headers.get("Cookie")));
  return parsed.success ? parsed.data : null;
}

/** The device key of this browser if it has signed in to `email`'s account before, else null. */
export async function deviceKeyFor(request: Request, email: string): Promise<string | null> {
  const device = await readDevice(request);
  return device?.accounts.includes(accountTag(email)) ? device.id : null;
}

/** The Set-Cookie value that marks this browser as one `email`'s owner signed in with. */
export async function rememberDevice(request: Request, email: string) {
  const device = (await readDevice(request)) ?? { id: crypto.randomBytes(16).toString("base64url"), accounts: [] };
  const tag = accountTag(email);
  const accounts = [tag, ...device.accounts.filter((a) => a !== tag)].slice(0, DEVICE_ACCOUNTS);
  return deviceCookie.serialize({ id: device.id, accounts });
}
