// Why an appointed person cannot approve a revision now, worked out before they are asked for a password:
// who they are (role, status, authorship), the load path, the results worked out again today, the gear
// as the register has it now and warnings nobody acknowledged. The approval itself checks the same
// things again in its transaction. Pure and shared.
import type { LiveProblem } from "~/plans/live-state";
import type { PlanResults } from "~/plans/document";
import type { Permission } from "~/plans/workflow";

export type RefusalKind = "permission" | "results" | "no-gear" | "load-path" | "gear" | "check" | "warning";

export type ApprovalRefusal = { kind: RefusalKind; message: string };

/** One allocated item as the register has it at the moment the page is read. */
export type ReviewGearRow = {
  position: string;
  itemId: number;
  itemCode: string;
  description: string;
  wllMarked: string;
  status: "in_service" | "quarantined" | "withdrawn" | "missing";
  statusReason: string;
  nextDueOn: string | null;
  /** The load the fresh results put on it (kg) and load / WLL, unrounded; null where no check gives one. */
  loadKg: number | null;
  utilisation: number | null;
  /** Why this item makes the plan not fit to lift on the lift date; empty when it is fit. */
  problems: string[];
};

export type ReadinessInput = {
  /** The workflow's answer for "approve": role, status and authorship. */
  permission: Permission;
  /** The revision's results worked out again now. */
  results: PlanResults;
  hasAllocatedGear: boolean;
  loadPathGaps: readonly string[];
  /** Each allocated item judged against the register now, for the lift date. */
  gearProblems: readonly LiveProblem[];
  /** Check ids the planner acknowledged on submission. */
  acknowledgedCheckIds: ReadonlySet<string>;
};

/** Every reason the approval would be refused now, in the order the approver should read them; empty when it may go ahead. */
export function approvalRefusals(input: ReadinessInput): ApprovalRefusal[] {
  const reasons: ApprovalRefusal[] = [];
  if (!input.permission.allowed) reasons.push({ kind: "permission", message: input.permission.reason });
  if (input.results.status !== 200)
    reasons.push({ kind: "results", message: `The lift cannot be worked out now: ${input.results.body.error}` });
  if (!input.hasAllocatedGear)
    reasons.push({ kind: "no-gear", message: "No gear is allocated, so nothing has been checked." });
  for (const gap of input.loadPathGaps) reasons.push({ kind: "load-path", message: gap });
  for (const problem of input.gearProblems)
    reasons.push({ kind: "gear", message: `Not fit to lift: ${problem.message}` });
  const checks = input.results.status === 200 ? (input.results.body.checks ?? []) : [];
  // An item the register already names above is not named again by its examination check.
  const named = new Set(input.gearProblems.map((p) => p.itemCode));
  const failing = checks.filter(
    (c) => c.status === "fail" && !(c.kind === "inspection" && named.has(c.itemCode ?? "")),
  );
  for (const check of failing) reasons.push({ kind: "check", message: `Check fails: ${check.message}` });
  const unacknowledged = checks.filter((c) => c.status === "warn" && !input.acknowledgedCheckIds.has(c.id));
  if (unacknowledged.length)
    reasons.push({
      kind: "warning",
      message: `New warnings since the plan was submitted: ${unacknowledged.map((c) => c.item).join("; ")}. Return it so the planner can acknowledge them.`,
    });
  return reasons;
}
