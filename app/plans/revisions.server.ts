import { getOrganisationToday } from "~/models/organisation.server";
// Writing a plan's working revision: a new plan from a component, saving the draft, pulling in a newer
// component version. The results are worked out on the server every time; every writer is recorded as
// an author of the revision (plans/authorship.ts).
import type { Transaction } from "sequelize";
import { sequelize } from "~/utils/db.server";
import { recordAudit } from "~/models/audit-event.server";
import { getComponent, getComponentVersion, toDefinition } from "~/models/component.server";
import { getJob } from "~/models/job.server";
import {
  EDITABLE_STATUSES,
  getPlan,
  insertPlanWithRevision,
  setPlanTitle,
  updateDraftRevision,
  type Plan,
  type RevisionView,
} from "~/models/plan.server";
import { recordRevisionAuthor } from "~/models/plan-revision-author.server";
import { getReferenceTables } from "~/models/reference-row.server";
import {
  applyLoadEdit,
  snapshotIssues,
  type LoadEdit,
  type PlanDocument,
  type PlanIssue,
  type PlanStatus,
  type RiggingAllocation,
} from "~/plans/document";
import { diffComponentDefinitions, type ComponentChange } from "~/loads/component-changes";
import { defaultArrangement, defaultDetails, fitToSnapshot } from "~/plans/defaults";
import { overrideAuditDetails, overrideIssues, plannedLoad, storedLoadJson } from "~/plans/load-override";
import { computePlanResults } from "~/plans/results.server";

const ENTITY = "plan";

export type CreatePlanResult =
  { ok: true; plan: Plan } | { ok: false; field: "jobId" | "componentId"; message: string };

/** A new plan with revision 1 (draft): the component's definition copied in, a default arrangement and sequence, results computed. */
export async function createPlanFromComponent(
  organisationId: number,
  jobId: number,
  componentId: number,
  title: string,
  actorId: number,
): Promise<CreatePlanResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const job = await getJob(organisationId, jobId, transaction);
    if (!job) return { ok: false, field: "jobId", message: "There is no such job in your organisation." };
    const component = await getComponent(organisationId, componentId, transaction);
    if (!component || component.archivedAt)
      return { ok: false, field: "componentId", message: "There is no such component in your organisation." };
    const snapshot = toDefinition(component);
    if (snapshot.liftPoints.length === 0) {
      return {
        ok: false,
        field: "componentId",
        message: `${snapshot.name} has no lift points yet: add them to the component first.`,
      };
    }
    const arrangement = defaultArrangement(snapshot);
    const rigging: RiggingAllocation = { legs: {} };
    const details = defaultDetails();
    const results = await computePlanResults(
      snapshot,
      arrangement,
      rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details,
        tables,
        transaction,
      },
    );
    const { plan, revision } = await insertPlanWithRevision(
      { organisationId, jobId, title, createdBy: actorId },
      {
        componentId: component.id,
        componentVersion: component.version,
        loadSnapshot: JSON.stringify(snapshot),
        arrangement: JSON.stringify(arrangement),
        rigging: JSON.stringify(rigging),
        craneItemId: null,
        results: JSON.stringify(results),
        details: JSON.stringify(details),
        plannedBy: actorId,
      },
      transaction,
    );
    await recordRevisionAuthor(revision.id, actorId, "created", transaction);
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "created",
        details: { revision: 1, componentId, componentVersion: component.version },
      },
      transaction,
    );
    return { ok: true, plan };
  });
}

export type SaveResult =
  | { status: "saved"; version: number }
  | { status: "stale"; version: number }
  | { status: "frozen"; planStatus: PlanStatus }
  | { status: "not-found" }
  | { status: "invalid"; issues: PlanIssue[]; error: string };

async function lockedWrite(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  transaction: Transaction,
): Promise<{ ok: true; found: NonNullable<Awaited<ReturnType<typeof getPlan>>> } | { ok: false; result: SaveResult }> {
  const found = await getPlan(organisationId, planId, transaction);
  if (!found) return { ok: false, result: { status: "not-found" } };
  if (!EDITABLE_STATUSES.includes(found.revision.status))
    return { ok: false, result: { status: "frozen", planStatus: found.revision.status } };
  if (found.revision.version !== expectedVersion)
    return { ok: false, result: { status: "stale", version: found.revision.version } };
  return { ok: true, found };
}

/** Which parts of the plan a save changes, in the words the history shows (see plans/history.ts). */
function changedParts(
  title: string,
  before: RevisionView,
  after: PlanDocument & { snapshot: RevisionView["snapshot"] },
): string[] {
  const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
  const parts: Array<[string, boolean]> = [
    ["title", title !== after.title],
    [
      "load",
      !same(before.snapshot.cog, after.snapshot.cog) ||
        before.snapshot.massKg !== after.snapshot.massKg ||
        !same(before.snapshot.liftPoints, after.snapshot.liftPoints),
    ],
    ["arrangement", !same(before.arrangement, after.arrangement)],
    ["gear", !same(before.rigging, after.rigging)],
    ["sequence", !same(before.details.sequence, after.details.sequence)],
    ["hazards", !same(before.details.hazards, after.details.hazards)],
    ["people", !same(before.details.people, after.details.people)],
    [
      "site details",
      before.details.exclusionZone !== after.details.exclusionZone ||
        before.details.communication !== after.details.communication ||
        before.details.floorClearanceM !== after.details.floorClearanceM,
    ],
  ];
  return parts.filter(([, changed]) => changed).map(([part]) => part);
}

/**
 * Saves the draft revision's document when `expectedVersion` is still current, recomputing the results on
 * the server. Nothing is written unless everything is valid and the version matches.
 */
export async function savePlanRevision(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  document: PlanDocument,
  actorId: number,
  loadEdit?: LoadEdit,
): Promise<SaveResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const locked = await lockedWrite(organisationId, planId, expectedVersion, transaction);
    if (!locked.ok) return locked.result;
    const { plan, revision } = locked.found;
    const edited = applyLoadEdit(revision.componentSnapshot, revision.loadOverride, loadEdit);
    const snapshot = edited.snapshot;
    const issues = [...edited.issues, ...snapshotIssues(document, snapshot)];
    if (issues.length > 0)
      return { status: "invalid", issues, error: `The plan does not fit its load: ${issues[0]!.message}` };
    const results = await computePlanResults(
      snapshot,
      document.arrangement,
      document.rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details: document.details,
        tables,
        transaction,
      },
    );
    if (results.status === 400)
      return { status: "invalid", issues: results.body.issues as PlanIssue[], error: results.body.error };
    const written = await updateDraftRevision(
      revision.id,
      expectedVersion,
      {
        ...(loadEdit ? { loadSnapshot: storedLoadJson(edited.component, edited.override) } : {}),
        arrangement: JSON.stringify(document.arrangement),
        rigging: JSON.stringify(document.rigging),
        details: JSON.stringify(document.details),
        craneItemId: document.rigging.craneItemId ?? null,
        results: JSON.stringify(results),
        plannedBy: actorId,
      },
      transaction,
    );
    if (!written) return { status: "stale", version: expectedVersion };
    const changed = changedParts(plan.title, revision, { ...document, snapshot });
    const overrideChange = overrideAuditDetails(edited.component, revision.loadOverride, edited.override);
    if (overrideChange && !changed.includes("load")) changed.push("load");
    await setPlanTitle(plan, document.title, transaction);
    await recordRevisionAuthor(revision.id, actorId, "saved", transaction);
    if (overrideChange)
      await recordAudit(
        {
          organisationId,
          userId: actorId,
          entity: ENTITY,
          entityId: plan.id,
          action: edited.override ? "load override set" : "load override removed",
          details: { revision: revision.revision, ...overrideChange },
        },
        transaction,
      );
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "saved",
        details: { revision: revision.revision, version: expectedVersion + 1, resultStatus: results.status, changed },
      },
      transaction,
    );
    return { status: "saved", version: expectedVersion + 1 };
  });
}

export type PullResult =
  | { status: "pulled"; version: number; changes: ComponentChange[]; componentVersion: number }
  | { status: "up-to-date" }
  | { status: "no-component" }
  | Extract<SaveResult, { status: "stale" | "frozen" | "not-found" }>;

/**
 * Replaces the draft's load snapshot with the component's current definition, drops lift points the
 * component no longer has from the arrangement and rigging, recomputes, and says what changed.
 */
export async function pullComponentVersion(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  actorId: number,
): Promise<PullResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const locked = await lockedWrite(organisationId, planId, expectedVersion, transaction);
    if (!locked.ok) return locked.result as PullResult;
    const { plan, revision } = locked.found;
    if (revision.componentId === null) return { status: "no-component" };
    const component = await getComponent(organisationId, revision.componentId, transaction);
    if (!component) return { status: "no-component" };
    if (component.version === revision.componentVersion) return { status: "up-to-date" };
    const fresh = toDefinition(component);
    const changes = diffComponentDefinitions(revision.componentSnapshot, fresh);
    // The planner's override stays with its reason unless its CoG falls outside the new outline.
    const kept = revision.loadOverride && overrideIssues(fresh, revision.loadOverride).length === 0;
    const override = kept ? revision.loadOverride : null;
    if (revision.loadOverride && !kept)
      changes.push({
        kind: "override-removed",
        message: "The override of the mass or CoG was removed: it no longer fits the component.",
      });
    const snapshot = plannedLoad(fresh, override);
    const fitted = fitToSnapshot(revision, snapshot);
    const results = await computePlanResults(
      snapshot,
      fitted.arrangement,
      fitted.rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details: revision.details,
        tables,
        transaction,
      },
    );
    const written = await updateDraftRevision(
      revision.id,
      expectedVersion,
      {
        loadSnapshot: storedLoadJson(fresh, override),
        componentVersion: component.version,
        arrangement: JSON.stringify(fitted.arrangement),
        rigging: JSON.stringify(fitted.rigging),
        craneItemId: fitted.rigging.craneItemId ?? null,
        results: JSON.stringify(results),
      },
      transaction,
    );
    if (!written) return { status: "stale", version: expectedVersion };
    await recordRevisionAuthor(revision.id, actorId, "pulled", transaction);
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "component version pulled",
        details: {
          revision: revision.revision,
          from: revision.componentVersion,
          to: component.version,
          changes: changes.map((c) => c.message),
        },
      },
      transaction,
    );
    return { status: "pulled", version: expectedVersion + 1, changes, componentVersion: component.version };
  });
}

/** The component's current version and what differs from the plan's snapshot; null when the component is gone. */
export async function compareWithComponent(organisationId: number, revision: RevisionView) {
  if (revision.componentId === null) return null;
  // The version alone settles the usual case (nothing newer); the definition is read only to list changes.
  const latest = await getComponentVersion(organisationId, revision.componentId);
  if (!latest) return null;
  const newer = latest.version !== revision.componentVersion;
  const component = newer ? await getComponent(organisationId, revision.componentId) : null;
  return {
    componentId: latest.id,
    latestVersion: component?.version ?? latest.version,
    newer,
    changes: component ? diffComponentDefinitions(revision.componentSnapshot, toDefinition(component)) : [],
  };
}
