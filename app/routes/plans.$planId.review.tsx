import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/plans.$planId.review";
import { warningsBesideChecks } from "~/components/live-results";
import { ChecksList } from "~/components/results/checks-list";
import { GoverningSummary } from "~/components/results/governing-summary";
import { LegTable } from "~/components/results/leg-table";
import { Button, Card, Field, FormError, PageHeader, TextAreaField } from "~/components/ui/form";
import { parseForm, requireFormData, safeText } from "~/utils/forms";
import { getPlan, planExists } from "~/models/plan.server";
import { approveRevision, returnRevision } from "~/plans/workflow.server";
import { getWorkflowView } from "~/plans/workflow-view.server";
import { PLAN_CAUTION, PLAN_STATUS_LABELS } from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { formatLength, formatMass } from "~/utils/format";

const schema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("approve"),
    password: safeText({ error: "Enter your password." }).min(1, "Enter your password."),
    typedName: safeText({ error: "Type your name." }).min(1, "Type your name."),
    comment: safeText({ multiline: true }).max(4000).default(""),
  }),
  z.object({
    intent: z.literal("return"),
    comment: safeText({ multiline: true, error: "Say what should change." }).max(4000),
  }),
]);

export const meta: Route.MetaFunction = () => [{ title: "Review · Plumbline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "approver");
  const found = await getPlan(user.organisationId, Number(params.planId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const workflow = (await getWorkflowView(user.organisationId, found.plan.id, user, found))!;
  const r = found.revision;
  return {
    plan: { id: found.plan.id, title: found.plan.title },
    revision: { revision: r.revision, status: r.status, snapshot: r.snapshot, results: r.results, details: r.details },
    acknowledgements: workflow.acknowledgements,
    permissions: { approve: workflow.permissions.approve, return: workflow.permissions.return },
    approverName: user.name,
    units: user.units,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "approver");
  const planId = Number(params.planId);
  // Another organisation's plan is not found whatever the form says, as on every other plan route.
  if (!(await planExists(user.organisationId, planId)))
    throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok)
    return data(
      {
        error: Object.values(form.errors).flat()[0] ?? "The form is not complete.",
        field: Object.keys(form.errors)[0] ?? null,
      },
      { status: 400 },
    );
  const result =
    form.data.intent === "approve"
      ? await approveRevision(user.organisationId, planId, user, form.data, request)
      : await returnRevision(user.organisationId, planId, user, form.data.comment, request);
  if (!result.ok) {
    if (result.status === 404) throw data({ message: result.message }, { status: 404 });
    return data({ error: result.message, field: result.field ?? null }, { status: result.status });
  }
  const notice =
    form.data.intent === "approve"
      ? "Approved and signed. The planner is told by e-mail; the plan can now be printed."
      : "Returned to the planner with your comments.";
  throw redirect(`/plans/${planId}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });
}

export default function ReviewPlan({ loaderData, actionData }: Route.ComponentProps) {
  const { plan, revision, acknowledgements, permissions, approverName, units } = loaderData;
  const s = revision.snapshot;
  const results = revision.results.status === 200 ? revision.results.body : null;
  const checks = results?.checks ?? [];
  const fieldError = (name: string) =>
    actionData?.field === name && actionData.error ? [actionData.error] : undefined;
  return (
    <>
      <PageHeader
        title={`Review ${plan.title}`}
        lead={`Revision ${revision.revision} · ${PLAN_STATUS_LABELS[revision.status]}`}
      >
        <a href={`/plans/${plan.id}`} className="px-2 py-2 text-sm">
          The whole plan
        </a>
        <a href={`/plans/${plan.id}/edit`} className="px-2 py-2 text-sm">
          See the layout
        </a>
      </PageHeader>
      <p role="note" className="mb-4 rounded border border-brass/40 bg-brass-soft px-3 py-2 text-sm">
        {PLAN_CAUTION}
      </p>
      <FormError message={actionData && !actionData.field ? actionData.error : null} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_26rem]">
        <div className="space-y-6">
          <Card title="The load">
            <p className="text-sm">
              {s.name}: {formatMass(s.massKg, units)} ({s.massSource}), contingency {s.contingencyPct} %, CoG (
              {formatLength(s.cog.x, units)}, {formatLength(s.cog.y, units)}, {formatLength(s.cog.z, units)}) (
              {s.cogSource}).
            </p>
            {results ? (
              <div className="mt-2 space-y-2">
                <LegTable
                  legs={results.legs}
                  design={results.rating.legs}
                  checks={checks}
                  units={units}
                  beam={revision.results.kind === "beam"}
                />
                <p className="text-xs text-ink-soft">
                  Rating: {results.rating.rule} ({results.rating.source}). Tensions are before contingency; the checks
                  add it.
                </p>
                {warningsBesideChecks(results.warnings, units).map((w, i) => (
                  <p key={i} className="text-sm text-warn">
                    ⚠ {w.message}
                  </p>
                ))}
              </div>
            ) : (
              <p role="alert" className="mt-2 text-sm text-fail">
                {revision.results.status !== 200 ? revision.results.body.error : ""}
              </p>
            )}
          </Card>
          <Card title="Checks">
            <GoverningSummary checks={checks} units={units} ruleSet={results?.ruleSet} />
            <div className="mt-3">
              <ChecksList checks={checks} units={units} empty="No checks: no gear was allocated." />
            </div>
            {acknowledgements.length > 0 && (
              <div className="mt-3 text-sm">
                <p className="font-semibold">Warnings the planner acknowledged</p>
                <ul>
                  {acknowledgements.map((a, i) => (
                    <li key={i}>
                      {a.checkItem}: “{a.reason}” ({a.by})
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </Card>
          <Card title="Sequence and hold points">
            <ol className="list-decimal pl-5 text-sm">
              {revision.details.sequence.map((step, i) => (
                <li key={i}>
                  {step.title} {step.holdPoint && <span className="font-semibold text-brass-deep">(hold point)</span>}
                </li>
              ))}
            </ol>
          </Card>
        </div>
        <aside className="space-y-6">
          {permissions.approve.allowed ? (
            <Card title="Approve and sign">
              <Form method="post" className="space-y-3">
                <input type="hidden" name="intent" value="approve" />
                <p className="text-sm text-ink-soft">
                  Approving is your signature as the appointed person: the plan is frozen, printed with your name, and
                  every later change needs a new revision and a new approval.
                </p>
                <input type="hidden" name="username" value="" autoComplete="username" />
                <Field
                  label="Your password, entered again"
                  name="password"
                  type="password"
                  autoComplete="current-password"
                  required
                  errors={fieldError("password")}
                />
                <Field
                  label={`Type your name (${approverName})`}
                  name="typedName"
                  required
                  autoComplete="off"
                  errors={fieldError("typedName")}
                />
                <TextAreaField label="Comments for the rigger and planner (optional)" name="comment" />
                <Button type="submit">Approve this revision</Button>
              </Form>
            </Card>
          ) : (
            <Card title="Approval">
              <p className="text-sm">{permissions.approve.reason}</p>
            </Card>
          )}
          {permissions.return.allowed && (
            <Card title="Return with comments">
              <Form method="post" className="space-y-3">
                <input type="hidden" name="intent" value="return" />
                <TextAreaField
                  label="What should the planner change?"
                  name="comment"
                  required
                  minLength={5}
                  errors={fieldError("comment")}
                />
                <Button type="submit" tone="secondary">
                  Return to the planner
                </Button>
              </Form>
            </Card>
          )}
        </aside>
      </div>
    </>
  );
}
