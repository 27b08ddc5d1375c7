import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { z } from "zod";
import { verifyLogin, type SessionUser } from "~/models/user.server";
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
