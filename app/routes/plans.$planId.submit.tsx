import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/plans.$planId.submit";
import { StatusBadge, utilisationText } from "~/components/live-results";
import { Button, Card, FormError, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
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
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const planId = Number(params.planId);
  const form = await requireFormData(request);
  const acknowledgements: Record<string, string> = {};
  for (const [key, value] of form.entries())
    if (key.startsWith("ack-") && typeof value === "string") acknowledgements[key.slice(4)] = value;
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
  const { plan, checks, error } = loaderData;
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
        <ul className="space-y-1 text-sm">
          {checks.map((c) => (
            <li key={c.id} className="flex gap-2">
              <StatusBadge status={c.status} />
              <span>
                {c.message}{" "}
                {c.utilisation !== null && <span className="text-ink-soft">({utilisationText(c.utilisation)})</span>}
              </span>
            </li>
          ))}
        </ul>
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
                  <span className="font-semibold">{w.item}</span>: {w.message}
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
