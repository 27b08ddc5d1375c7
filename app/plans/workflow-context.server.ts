// What a user may do with a revision of a plan, as the workflow steps and the pages judge it: the
// pure rules of plans/workflow.ts fed with who wrote the revision and whether its gear is fit now.
import { getOrganisationSettings } from "~/models/organisation.server";
import type { PlanForWorkflow, PlanRevision } from "~/models/plan.server";
import { listRevisionAuthors } from "~/models/plan-revision-author.server";
import type { SessionUser } from "~/models/user.server";
import { authorRefusal, type Authorship } from "~/plans/authorship";
import { permission, type WorkflowAction, type WorkflowContext } from "~/plans/workflow";

export const ENTITY = "plan";

export type WorkflowFailure = { ok: false; status: 400 | 403 | 404 | 409; message: string; field?: string };
export type WorkflowResult<T = object> = ({ ok: true } & T) | WorkflowFailure;

export const fail = (status: WorkflowFailure["status"], message: string, field?: string): WorkflowFailure => ({
  ok: false,
  status,
  message,
  field,
});

export const NOT_FOUND = "There is no such plan in your organisation.";

/** What the user may do with a revision of the plan, knowing who wrote it. */
export async function workflowContext(
  user: SessionUser,
  loaded: PlanForWorkflow,
  revision: PlanRevision,
  options: { allowSelfApproval?: boolean; authors?: readonly Authorship[]; notFitToLift?: string } = {},
): Promise<WorkflowContext> {
  const allowSelfApproval =
    options.allowSelfApproval ?? (await getOrganisationSettings(user.organisationId))?.allowSelfApproval ?? false;
  const authors = options.authors ?? (await listRevisionAuthors([revision.id]));
  const reason = authorRefusal(authors, user.id);
  return {
    status: revision.status,
    roles: user.roles,
    isOwnPlan: reason !== null || revision.plannedBy === user.id || revision.submittedBy === user.id,
    ...(reason ? { authorReason: reason } : {}),
    allowSelfApproval,
    isCurrentApproved: revision.status === "approved",
    hasNewerRevision: revision.status === "approved" && loaded.current.id !== revision.id,
    ...(options.notFitToLift ? { notFitToLift: options.notFitToLift } : {}),
  };
}

/** The refusal for `action` on the revision, or null when the user may take it. */
export async function refusal(
  action: WorkflowAction,
  user: SessionUser,
  loaded: PlanForWorkflow,
  revision: PlanRevision,
  options: Parameters<typeof workflowContext>[3] = {},
): Promise<WorkflowFailure | null> {
  const p = permission(action, await workflowContext(user, loaded, revision, options));
  if (p.allowed) return null;
  const forbidden =
    p.reason.startsWith("Only") || p.reason.startsWith("The rigger") || p.reason.startsWith("The appointed");
  return fail(forbidden ? 403 : 409, p.reason);
}
