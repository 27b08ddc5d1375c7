import { useSyncExternalStore } from "react";
import { data } from "react-router";
import type { Route } from "./+types/plans.$planId.edit";
import { PlanEditor } from "~/components/plan-editor";
import { PageHeader } from "~/components/ui/form";
import { gearPicksByIds } from "~/gear/picks.server";
import { listComponentFiles } from "~/models/component.server";
import { getOrganisationRuleSet, getOrganisationToday } from "~/models/organisation.server";
import { getPlan } from "~/models/plan.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { planJson } from "~/plans/api.server";
import { PLAN_STATUS_LABELS, type PlanStatus, type RiggingAllocation } from "~/plans/document";
import { requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Edit ${data?.plan.title ?? "lift plan"} · Plumbline` },
];

function allocatedIds(rigging: RiggingAllocation) {
  const ids: number[] = [];
  for (const leg of Object.values(rigging.legs))
    for (const id of [leg.eyeboltItemId, leg.shackleItemId, leg.slingItemId]) if (id !== undefined) ids.push(id);
  if (rigging.masterLinkItemId !== undefined) ids.push(rigging.masterLinkItemId);
  if (rigging.craneItemId !== undefined) ids.push(rigging.craneItemId);
  if (rigging.beamItemId !== undefined) ids.push(rigging.beamItemId);
  return ids;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const found = await getPlan(user.organisationId, Number(params.planId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const plan = await planJson(user.organisationId, found);
  const ruleSet = await getOrganisationRuleSet(user.organisationId);
  const tables = await getReferenceTables();
  // The organisation's day: the editor's live checks judge examinations against it, as the save does.
  const todayIso = await getOrganisationToday(user.organisationId);
  const picks = await gearPicksByIds(user.organisationId, allocatedIds(plan.rigging), tables, ruleSet);
  const files = plan.componentId
    ? (await listComponentFiles(plan.componentId))
        .filter((f) => f.storedFile?.contentType.startsWith("image/"))
        .map((f) => ({ fileId: f.storedFileId, name: f.storedFile?.originalName ?? "", caption: f.caption }))
    : [];
  return {
    plan,
    picks,
    files,
    ruleSet,
    todayIso,
    tables,
    units: user.units,
    canEdit: plan.status === "draft" || plan.status === "returned",
  };
}

const noSubscription = () => () => undefined;

/** False while rendering on the server and hydrating, true once running in the browser. */
function useHydrated() {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}

export default function EditPlan({ loaderData }: Route.ComponentProps) {
  const { plan, picks, files, units, canEdit, ruleSet, todayIso, tables } = loaderData;
  const hydrated = useHydrated();
  return (
    <>
      <PageHeader
        title={plan.title}
        lead={`${plan.job.workOrder} · ${plan.job.site?.name ?? ""} · revision ${plan.revision} · ${PLAN_STATUS_LABELS[plan.status as PlanStatus] ?? plan.status}`}
      >
        <a
          href={`/plans/${plan.id}`}
          className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
        >
          Plan summary
        </a>
        <a
          href={`/plans/${plan.id}/details`}
          className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
        >
          Sequence, hazards and people
        </a>
      </PageHeader>
      {!canEdit && (
        <p role="status" className="mb-4 rounded border border-warn/40 bg-warn-soft p-3 text-sm">
          This revision is {PLAN_STATUS_LABELS[plan.status as PlanStatus] ?? plan.status} and frozen: you can look, but
          changes are not saved.
        </p>
      )}
      {hydrated ? (
        <PlanEditor
          plan={plan}
          units={units}
          initialPicks={picks}
          files={files}
          canEdit={canEdit}
          ruleSet={ruleSet}
          todayIso={todayIso}
          tables={tables}
        />
      ) : (
        <p className="rounded border border-dashed border-rule p-6 text-sm text-ink-soft">Loading the editor…</p>
      )}
    </>
  );
}
