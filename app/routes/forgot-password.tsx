import { data, Form } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/forgot-password";
import { sendPasswordReset } from "~/account-mail.server";
import { Button, Field } from "~/components/ui/form";
import { parseForm } from "~/forms";
import { findUserByEmail } from "~/models/user.server";

const schema = z.object({
  email: z.string({ error: "Enter your e-mail address." }).trim().email("Enter a valid e-mail address.").max(320),
});

export const meta: Route.MetaFunction = () => [{ title: "Reset password · Plumbline" }];

export async function action({ request }: Route.ActionArgs) {
  const form = parseForm(schema, await request.formData());
  if (!form.ok) return data({ errors: form.errors, sent: false }, { status: 400 });
  const user = await findUserByEmail(form.data.email);
  if (user?.active) await sendPasswordReset(user, request);
  // The same answer either way, so the form does not reveal who has an account.
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
          <Field label="E-mail" name="email" type="email" autoComplete="username" required errors={actionData?.errors?.email} />
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
