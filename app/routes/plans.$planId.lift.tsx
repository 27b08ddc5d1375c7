import { data, redirect } from "react-router";
import type { Route } from "./+types/plans.$planId.lift";
import { Card, PageHeader } from "~/components/ui/form";
import { LiftFitness } from "~/components/lift-fitness";
import { LiftRecordEntry } from "~/components/lift-record-entry";
import { DefectReportOffline } from "~/components/defect-report-offline";
import { KeepOnPhone } from "~/components/keep-on-phone";
import { OutboxPanel } from "~/components/outbox-panel";
import { getOrganisationTimeZone } from "~/models/organisation.server";
import { getWorkflowView } from "~/plans/workflow-view.server";
import { recordLift } from "~/plans/lift.server";
import { holdPointsOf } from "~/plans/lift-record";
import { readLiftForm } from "./plans.$planId.lift.server";
import { getPlan, planExists } from "~/models/plan.server";
import { PERSON_ROLE_LABELS, PLAN_CAUTION } from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { checkUpload, readUploadForm, type CheckedUpload } from "~/utils/uploads.server";
import { formatMass } from "~/utils/format";

export const meta: Route.MetaFunction = () => [{ title: "At the lift · Plumbline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "rigger");
  const found = await getPlan(user.organisationId, Number(params.planId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const workflow = (await getWorkflowView(user.organisationId, found.plan.id, user, found))!;
  const approved = workflow.approved;
  if (!approved || approved.status !== "approved") {
    throw data(
      { message: "This plan has no approved revision to lift: only an approved, current revision goes to the lift." },
      { status: 409 },
    );
  }
  // What the rigger checks the gear against is the sealed record; the live state beside it says whether it still holds.
  const sealed = workflow.sealed;
  return {
    plan: {
      id: found.plan.id,
      title: sealed?.title ?? found.plan.title,
      revision: approved.revision,
      approverName: sealed?.approval.name ?? approved.approverName,
    },
    sealedMissing: !sealed,
    live: workflow.live,
    massKg: approved.snapshot.massKg * (1 + approved.snapshot.contingencyPct / 100),
    schedule: (sealed?.schedule ?? []).map((row) => ({
      position: row.position,
      itemId: row.itemId,
      itemCode: row.itemCode,
      description: row.description,
      serial: row.serial,
      wllKg: row.wllKg,
      nextDueOn: row.nextDueOn,
    })),
    details: sealed?.details ?? approved.details,
    holdPoints: sealed ? holdPointsOf(sealed) : [],
    canRecord: workflow.permissions["record-lift"].allowed,
    recordRefusal: workflow.permissions["record-lift"].reason ?? null,
    units: user.units,
    // Times on the record are entered in the site's (the organisation's) time zone, whatever the phone's.
    timeZone: await getOrganisationTimeZone(user.organisationId),
    checkedAt: workflow.live?.checkedAt ?? new Date().toISOString(),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "rigger");
  const planId = Number(params.planId);
  // Another organisation's plan is not found whatever the form says, as on every other plan route.
  if (!(await planExists(user.organisationId, planId)))
    throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const upload = await readUploadForm(request, { maxFiles: 3 });
  if (!upload.ok) return data({ error: upload.message }, { status: upload.status });
  const read = readLiftForm(upload.formData);
  if (!read.ok) return data({ error: read.message, field: read.field }, { status: 400 });
  const form = upload.formData;
  const photos: CheckedUpload[] = [];
  for (const value of form.getAll("photos")) {
    if (!(value instanceof File) || (value.size === 0 && !value.name)) continue;
    const checked = await checkUpload(value, ["png", "jpeg"]);
    if (!checked.ok) return data({ error: checked.message }, { status: 400 });
    photos.push(checked.upload);
  }
  const result = await recordLift(user.organisationId, planId, user, read.input, photos);
  if (!result.ok) {
    if (result.status === 404) throw data({ message: result.message }, { status: 404 });
    return data({ error: result.message, field: result.field ?? null }, { status: result.status });
  }
  throw redirect(`/plans/${planId}`, {
    headers: { "Set-Cookie": await flashNotice(request, "The lift is recorded and the plan is completed.") },
  });
}

export default function AtTheLift({ loaderData, actionData }: Route.ComponentProps) {
  const {
    plan,
    schedule,
    details,
    holdPoints,
    canRecord,
    recordRefusal,
    massKg,
    units,
    live,
    sealedMissing,
    timeZone,
    checkedAt,
  } = loaderData;
  return (
    <>
      <PageHeader
        title={plan.title}
        lead={`Approved revision ${plan.revision}${plan.approverName ? `, approved by ${plan.approverName}` : ""} · load with contingency ${formatMass(massKg, units)}`}
      >
        <a
          href={`/plans/${plan.id}/print.pdf`}
          className="inline-flex min-h-12 items-center rounded border-2 border-ink/50 bg-white px-4 py-2 text-base font-semibold text-ink no-underline"
        >
          Print (PDF)
        </a>
      </PageHeader>
      <LiftFitness live={live} sealedMissing={sealedMissing} />
      <KeepOnPhone planId={plan.id} title={plan.title} checkedAt={checkedAt} />
      <p role="note" className="mb-4 rounded border border-brass/40 bg-brass-soft px-3 py-2 text-sm">
        {PLAN_CAUTION}
      </p>
      <div className="space-y-4">
        <Card title="Gear on the hook must match these ids">
          <ul className="divide-y divide-rule text-sm" data-testid="schedule">
            {schedule.map((row) => (
              <li key={row.position} className="py-2">
                <span className="font-semibold">{row.position}</span>: {row.itemCode}{" "}
                {row.description && <span className="text-ink-soft">({row.description})</span>}
                <span className="block">
                  WLL {formatMass(row.wllKg, units)}
                  {row.serial ? ` · serial ${row.serial}` : ""} · next examination {row.nextDueOn ?? "none on record"}
                </span>
                <DefectReportOffline itemId={row.itemId} itemCode={row.itemCode} />
              </li>
            ))}
          </ul>
        </Card>
        <Card title="Sequence">
          <ol className="list-decimal space-y-1 pl-5 text-sm">
            {details.sequence.map((s, i) => (
              <li key={i}>
                <span className="font-semibold">{s.title}</span>
                {s.holdPoint && (
                  <span className="ml-1 rounded bg-brass-soft px-1 text-xs font-semibold text-brass-deep">
                    HOLD POINT
                  </span>
                )}
                {s.notes && <span className="block text-ink-soft">{s.notes}</span>}
              </li>
            ))}
          </ol>
          {details.exclusionZone && <p className="mt-2 text-sm">Exclusion zone: {details.exclusionZone}</p>}
          {details.communication && <p className="text-sm">Communication: {details.communication}</p>}
          {details.people.length > 0 && (
            <p className="text-sm">
              People: {details.people.map((p) => `${p.name} (${PERSON_ROLE_LABELS[p.role]})`).join(", ")}
            </p>
          )}
        </Card>
        {canRecord ? (
          <LiftRecordEntry
            planId={plan.id}
            planTitle={plan.title}
            timeZone={timeZone}
            error={actionData?.error}
            errorField={actionData && "field" in actionData ? (actionData.field as string | null) : null}
            schedule={schedule}
            holdPoints={holdPoints}
            people={details.people}
            supervisor={details.people.find((p) => p.role === "lift_supervisor")?.name ?? ""}
          />
        ) : (
          <p className="text-sm text-ink-soft" data-testid="no-record">
            {recordRefusal ?? "Only a rigger records the lift on the current approved revision."}
          </p>
        )}
        <OutboxPanel />
      </div>
    </>
  );
}
