import { data, Form, redirect, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/login";
import { sendFailedSignInNotice } from "~/accounts/account-mail.server";
import { authenticator, deviceKeyFor, rememberDevice, SignInError } from "~/utils/auth.server";
import { Button, Field, FormError } from "~/components/ui/form";
import { runInBackground } from "~/utils/background.server";
import { requireFormData } from "~/utils/forms";
import {
  countSignInFailures,
  NOTICE_AFTER_FAILURES,
  recordSignInSuccess,
  startSignInAttempt,
} from "~/models/sign-in-attempt.server";
import { findUserByEmail } from "~/models/user.server";
import { clientAddressKey } from "~/utils/security.server";
import { getUser, newSessionCookie, safeRedirectPath } from "~/utils/session.server";

/** A refused try's Retry-After reaches the browser (a route's action headers are dropped unless it passes them on). */
export const headers: Route.HeadersFunction = ({ actionHeaders, loaderHeaders }) =>
  actionHeaders.has("Retry-After") ? actionHeaders : loaderHeaders;

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getUser(request);
  if (user) throw redirect(safeRedirectPath(new URL(request.url).searchParams.get("redirectTo")));
  return null;
}

/** After repeated failures the account's owner is told, once as the count passes the mark, after the response. */
async function noticeRepeatedFailures(email: string) {
  const failures = await countSignInFailures(email);
  if (failures !== NOTICE_AFTER_FAILURES) return;
  runInBackground("the failed sign-in notice", async () => {
    const user = await findUserByEmail(email);
    if (user?.active) await sendFailedSignInNotice(user, failures);
  });
}

export async function action({ request }: Route.ActionArgs) {
  const form = await requireFormData(request.clone());
  const redirectTo = safeRedirectPath(form.get("redirectTo"));
  const email = typeof form.get("email") === "string" ? String(form.get("email")) : "";
  const source = { addressKey: clientAddressKey(request), deviceKey: await deviceKeyFor(request, email) };
  const attempt = await startSignInAttempt({ email, ...source });
  if (!attempt.ok)
    return data(
      { error: attempt.message, email },
      { status: 429, headers: { "Retry-After": String(attempt.retryAfterSeconds) } },
    );
  try {
    const user = await authenticator.authenticate("password", request);
    await recordSignInSuccess(attempt.attemptId, email, source);
    const headers = new Headers();
    headers.append("Set-Cookie", await newSessionCookie(request, user.id));
    headers.append("Set-Cookie", await rememberDevice(request, email));
    return redirect(redirectTo, { status: 303, headers });
  } catch (error) {
    if (!(error instanceof SignInError)) throw error;
    await noticeRepeatedFailures(email);
    return data({ error: error.message, email }, { status: 401 });
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
