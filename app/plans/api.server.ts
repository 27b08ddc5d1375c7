// The JSON shapes of /api/plans, shared by the API routes and the plan pages.
import { type getPlan } from "~/models/plan.server";
import { compareWithComponent } from "~/plans/revisions.server";

type Found = NonNullable<Awaited<ReturnType<typeof getPlan>>>;

/** The whole plan document as GET /api/plans/:planId (and a successful PUT) answer it. */
export async function planJson(organisationId: number, found: Found) {
  const { plan, revision } = found;
  const site = plan.job?.site;
  const comparison = await compareWithComponent(organisationId, revision);
  return {
    id: plan.id,
    title: plan.title,
    status: revision.status,
    revision: revision.revision,
    version: revision.version,
    job: {
      id: plan.jobId,
      workOrder: plan.job?.workOrder ?? "",
      title: plan.job?.title ?? "",
      site: site ? { id: site.id, name: site.name, customer: site.customer } : null,
    },
    /** The load as planned: the component's copy with the planner's override of its mass and CoG. */
    snapshot: revision.snapshot,
    /** The component's own mass and CoG in the plan's copy, and the override (null when the plan follows the component). */
    componentLoad: { massKg: revision.componentSnapshot.massKg, cog: revision.componentSnapshot.cog },
    loadOverride: revision.loadOverride,
    arrangement: revision.arrangement,
    rigging: revision.rigging,
    details: revision.details,
    results: revision.results,
    componentId: revision.componentId,
    componentVersion: revision.componentVersion,
    latestComponentVersion: comparison?.latestVersion ?? null,
  };
}
