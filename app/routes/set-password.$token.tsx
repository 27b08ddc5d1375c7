import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/set-password.$token";
import { Button, Field, FormError } from "~/components/ui/form";
import { newPasswordSchema, parseForm, requireFormData, safeText } from "~/utils/forms";
import { findUsableToken, redeemPasswordToken } from "~/models/password-token.server";
import { flashNotice } from "~/utils/session.server";

const schema = z
  .object({ password: newPasswordSchema, confirm: safeText({ error: "Repeat the password." }) })
  .refine((v) => v.password === v.confirm, { message: "The two passwords differ.", path: ["confirm"] });

export const meta: Route.MetaFunction = () => [{ title: "Choose a password · Plumbline" }];

export async function loader({ params }: Route.LoaderArgs) {
  const found = await findUsableToken(params.token);
  if (!found) return { valid: false as const, name: null, email: null };
  return { valid: true as const, name: found.user.name, email: found.user.email };
}

export async function action({ request, params }: Route.ActionArgs) {
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors, error: null }, { status: 400 });
  const userId = await redeemPasswordToken(params.token, form.data.password);
  if (!userId) {
    return data({ errors: null, error: "This link has been used or has expired. Ask for a new one." }, { status: 410 });
  }
  throw redirect("/login", {
    headers: { "Set-Cookie": await flashNotice(request, "Your password is set. Sign in with it now.") },
  });
}

export default function SetPassword({ loaderData, actionData }: Route.ComponentProps) {
  if (!loaderData.valid) {
    return (
      <div className="mx-auto mt-8 max-w-sm">
        <h1>This link no longer works</h1>
        <p className="mt-3 text-ink-soft">
          Links to set a password work once and expire after 72 hours. <a href="/forgot-password">Ask for a new link</a>
          .
        </p>
      </div>
    );
  }
  return (
    <div className="mx-auto mt-8 max-w-sm">
      <h1>Choose your password</h1>
      <p className="mt-1 text-ink-soft">
        For {loaderData.name} ({loaderData.email}).
      </p>
      <Form method="post" className="mt-6 space-y-4 rounded border border-rule bg-card p-5">
        <FormError message={actionData?.error} />
        <input type="hidden" name="username" value={loaderData.email ?? ""} autoComplete="username" />
        <Field
          label="New password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          hint="At least 10 characters."
          errors={actionData?.errors?.password}
        />
        <Field
          label="Repeat it"
          name="confirm"
          type="password"
          autoComplete="new-password"
          required
          errors={actionData?.errors?.confirm}
        />
        <Button type="submit" className="w-full">
          Set password
        </Button>
      </Form>
    </div>
  );
}
