import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { Button, Card, Field, FormError, PageHeader, SelectField } from "~/components/ui/form";
import { newPasswordSchema, parseForm, requireFormData, safeText } from "~/utils/forms";
import { setPassword, setUnits, verifyPassword } from "~/models/user.server";
import { ROLE_DUTIES, ROLE_LABELS } from "~/utils/roles";
import { flashNotice, requireUser } from "~/utils/session.server";

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
]);

export const meta: Route.MetaFunction = () => [{ title: "Settings · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { user };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
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
  await setPassword(user.id, form.data.password);
  throw redirect("/settings", { headers: { "Set-Cookie": await flashNotice(request, "Your password is changed.") } });
}

export default function Settings({ loaderData, actionData }: Route.ComponentProps) {
  const { user } = loaderData;
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
