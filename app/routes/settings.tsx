import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { Button, Card, Field, FormError, PageHeader, SelectField } from "~/components/ui/form";
import { newPasswordSchema, parseForm, requireFormData, safeText } from "~/utils/forms";
import { endUserSession, endUserSessions, listUserSessions } from "~/models/session.server";
import { changePassword, setUnits, verifyPassword } from "~/models/user.server";
import { ROLE_DUTIES, ROLE_LABELS } from "~/utils/roles";
import { flashNotice, newSessionCookie, requireUserSession, sessionLifetimes } from "~/utils/session.server";
import { SessionList } from "~/components/session-list";

const schema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("units"),
    units: z.enum(["metric", "imperial"], { error: "Choose metric or imperial." }),
  }),
  z
    .object({
      intent: z.literal("password"),
      current: safeText({ error: "Enter your current password." }).min(1, "Enter your current password."),
      password: newPasswordSchema,
      confirm: safeText({ error: "Repeat the new password." }),
    })
    .refine((v) => v.password === v.confirm, { message: "The two new passwords differ.", path: ["confirm"] }),
  z.object({
    intent: z.literal("end-session"),
    sessionId: z.coerce.number({ error: "Choose a session to end." }).int().positive("Choose a session to end."),
  }),
  z.object({ intent: z.literal("end-other-sessions") }),
]);

export const meta: Route.MetaFunction = () => [{ title: "Settings · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const { user, sessionId } = await requireUserSession(request);
  const sessions = await listUserSessions(user.id, sessionLifetimes());
  return { user, sessions, currentSessionId: sessionId };
}

export async function action({ request }: Route.ActionArgs) {
  const { user, sessionId } = await requireUserSession(request);
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const back = async (notice: string) =>
    redirect("/settings", { headers: { "Set-Cookie": await flashNotice(request, notice) } });
  if (form.data.intent === "end-session") {
    if (form.data.sessionId === sessionId)
      return data({ errors: { session: ["To end this browser's session, sign out."] } }, { status: 400 });
    if (!(await endUserSession(user.id, form.data.sessionId)))
      return data({ errors: { session: ["That session has already ended."] } }, { status: 400 });
    return back("That session is ended; the browser that held it must sign in again.");
  }
  if (form.data.intent === "end-other-sessions") {
    const ended = await endUserSessions(user.id, { exceptSessionId: sessionId });
    return back(ended === 1 ? "One other session is ended." : `${ended} other sessions are ended.`);
  }
  if (form.data.intent === "units") {
    await setUnits(user.id, form.data.units);
    const notice =
      form.data.units === "metric"
        ? "Figures now show in millimetres and kilograms."
        : "Figures now show in inches and pounds.";
    throw redirect("/settings", { headers: { "Set-Cookie": await flashNotice(request, notice) } });
  }
  if (!(await verifyPassword(user.id, form.data.current))) {
    return data({ errors: { current: ["That is not your current password."] } }, { status: 400 });
  }
  // Every session ends with the old password; this browser gets a new one.
  await changePassword(user.id, form.data.password);
  const cookie = await newSessionCookie(
    request,
    user.id,
    "Your password is changed, and every other browser signed in as you is signed out.",
  );
  throw redirect("/settings", { headers: { "Set-Cookie": cookie } });
}

export default function Settings({ loaderData, actionData }: Route.ComponentProps) {
  const { user, sessions, currentSessionId } = loaderData;
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  return (
    <>
      <PageHeader title="Settings" lead={`${user.name} · ${user.email} · ${user.organisationName}`} />
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="Units">
          <Form method="post" className="space-y-4">
            <input type="hidden" name="intent" value="units" />
            <SelectField
              label="Show and enter figures in"
              name="units"
              defaultValue={user.units}
              errors={errors.units}
              options={[
                { value: "metric", label: "Metric: millimetres, kilograms, tonnes" },
                { value: "imperial", label: "Imperial: inches, pounds, US tons" },
              ]}
            />
            <Button type="submit">Save units</Button>
          </Form>
        </Card>
        <Card title="Password">
          <Form method="post" className="space-y-4">
            <input type="hidden" name="intent" value="password" />
            <FormError message={errors._form?.join(" ")} />
            <input type="hidden" name="username" value={user.email} autoComplete="username" />
            <Field
              label="Current password"
              name="current"
              type="password"
              autoComplete="current-password"
              required
              errors={errors.current}
            />
            <Field
              label="New password"
              name="password"
              type="password"
              autoComplete="new-password"
              required
              hint="At least 10 characters."
              errors={errors.password}
            />
            <Field
              label="Repeat the new password"
              name="confirm"
              type="password"
              autoComplete="new-password"
              required
              errors={errors.confirm}
            />
            <Button type="submit">Change password</Button>
          </Form>
        </Card>
        <Card title="Where you are signed in" className="md:col-span-2">
          <FormError message={errors.session?.join(" ")} />
          <SessionList sessions={sessions} currentSessionId={currentSessionId} />
        </Card>
        <Card title="Your roles" className="md:col-span-2">
          <ul className="space-y-1 text-sm">
            {user.roles.map((role) => (
              <li key={role}>
                <span className="font-semibold">{ROLE_LABELS[role]}</span>: {ROLE_DUTIES[role]}
              </li>
            ))}
          </ul>
          <p className="mt-2 text-xs text-ink-soft">Roles are given by your organisation's admin.</p>
        </Card>
      </div>
    </>
  );
}
