import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/plans.$planId.review";
import { warningsBesideChecks } from "~/components/live-results";
import { ChecksList } from "~/components/results/checks-list";
import { GoverningSummary } from "~/components/results/governing-summary";
import { LegTable } from "~/components/results/leg-table";
import { LoadOverrideNotice } from "~/components/load-override-mark";
import { PlanDrawing } from "~/components/plan-drawing";
import { ApprovalRefusals, figuresBasis, GearNowCard, PlanDetailsCards } from "~/components/review-sections";
import { Button, Card, Field, FormError, PageHeader, TextAreaField } from "~/components/ui/form";
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { parseForm, requireFormData, safeText } from "~/utils/forms";
import { planExists } from "~/models/plan.server";
import { approveRevision, returnRevision } from "~/plans/workflow.server";
import { PLAN_CAUTION, PLAN_STATUS_LABELS } from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { formatCapacity, formatLength, formatLoad, formatMass } from "~/utils/format";
import { loadReview } from "./plans.$planId.review.server";

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

/**
 * The whole revision as the approver signs for it. Its results and the gear's state are worked out as the
 * page opens, never read from what was stored on the last save, and every reason approval would be refused
 * comes with them.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "approver");
  const review = await loadReview(user, Number(params.planId));
  if (!review) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  return { ...review, approverName: user.name, units: user.units };
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
  const { plan, job, revision, liftDate, gear, acknowledgements, permissions, refusals, approverName, units } =
    loaderData;
  const s = revision.snapshot;
  const a = revision.arrangement;
  const results = revision.results.status === 200 ? revision.results.body : null;
  const checks = results?.checks ?? [];
  const fieldError = (name: string) =>
    actionData?.field === name && actionData.error ? [actionData.error] : undefined;
  return (
    <>
      <PageHeader
        title={`Review ${plan.title}`}
        lead={`${job.workOrder}: ${job.title}${job.site ? ` · ${job.site}` : ""} · revision ${revision.revision} · ${PLAN_STATUS_LABELS[revision.status]}`}
      >
        <a href={`/plans/${plan.id}`} className="px-2 py-2 text-sm">
          The plan&apos;s page
        </a>
        <a href={`/plans/${plan.id}/history`} className="px-2 py-2 text-sm">
          History
        </a>
      </PageHeader>
      <p role="note" className="mb-4 rounded border border-brass/40 bg-brass-soft px-3 py-2 text-sm">
        {PLAN_CAUTION}
      </p>
      <FormError message={actionData && !actionData.field ? actionData.error : null} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_26rem]">
        <div className="min-w-0 space-y-6">
          <Card title="The drawing">
            <PlanDrawing
              snapshot={s}
              arrangement={a}
              rigging={revision.rigging}
              results={revision.results}
              units={units}
            />
          </Card>
          <Card title="The load">
            <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2" data-testid="review-load">
              <div>
                <dt className="text-ink-soft">Component</dt>
                <dd className="font-semibold">{s.name}</dd>
              </div>
              <div>
                <dt className="text-ink-soft">Mass</dt>
                <dd className="font-semibold">{formatMass(s.massKg, units)}</dd>
                <dd>
                  {revision.loadOverride?.mass ? "planner's override" : MASS_SOURCE_LABELS[s.massSource]}
                  {s.massNote ? ` · ${s.massNote}` : ""}
                </dd>
                <dd>
                  with {s.contingencyPct} % contingency: {formatMass(s.massKg * (1 + s.contingencyPct / 100), units)}
                </dd>
              </div>
              <div>
                <dt className="text-ink-soft">Centre of gravity (x, y, z)</dt>
                <dd className="font-semibold">
                  {formatLength(s.cog.x, units)}, {formatLength(s.cog.y, units)}, {formatLength(s.cog.z, units)}
                </dd>
                <dd>
                  {revision.loadOverride?.cog ? "planner's override" : COG_SOURCE_LABELS[s.cogSource]}
                  {s.cogNote ? ` · ${s.cogNote}` : ""}
                </dd>
              </div>
            </dl>
            <LoadOverrideNotice mark={revision.loadOverride} units={units} />
          </Card>
          <Card title="The figures">
            {results ? (
              <div className="space-y-2">
                <p className="text-sm">
                  {figuresBasis({
                    beam: revision.results.kind === "beam",
                    mode: a.mode,
                    method: results.method,
                    tiltDeg: results.tiltDeg,
                  })}
                </p>
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
                {results.beam && (
                  <p className="text-sm">
                    Beam {formatMass(results.beam.massKg, units)}, marked WLL{" "}
                    {formatCapacity(results.beam.wllKg, units)}; the hook carries{" "}
                    {formatLoad(results.beam.hookMassKg, units)} before contingency.
                  </p>
                )}
                {warningsBesideChecks(results.warnings, units).map((w, i) => (
                  <p key={i} className="text-sm text-warn">
                    ⚠ {w.message}
                  </p>
                ))}
              </div>
            ) : (
              <p role="alert" className="text-sm text-fail">
                The lift cannot be worked out now: {revision.results.status !== 200 ? revision.results.body.error : ""}
              </p>
            )}
          </Card>
          <GearNowCard gear={gear} liftDate={liftDate} units={units} />
          <Card title="Checks">
            <p className="mb-2 text-sm text-ink-soft" data-testid="checks-computed">
              Worked out again as this page opened ({revision.results.computedOn}) from the revision and the gear as the
              register has it now.
            </p>
            <GoverningSummary checks={checks} units={units} ruleSet={results?.ruleSet} />
            <div className="mt-3">
              <ChecksList checks={checks} units={units} empty="No checks: no gear was allocated." />
            </div>
            {acknowledgements.length > 0 && (
              <div className="mt-3 text-sm">
                <p className="font-semibold">Warnings the planner acknowledged</p>
                <ul>
                  {acknowledgements.map((ack, i) => (
                    <li key={i}>
                      {ack.checkItem}: “{ack.reason}” ({ack.by})
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </Card>
          <PlanDetailsCards details={revision.details} units={units} />
        </div>
        <aside className="space-y-6">
          {refusals.length > 0 ? (
            <ApprovalRefusals refusals={refusals} />
          ) : (
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
