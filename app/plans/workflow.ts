// How a plan moves: which actions each role may take in each state. Pure, shared by the pages (to
// show only what may be done) and the server (which checks again before doing it).
import type { PlanStatus } from "~/plans/document";
import type { Role } from "~/utils/roles";

export const WORKFLOW_ACTIONS = [
  "edit",
  "submit",
  "approve",
  "return",
  "new-revision",
  "cancel",
  "assign-rigger",
  "record-lift",
  "print",
] as const;
export type WorkflowAction = (typeof WORKFLOW_ACTIONS)[number];

export type WorkflowContext = {
  status: PlanStatus;
  roles: readonly Role[];
  /** The user is an author of this revision: they created, started, saved, pulled into or submitted it. */
  isOwnPlan: boolean;
  /** What made them an author, as the refusal should say it (see plans/authorship.ts). */
  authorReason?: string;
  allowSelfApproval: boolean;
  /** This revision is the plan's approved one that nothing newer has superseded. */
  isCurrentApproved: boolean;
  /** A newer draft (or one in review) exists beside this approved revision. */
  hasNewerRevision: boolean;
  /** Why the approved revision is not fit to lift now (its gear changed since approval); absent when it is fit. */
  notFitToLift?: string;
};

export type Permission = { allowed: true } | { allowed: false; reason: string };

const yes: Permission = { allowed: true };
const no = (reason: string): Permission => ({ allowed: false, reason });

function hasRole(ctx: WorkflowContext, ...roles: Role[]) {
  return roles.some((r) => ctx.roles.includes(r));
}

/** Whether the user may take `action` on a revision, and if not, a sentence saying why. */
export function permission(action: WorkflowAction, ctx: WorkflowContext): Permission {
  const editable = ctx.status === "draft" || ctx.status === "returned";
  switch (action) {
    case "edit":
    case "submit":
      if (!hasRole(ctx, "planner", "admin")) return no("Only a planner (or admin) changes and submits plans.");
      return editable
        ? yes
        : no(
            `The revision is ${ctx.status.replace("_", " ")}: only a draft or a returned revision can be changed or submitted.`,
          );
    case "approve":
      if (!hasRole(ctx, "approver")) return no("Only an appointed person approves plans.");
      if (ctx.status !== "in_review") return no("Only a revision in review can be approved.");
      if (ctx.isOwnPlan && !ctx.allowSelfApproval)
        return no(ctx.authorReason ?? "You planned this revision: another appointed person must approve it.");
      return yes;
    case "return":
      if (!hasRole(ctx, "approver")) return no("Only an appointed person returns plans.");
      return ctx.status === "in_review" ? yes : no("Only a revision in review can be returned.");
    case "new-revision":
      if (!hasRole(ctx, "planner", "admin")) return no("Only a planner (or admin) starts a new revision.");
      if (!ctx.isCurrentApproved) return no("A new revision starts from the current approved revision.");
      return ctx.hasNewerRevision ? no("A newer revision is already being worked on.") : yes;
    case "cancel":
      if (!hasRole(ctx, "planner", "admin")) return no("Only a planner (or admin) cancels a plan.");
      return ["completed", "cancelled", "superseded"].includes(ctx.status)
        ? no(`The revision is ${ctx.status}; there is nothing to cancel.`)
        : yes;
    case "assign-rigger":
      if (!hasRole(ctx, "approver", "planner", "admin"))
        return no("The appointed person or the planner assigns the rigger.");
      return ctx.isCurrentApproved ? yes : no("A rigger is assigned to the current approved revision.");
    case "record-lift":
      if (!hasRole(ctx, "rigger")) return no("The rigger records the lift.");
      if (!ctx.isCurrentApproved) return no("Only the current approved revision can be lifted and recorded.");
      return ctx.notFitToLift ? no(ctx.notFitToLift) : yes;
    case "print":
      // A completed plan prints as the record of the lift it was.
      return ctx.isCurrentApproved || ctx.status === "completed"
        ? yes
        : no(
            "Only the current approved revision, or the revision a recorded lift was made to, can be printed: a draft, superseded or cancelled revision cannot.",
          );
  }
}

/** The pre-lift checklist the rigger ticks before lifting (common practice; BS 7121 and LOLER reg 8 call for it). */
export const PRE_LIFT_CHECKLIST = [
  { id: "gear-matches", text: "Gear on the hook matches the schedule by id" },
  { id: "gear-in-date", text: "Every item in date for thorough examination and in service" },
  { id: "briefing", text: "Briefing held with everyone on the lift" },
  { id: "exclusion-zone", text: "Exclusion zone set and kept" },
  { id: "communication", text: "Communication checked between signaller and operator" },
  { id: "trial-lift", text: "Trial lift made a short way off the floor: load level and steady" },
] as const;
export type ChecklistId = (typeof PRE_LIFT_CHECKLIST)[number]["id"];
