import { beamLine } from "~/plans/beam-text";
import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/plans.$planId";
import { ComponentViews } from "~/components/component-views";
import { LoadOverrideNotice } from "~/components/load-override-mark";
import { Button, Card, EmptyState, FormError, PageHeader } from "~/components/ui/form";
import { COG_SOURCE_LABELS, MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { parseForm, requireFormData, safeText } from "~/utils/forms";
import { EDITABLE_STATUSES, getPlan } from "~/models/plan.server";
import { compareWithComponent, pullComponentVersion } from "~/plans/revisions.server";
import { assignRigger, cancelPlan, startNewRevision } from "~/plans/workflow.server";
import { getWorkflowView, shownRevision, type WorkflowView } from "~/plans/workflow-view.server";
import { listUsersWithRole } from "~/models/user.server";
import { figuresBasis, HazardTable, LiftConditions, PeopleList, SequenceList } from "~/components/review-sections";
import { WorkflowPanel, type WorkflowPanelData } from "~/components/plan-workflow-panel";
import { ArrivedFromPhonePanel, type ArrivedFromPhone } from "~/components/arrived-from-phone";
import { listPlanSubmissions } from "~/models/offline-submission.server";
import { HITCH_LABELS, PLAN_CAUTION, PLAN_STATUS_LABELS, type PlanResults } from "~/plans/document";
import { hasAnyRole } from "~/utils/roles";
import { flashNotice, requireUser, requireUserWithRole } from "~/utils/session.server";
import { warningsBesideChecks } from "~/components/live-results";
import { ChecksList } from "~/components/results/checks-list";
import { GoverningSummary } from "~/components/results/governing-summary";
import { LegTable } from "~/components/results/leg-table";
import { StatusBadge } from "~/components/results/status-badge";
import { standing } from "~/plans/check-text";
import { formatCapacity, formatLength, formatLoad, formatMass, type Units } from "~/utils/format";

const schema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("pull-component"), version: z.coerce.number().int().positive() }),
  z.object({ intent: z.literal("new-revision") }),
  z.object({
    intent: z.literal("cancel"),
    reason: safeText({ multiline: true, error: "Say why the plan is cancelled." }),
  }),
  z.object({
    intent: z.literal("assign-rigger"),
    riggerId: z.coerce.number({ error: "Choose a rigger." }).int().positive("Choose a rigger."),
  }),
]);

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.plan.title ?? "Lift plan"} · Plumbline` }];

async function requirePlan(organisationId: number, rawId: string) {
  const found = await getPlan(organisationId, Number(rawId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  return found;
}

function panelData(workflow: WorkflowView): WorkflowPanelData {
  const { working, approved } = workflow;
  return {
    working: { revision: working.revision, status: working.status },
    approved: approved && {
      revision: approved.revision,
      status: approved.status,
      approverName: approved.approverName,
      approvedAt: approved.approvedAt,
      approvalComment: approved.approvalComment,
      selfApproved: approved.selfApproved,
      fingerprint: approved.fingerprint,
    },
    acknowledgements: workflow.acknowledgements,
    comments: workflow.comments,
    liftRecord: workflow.liftRecord,
    assignedRigger: workflow.assignedRigger,
    live: workflow.live,
    permissions: workflow.permissions,
  };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { plan, revision } = await requirePlan(user.organisationId, params.planId);
  // Independent reads, started together: each waits on the database while the others' rows are read.
  const [comparison, workflow, submissions] = await Promise.all([
    compareWithComponent(user.organisationId, revision),
    getWorkflowView(user.organisationId, plan.id, user, { plan, revision }),
    listPlanSubmissions(user.organisationId, plan.id),
  ]);
  // An approved or completed revision shows its sealed record.
  const shown = shownRevision({ plan, revision }, workflow);
  return {
    plan: { id: plan.id, title: shown.title },
    job: shown.job,
    revision: shown.revision,
    comparison,
    units: user.units,
    canEdit: hasAnyRole(user, "planner", "admin") && EDITABLE_STATUSES.includes(revision.status),
    // What the panel shows of where the plan stands; never the revisions' documents or the sealed record again.
    workflow: workflow ? panelData(workflow) : null,
    // Only the assignment form lists the riggers.
    riggers: workflow?.permissions["assign-rigger"].allowed
      ? (await listUsersWithRole(user.organisationId, "rigger")).map((r) => ({ id: r.id, name: r.name }))
      : [],
    arrivedFromPhone: submissions.map((s): ArrivedFromPhone => ({
      clientId: s.clientId,
      outcome: s.outcome,
      message: s.message,
      madeAt: s.madeAt.toISOString(),
      receivedAt: s.receivedAt.toISOString(),
      changes: JSON.parse(s.changes) as ArrivedFromPhone["changes"],
    })),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin", "approver");
  const { plan } = await requirePlan(user.organisationId, params.planId);
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok)
    return data(
      { error: Object.values(form.errors).flat()[0] ?? "The request is not complete; reload the page and try again." },
      { status: 400 },
    );
  if (form.data.intent !== "pull-component") {
    const done =
      form.data.intent === "new-revision"
        ? await startNewRevision(user.organisationId, plan.id, user)
        : form.data.intent === "cancel"
          ? await cancelPlan(user.organisationId, plan.id, user, form.data.reason)
          : await assignRigger(user.organisationId, plan.id, user, form.data.riggerId, request);
    if (!done.ok) {
      if (done.status === 404) throw data({ message: done.message }, { status: 404 });
      return data({ error: done.message }, { status: done.status });
    }
    const notice =
      form.data.intent === "new-revision"
        ? "A new draft revision is started from the approved one, which stays approved until the new one is approved."
        : form.data.intent === "cancel"
          ? "The plan is cancelled."
          : "The rigger is assigned and told by e-mail.";
    throw redirect(form.data.intent === "new-revision" ? `/plans/${plan.id}/edit` : `/plans/${plan.id}`, {
      headers: { "Set-Cookie": await flashNotice(request, notice) },
    });
  }
  if (!hasAnyRole(user, "planner", "admin"))
    throw data({ message: "This needs the Planner or Admin role." }, { status: 403 });
  const pulled = await pullComponentVersion(user.organisationId, plan.id, form.data.version, user.id);
  switch (pulled.status) {
    case "not-found":
      throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
    case "stale":
      return data(
        {
          error:
            "Someone else saved this plan after you loaded it. Reload to see their changes, then pull the new version again.",
        },
        { status: 409 },
      );
    case "frozen":
      return data(
        { error: "This revision is no longer a draft; it cannot take a new component version." },
        { status: 409 },
      );
    case "no-component":
      return data(
        { error: "The component this plan was made from is no longer in your organisation." },
        { status: 400 },
      );
    case "up-to-date":
      return data({ error: "The plan already has the component's current version." }, { status: 400 });
    case "pulled": {
      const notice = `Component version ${pulled.componentVersion} pulled in: ${pulled.changes.map((c) => c.message).join(" ") || "no change to the figures."} The results are recomputed.`;
      throw redirect(`/plans/${plan.id}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });
    }
  }
}

function Results({ results, units }: { results: PlanResults; units: Units }) {
  if (results.status !== 200) {
    return (
      <div role="alert" className="rounded border border-fail/40 bg-fail-soft px-3 py-2 text-sm text-fail">
        <p className="font-semibold">The load cannot hang as arranged.</p>
        <p>{results.body.error}</p>
      </div>
    );
  }
  const r = results.body;
  const checks = r.checks ?? [];
  const warnings = warningsBesideChecks(r.warnings, units);
  return (
    <div className="space-y-4">
      <p className="text-sm">
        {figuresBasis({ beam: results.kind === "beam", mode: r.mode, method: r.method, tiltDeg: r.tiltDeg })}
        {" · computed on "}
        {results.computedOn}
      </p>
      <GoverningSummary checks={checks} units={units} ruleSet={r.ruleSet} />
      <LegTable legs={r.legs} design={r.rating.legs} checks={checks} units={units} beam={results.kind === "beam"} />
      <p className="text-xs text-ink-soft">
        Rating: {r.rating.rule} ({r.rating.source}). Tensions are before contingency; the checks add it.
      </p>
      {r.beam && (
        <p className="text-sm">
          Beam {formatMass(r.beam.massKg, units)}, marked WLL {formatCapacity(r.beam.wllKg, units)}; the hook carries{" "}
          {formatLoad(r.beam.hookMassKg, units)} before contingency.
        </p>
      )}
      {warnings.length > 0 && (
        <ul className="space-y-1 text-sm">
          {warnings.map((w, i) => (
            <li key={i} className="rounded border border-warn/40 bg-warn-soft px-3 py-1 text-warn">
              {w.message}
            </li>
          ))}
        </ul>
      )}
      <h3 className="text-base font-semibold">
        Checks <StatusBadge verdict={standing(checks)} />
      </h3>
      <ChecksList checks={checks} units={units} empty="No checks yet." />
    </div>
  );
}

export default function PlanPage({ loaderData, actionData }: Route.ComponentProps) {
  const { plan, job, revision, comparison, units, canEdit, workflow, riggers, arrivedFromPhone } = loaderData;
  const { snapshot: s, arrangement: a, rigging, details, loadOverrideMark: mark } = revision;
  const planMass = s.massKg * (1 + s.contingencyPct / 100);
  return (
    <>
      <PageHeader title={plan.title} lead={`${job.workOrder}: ${job.title}${job.site ? ` · ${job.site}` : ""}`}>
        <a href={`/jobs/${job.id}`} className="px-2 py-2 text-sm">
          Back to the job
        </a>
        {canEdit && (
          <a
            href={`/plans/${plan.id}/edit`}
            className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
          >
            Lay out the lift
          </a>
        )}
        {canEdit && (
          <a
            href={`/plans/${plan.id}/details`}
            className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
          >
            Sequence, hazards and people
          </a>
        )}
        <a
          href={`/plans/${plan.id}/history`}
          className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
        >
          History
        </a>
      </PageHeader>
      <p className="mb-4 text-sm">
        Revision {revision.revision} · <span className="font-semibold">{PLAN_STATUS_LABELS[revision.status]}</span> ·
        saved version {revision.version}
      </p>
      <p role="note" className="mb-6 rounded border border-brass/40 bg-brass-soft px-3 py-2 text-sm">
        {PLAN_CAUTION}
      </p>
      <ArrivedFromPhonePanel arrived={arrivedFromPhone} />
      {comparison?.newer && (
        <div className="mb-6 rounded border border-steel/40 bg-steel-soft px-3 py-2 text-sm">
          <p className="font-semibold">
            The component has a newer version ({comparison.latestVersion}); this plan uses version{" "}
            {revision.componentVersion}.
          </p>
          {comparison.changes.length > 0 ? (
            <ul className="my-2 list-disc pl-5">
              {comparison.changes.map((c, i) => (
                <li key={i}>{c.message}</li>
              ))}
            </ul>
          ) : (
            <p className="my-2">Nothing the plan uses has changed.</p>
          )}
          {canEdit && (
            <Form method="post">
              <input type="hidden" name="intent" value="pull-component" />
              <input type="hidden" name="version" value={revision.version} />
              <Button type="submit">Pull the new version into this plan</Button>
            </Form>
          )}
        </div>
      )}
      <FormError message={actionData?.error} />
      {workflow && <WorkflowPanel planId={plan.id} workflow={workflow} riggers={riggers} />}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="space-y-6">
          <Card title="Load (as planned)">
            <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
              <div>
                <dt className="text-ink-soft">Component</dt>
                <dd className="font-semibold">
                  {revision.componentId ? <a href={`/components/${revision.componentId}`}>{s.name}</a> : s.name}
                </dd>
                <dd className="text-ink-soft">version {revision.componentVersion ?? "—"}</dd>
              </div>
              <div>
                <dt className="text-ink-soft">Mass</dt>
                <dd className="font-semibold">{formatMass(s.massKg, units)}</dd>
                <dd>
                  {mark?.mass
                    ? "Planner's override (differs from the component)"
                    : `${MASS_SOURCE_LABELS[s.massSource]}${s.massNote ? ` · ${s.massNote}` : ""}`}
                </dd>
              </div>
              <div>
                <dt className="text-ink-soft">With contingency ({s.contingencyPct} %)</dt>
                <dd className="font-semibold">{formatMass(planMass, units)}</dd>
              </div>
              <div>
                <dt className="text-ink-soft">Centre of gravity (x, y, z)</dt>
                <dd className="font-semibold">
                  {formatLength(s.cog.x, units)}, {formatLength(s.cog.y, units)}, {formatLength(s.cog.z, units)}
                </dd>
                <dd>
                  {mark?.cog
                    ? "Planner's override (differs from the component)"
                    : `${COG_SOURCE_LABELS[s.cogSource]}${s.cogNote ? ` · ${s.cogNote}` : ""}`}
                </dd>
              </div>
            </dl>
            <LoadOverrideNotice mark={mark} units={units} />
          </Card>
          <Card title="Arrangement">
            <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
              <div>
                <dt className="text-ink-soft">Rigging</dt>
                <dd>
                  {a.kind === "beam"
                    ? "Lifting beam with vertical drops"
                    : `${a.liftPointLabels.length}-leg bridle from one hook`}
                  , {a.mode === "level" ? "hanging level" : "on slings of given length"}
                </dd>
              </div>
              <div>
                <dt className="text-ink-soft">Lift points</dt>
                <dd>{a.liftPointLabels.join(", ")}</dd>
              </div>
              {a.mode === "level" ? (
                <div>
                  <dt className="text-ink-soft">Hook point height (component frame)</dt>
                  <dd>{formatLength(a.hookHeightM, units)}</dd>
                </div>
              ) : (
                <div>
                  <dt className="text-ink-soft">Leg lengths</dt>
                  <dd>
                    {a.liftPointLabels.map((l) => `${l}: ${formatLength(a.legLengthsM[l] ?? 0, units)}`).join(" · ")}
                  </dd>
                </div>
              )}
              {a.beam && (
                <div>
                  <dt className="text-ink-soft">Beam</dt>
                  <dd>
                    {beamLine(a, revision.results.status === 200 ? revision.results.body.beam : undefined, units)}
                  </dd>
                </div>
              )}
              <div>
                <dt className="text-ink-soft">Gear allocated</dt>
                <dd>
                  {Object.keys(rigging.legs).length === 0 &&
                  !rigging.craneItemId &&
                  !rigging.masterLinkItemId &&
                  !rigging.beamItemId
                    ? "None yet"
                    : Object.entries(rigging.legs)
                        .map(
                          ([leg, r]) =>
                            `${leg}: ${[r.eyeboltItemId && "eyebolt", r.shackleItemId && "shackle", r.slingItemId && `sling (${HITCH_LABELS[r.hitch].toLowerCase()})`].filter(Boolean).join(", ") || "nothing"}`,
                        )
                        .concat(
                          rigging.masterLinkItemId ? ["master link"] : [],
                          rigging.craneItemId ? ["crane or hoist"] : [],
                          rigging.beamItemId ? ["lifting beam or spreader"] : [],
                        )
                        .join(" · ")}
                </dd>
              </div>
            </dl>
          </Card>
          <Card title="Results (computed by Plumbline on every save)">
            <Results results={revision.results} units={units} />
          </Card>
          <Card title="Sequence of the lift">
            <SequenceList sequence={details.sequence} />
          </Card>
          <Card title="Hazards and controls">
            {details.hazards.length === 0 ? (
              <EmptyState title="No hazards recorded yet">
                Every lift has some: list each with its control before the plan goes for review.
              </EmptyState>
            ) : (
              <HazardTable hazards={details.hazards} />
            )}
            <LiftConditions details={details} units={units} />
          </Card>
          <Card title="People">
            <PeopleList people={details.people} none="Nobody named yet." />
          </Card>
        </div>
        <aside>
          <ComponentViews
            data={{ ...s, liftPoints: s.liftPoints.filter((p) => a.liftPointLabels.includes(p.label)) }}
            units={units}
          />
        </aside>
      </div>
    </>
  );
}
