import { describe, expect, it } from "vitest";
import { PLAN_STATUSES, type PlanStatus } from "~/plans/document";
import { permission, WORKFLOW_ACTIONS, type WorkflowAction, type WorkflowContext } from "~/plans/workflow";
import { ROLES, type Role } from "~/utils/roles";

const base: WorkflowContext = {
  status: "draft",
  roles: [],
  isOwnPlan: false,
  allowSelfApproval: false,
  isCurrentApproved: false,
  hasNewerRevision: false,
};

function ctx(status: PlanStatus, roles: Role[], extra: Partial<WorkflowContext> = {}): WorkflowContext {
  return { ...base, status, roles, isCurrentApproved: status === "approved", ...extra };
}

/** Who may do what in which state (the product's workflow: draft -> in review -> approved / returned -> completed). */
const EXPECTED: Record<WorkflowAction, { roles: Role[]; statuses: PlanStatus[] }> = {
  edit: { roles: ["planner", "admin"], statuses: ["draft", "returned"] },
  submit: { roles: ["planner", "admin"], statuses: ["draft", "returned"] },
  approve: { roles: ["approver"], statuses: ["in_review"] },
  return: { roles: ["approver"], statuses: ["in_review"] },
  "new-revision": { roles: ["planner", "admin"], statuses: ["approved"] },
  cancel: { roles: ["planner", "admin"], statuses: ["draft", "in_review", "returned", "approved"] },
  "assign-rigger": { roles: ["approver", "planner", "admin"], statuses: ["approved"] },
  "record-lift": { roles: ["rigger"], statuses: ["approved"] },
  print: { roles: [...ROLES], statuses: ["approved", "completed"] },
};

describe("the plan workflow", () => {
  for (const action of WORKFLOW_ACTIONS) {
    it(`${action}: allowed exactly for ${EXPECTED[action].roles.join(", ")} in ${EXPECTED[action].statuses.join(", ")}`, () => {
      for (const status of PLAN_STATUSES) {
        for (const role of ROLES) {
          const allowed = permission(action, ctx(status, [role])).allowed;
          const expected = EXPECTED[action].roles.includes(role) && EXPECTED[action].statuses.includes(status);
          expect(allowed, `${action} by ${role} when ${status}`).toBe(expected);
        }
      }
    });
  }

  it("nobody approves a plan they planned, unless the organisation allows it", () => {
    const own = ctx("in_review", ["approver", "planner"], { isOwnPlan: true });
    const refused = permission("approve", own);
    expect(refused).toEqual({
      allowed: false,
      reason: "You planned this revision: another appointed person must approve it.",
    });
    expect(permission("approve", { ...own, allowSelfApproval: true }).allowed).toBe(true);
    expect(permission("return", own).allowed).toBe(true);
  });

  it("an author's refusal names what made them one", () => {
    const own = ctx("in_review", ["approver"], {
      isOwnPlan: true,
      authorReason: "You submitted it, so you are an author.",
    });
    expect(permission("approve", own)).toEqual({ allowed: false, reason: "You submitted it, so you are an author." });
  });

  it("a revision not fit to lift is not recorded as lifted, and says why", () => {
    const unfit = ctx("approved", ["rigger"], { notFitToLift: "NOT FIT TO LIFT: EB-1 is quarantined." });
    expect(permission("record-lift", unfit)).toEqual({
      allowed: false,
      reason: "NOT FIT TO LIFT: EB-1 is quarantined.",
    });
    expect(permission("print", unfit).allowed).toBe(true);
  });

  it("a new revision starts only once, from the current approved revision", () => {
    expect(permission("new-revision", ctx("approved", ["planner"], { hasNewerRevision: true })).allowed).toBe(false);
    expect(permission("new-revision", ctx("superseded", ["planner"])).allowed).toBe(false);
  });

  it("every refusal says why in a sentence", () => {
    for (const action of WORKFLOW_ACTIONS) {
      const p = permission(action, ctx("cancelled", ["rigger"]));
      if (!p.allowed) expect(p.reason).toMatch(/^[A-Z].+\.$/);
    }
  });
});
