import { data, Form, redirect, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/login";
import { authenticator, SignInError } from "~/utils/auth.server";
import { Button, Field, FormError } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { clearSignInFailures, startSignInAttempt } from "~/models/sign-in-attempt.server";
import { clientAddressKey } from "~/utils/security.server";
import { createUserSession, getUser, safeRedirectPath } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getUser(request);
  if (user) throw redirect(safeRedirectPath(new URL(request.url).searchParams.get("redirectTo")));
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const form = await requireFormData(request.clone());
  const redirectTo = safeRedirectPath(form.get("redirectTo"));
  const email = typeof form.get("email") === "string" ? String(form.get("email")) : "";
  const attempt = await startSignInAttempt({ email, addressKey: clientAddressKey(request) });
  if (!attempt.ok)
    return data(
      { error: attempt.message, email },
      { status: 429, headers: { "Retry-After": String(attempt.retryAfterSeconds) } },
    );
  try {
    const user = await authenticator.authenticate("password", request);
    await clearSignInFailures(email);
    return createUserSession(request, user.id, redirectTo);
  } catch (error) {
    if (error instanceof SignInError) return data({ error: error.message, email }, { status: 401 });
    throw error;
  }
}

export default function Login({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const navigation = useNavigation();
  return (
    <div className="mx-auto mt-8 max-w-sm">
      <h1>Sign in</h1>
      <p className="mt-1 text-ink-soft">Lift plans for heavy component installs.</p>
      <Form method="post" className="mt-6 space-y-4 rounded border border-rule bg-card p-5">
        <FormError message={actionData?.error} />
        <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? "/"} />
        <Field
          label="E-mail"
          name="email"
          type="email"
          autoComplete="username"
          required
          defaultValue={actionData?.email}
        />
        <Field label="Password" name="password" type="password" autoComplete="current-password" required />
        <Button type="submit" className="w-full" disabled={navigation.state === "submitting"}>
          {navigation.state === "submitting" ? "Signing in…" : "Sign in"}
        </Button>
        <p className="text-sm">
          <a href="/forgot-password">Forgotten your password?</a>
        </p>
      </Form>
    </div>
  );
}
