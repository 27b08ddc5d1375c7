import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/admin.settings";
import { Button, Card, Field, PageHeader, SelectField } from "~/components/ui/form";
import { DEFAULT_TIME_ZONE, formatDate, isTimeZone, todayIn } from "~/utils/dates";
import { parseForm, requiredText, requireFormData, safeText } from "~/utils/forms";
import { recordAudit } from "~/models/audit-event.server";
import { getOrganisation, updateOrganisationSettings } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { DEFAULT_RULE_SET, isRuleSetId, RULE_SET_IDS } from "~/statics/reference";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

const schema = z.object({
  name: requiredText("organisation's name", 200),
  allowSelfApproval: z.preprocess((v) => v === "on", z.boolean()),
  // Absent (an older form): the organisation keeps its rules.
  ruleSet: z.enum(RULE_SET_IDS, { error: "Choose the rules your organisation works to: UK / EU or US." }).optional(),
  // Left out of a form that does not show it: the zone stays as it is.
  timeZone: safeText()
    .trim()
    .refine(isTimeZone, "Choose a time zone from the list, written as Region/City (for example Europe/London).")
    .optional(),
});

/** The zones this runtime knows, offered as suggestions; any valid IANA name is accepted. */
const TIME_ZONES: readonly string[] =
  typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : [DEFAULT_TIME_ZONE];

export const meta: Route.MetaFunction = () => [{ title: "Organisation settings · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const organisation = await getOrganisation(admin.organisationId);
  if (!organisation) throw data({ message: "Your organisation was not found." }, { status: 404 });
  const tables = await getReferenceTables();
  return {
    name: organisation.name,
    allowSelfApproval: organisation.allowSelfApproval,
    ruleSet: isRuleSetId(organisation.ruleSet) ? organisation.ruleSet : DEFAULT_RULE_SET,
    ruleSets: tables.ruleSets.map((r) => ({
      id: r.id,
      name: r.name,
      standards: r.standards,
      examinations: r.examinationSource,
    })),
    timeZone: organisation.timeZone,
    today: todayIn(organisation.timeZone),
  };
}

export async function action({ request }: Route.ActionArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  await updateOrganisationSettings(admin.organisationId, form.data);
  await recordAudit({
    organisationId: admin.organisationId,
    userId: admin.id,
    entity: "organisation",
    entityId: admin.organisationId,
    action: "settings changed",
    details: form.data,
  });
  throw redirect("/admin/settings", { headers: { "Set-Cookie": await flashNotice(request, "Settings saved.") } });
}

export default function OrganisationSettings({ loaderData, actionData }: Route.ComponentProps) {
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  return (
    <>
      <PageHeader title="Organisation settings">
        <a href="/admin" className="px-2 py-2 text-sm">
          Users
        </a>
      </PageHeader>
      <Card className="max-w-xl">
        <Form method="post" className="space-y-4">
          <Field label="Organisation name" name="name" defaultValue={loaderData.name} required errors={errors.name} />
          <div>
            <SelectField
              label="Rules the organisation works to"
              name="ruleSet"
              defaultValue={loaderData.ruleSet}
              errors={errors.ruleSet}
              options={loaderData.ruleSets.map((r) => ({ value: r.id, label: `${r.name}: ${r.standards}` }))}
            />
            <p className="mt-1 text-sm text-ink-soft">
              The rule set gives every hitch and multi-leg factor, the sling angle limits, the eyebolt and shackle
              tables and the longest examination intervals; each check and printed plan names it. Plans are worked out
              again under the new rules when next saved, submitted or approved. Local regulations and the appointed
              person still decide.
            </p>
            <ul className="mt-1 list-disc pl-5 text-xs text-ink-soft">
              {loaderData.ruleSets.map((r) => (
                <li key={r.id}>
                  {r.name}: {r.examinations}
                </li>
              ))}
            </ul>
          </div>
          <label className="flex items-start gap-2 text-sm">
            <input
              type="checkbox"
              name="allowSelfApproval"
              defaultChecked={loaderData.allowSelfApproval}
              className="mt-1"
            />
            <span>
              <span className="font-semibold">Allow an appointed person to approve a plan they planned themselves</span>
              <span className="block text-ink-soft">
                Only for one-person firms. Each plan approved this way says so on its printed copy. Leave it off where a
                second competent person can check the plan.
              </span>
            </span>
          </label>
          <Field
            label="Time zone"
            name="timeZone"
            defaultValue={loaderData.timeZone}
            list="time-zones"
            required
            errors={errors.timeZone}
            hint={`Decides "today" for examination due dates, plan checks, approval and reminders (today there is ${formatDate(loaderData.today)}).`}
          />
          <datalist id="time-zones">
            {TIME_ZONES.map((zone) => (
              <option key={zone} value={zone} />
            ))}
          </datalist>
          <Button type="submit">Save settings</Button>
        </Form>
      </Card>
    </>
  );
}
