import { data, Form } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/forgot-password";
import { sendPasswordReset } from "~/accounts/account-mail.server";
import { Button, Field, FormError } from "~/components/ui/form";
import { parseForm, requireFormData, safeText } from "~/utils/forms";
import { startPasswordResetRequest } from "~/models/sign-in-attempt.server";
import { findUserByEmail } from "~/models/user.server";
import { runInBackground } from "~/utils/background.server";
import { clientAddressKey } from "~/utils/security.server";

/** A refused try's Retry-After reaches the browser (a route's action headers are dropped unless it passes them on). */
export const headers: Route.HeadersFunction = ({ actionHeaders, loaderHeaders }) =>
  actionHeaders.has("Retry-After") ? actionHeaders : loaderHeaders;

const schema = z.object({
  email: safeText({ error: "Enter your e-mail address." }).trim().email("Enter a valid e-mail address.").max(320),
});

export const meta: Route.MetaFunction = () => [{ title: "Reset password · Plumbline" }];

export async function action({ request }: Route.ActionArgs) {
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors, sent: false }, { status: 400 });
  const limit = await startPasswordResetRequest({ email: form.data.email, addressKey: clientAddressKey(request) });
  if (!limit.ok) {
    return data(
      { errors: { _form: [limit.message] } as Record<string, string[]>, sent: false },
      { status: 429, headers: { "Retry-After": String(limit.retryAfterSeconds) } },
    );
  }
  // The same answer in the same time either way, so the form does not reveal who has an account: looking the
  // address up and sending the mail happen after the response.
  if (limit.sendMail) {
    const { email } = form.data;
    runInBackground("the password reset mail", async () => {
      const user = await findUserByEmail(email);
      if (user?.active) await sendPasswordReset(user, request);
    });
  }
  return { errors: null, sent: true };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  return (
    <div className="mx-auto mt-8 max-w-sm">
      <h1>Reset your password</h1>
      {actionData?.sent ? (
        <p role="status" className="mt-4 rounded border border-pass/30 bg-pass-soft p-3 text-sm">
          If that address belongs to an active account, a link to choose a new password is on its way. It works once and
          expires in 72 hours.
        </p>
      ) : (
        <Form method="post" className="mt-6 space-y-4 rounded border border-rule bg-card p-5">
          <FormError message={actionData?.errors?._form?.join(" ")} />
          <Field
            label="E-mail"
            name="email"
            type="email"
            autoComplete="username"
            required
            errors={actionData?.errors?.email}
          />
          <Button type="submit" className="w-full">
            Send me a link
          </Button>
        </Form>
      )}
      <p className="mt-4 text-sm">
        <a href="/login">Back to sign in</a>
      </p>
    </div>
  );
}
