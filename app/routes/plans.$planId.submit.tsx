import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/plans.$planId.submit";
import { ChecksList } from "~/components/results/checks-list";
import { GoverningSummary } from "~/components/results/governing-summary";
import { StatusBadge } from "~/components/results/status-badge";
import { checkSentence, itemText } from "~/plans/check-text";
import { Button, Card, FormError, PageHeader } from "~/components/ui/form";
import { CONTROL_CHARACTER_MESSAGE, hasControlCharacters, requireFormData } from "~/utils/forms";
import { getPlan } from "~/models/plan.server";
import { submitRevision } from "~/plans/workflow.server";
import { PLAN_CAUTION } from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Submit for review · Plumbline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const found = await getPlan(user.organisationId, Number(params.planId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const results = found.revision.results;
  return {
    plan: {
      id: found.plan.id,
      title: found.plan.title,
      revision: found.revision.revision,
      status: found.revision.status,
    },
    error: results.status === 200 ? null : results.body.error,
    checks: results.status === 200 ? (results.body.checks ?? []) : [],
    ruleSet: results.status === 200 ? (results.body.ruleSet ?? null) : null,
    units: user.units,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const planId = Number(params.planId);
  const form = await requireFormData(request);
  const acknowledgements: Record<string, string> = {};
  for (const [key, value] of form.entries())
    if (key.startsWith("ack-") && typeof value === "string") acknowledgements[key.slice(4)] = value;
  const unreadable = Object.keys(acknowledgements).find((id) => hasControlCharacters(acknowledgements[id]!));
  if (unreadable !== undefined)
    return data({ error: CONTROL_CHARACTER_MESSAGE, field: `ack-${unreadable}`, acknowledgements }, { status: 400 });
  const result = await submitRevision(user.organisationId, planId, user, acknowledgements, request);
  if (!result.ok) {
    if (result.status === 404) throw data({ message: result.message }, { status: 404 });
    return data({ error: result.message, field: result.field ?? null, acknowledgements }, { status: result.status });
  }
  throw redirect(`/plans/${planId}`, {
    headers: {
      "Set-Cookie": await flashNotice(request, "Submitted for review; the appointed persons are told by e-mail."),
    },
  });
}

export default function SubmitPlan({ loaderData, actionData }: Route.ComponentProps) {
  const { plan, checks, error, units, ruleSet } = loaderData;
  const warnings = checks.filter((c) => c.status === "warn");
  const failing = checks.filter((c) => c.status === "fail");
  return (
    <>
      <PageHeader
        title={`Submit ${plan.title}`}
        lead={`Revision ${plan.revision}. The appointed person reviews it; until then it cannot be changed.`}
      >
        <a href={`/plans/${plan.id}`} className="px-2 py-2 text-sm">
          Back to the plan
        </a>
      </PageHeader>
      <p role="note" className="mb-4 rounded border border-brass/40 bg-brass-soft px-3 py-2 text-sm">
        {PLAN_CAUTION}
      </p>
      <FormError message={actionData?.error ?? error} />
      <Card title="Checks as last saved" className="mt-4">
        {failing.length > 0 && (
          <p className="mb-2 text-sm text-fail">Failing checks must be put right before the plan can be submitted.</p>
        )}
        <GoverningSummary checks={checks} units={units} ruleSet={ruleSet ?? undefined} />
        <div className="mt-3">
          <ChecksList checks={checks} units={units} />
        </div>
      </Card>
      <Form method="post" className="mt-4 space-y-4">
        {warnings.length > 0 && (
          <Card title="Acknowledge each warning">
            <p className="mb-3 text-sm text-ink-soft">
              Say why the lift can go ahead despite each warning; your reason goes on the plan and in its history.
            </p>
            <div className="space-y-3">
              {warnings.map((w) => (
                <label key={w.id} className="block text-sm">
                  <StatusBadge verdict="warn" /> <span className="font-semibold">{itemText(w)}</span>:{" "}
                  {checkSentence(w, units)}
                  <textarea
                    name={`ack-${w.id}`}
                    required
                    minLength={5}
                    rows={2}
                    defaultValue={actionData?.acknowledgements?.[w.id] ?? ""}
                    aria-invalid={actionData?.field === `ack-${w.id}` ? true : undefined}
                    className="mt-1 block w-full rounded border border-rule px-2 py-1 aria-[invalid=true]:border-fail"
                  />
                </label>
              ))}
            </div>
          </Card>
        )}
        <Button type="submit" disabled={failing.length > 0 || error !== null}>
          Submit for review
        </Button>
      </Form>
    </>
  );
}
