import { Form } from "react-router";
import { formatDateTime } from "~/utils/dates";
import { LiftFitness } from "~/components/lift-fitness";
import { LiftRecordView, type LiftRecordViewData } from "~/components/lift-record-view";
import { Button } from "~/components/ui/form";
import { PLAN_STATUS_LABELS, type PlanStatus } from "~/plans/document";
import type { LiveGearState } from "~/plans/live-state";
import type { WorkflowAction } from "~/plans/workflow";

type Permission = { allowed: boolean; reason?: string };

export type WorkflowPanelData = {
  working: { revision: number; status: PlanStatus };
  approved: {
    revision: number;
    status: PlanStatus;
    approverName: string | null;
    approvedAt: Date | string | null;
    approvalComment: string | null;
    selfApproved: boolean;
    fingerprint: string | null;
  } | null;
  acknowledgements: Array<{ checkItem: string; reason: string; by: string; at: string }>;
  comments: Array<{ kind: string; body: string; by: string; at: string; revision: number }>;
  liftRecord: LiftRecordViewData | null;
  assignedRigger: { id: number; name: string } | null;
  /** The approved revision's gear judged now (absent for a plan with no approved revision). */
  live?: LiveGearState | null;
  permissions: Record<WorkflowAction, Permission>;
};

/** A moment as the rest of the product prints it: 2026-12-04 16:46 UTC (a day-first or month-first date misleads someone). */
const when = (iso: Date | string | null) => formatDateTime(iso, "UTC");

const linkButton = "rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline";
const linkSecondary = "rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline";

/** Where the plan stands and what this user can do next; only actions they may take are offered. */
export function WorkflowPanel({
  planId,
  workflow,
  riggers,
}: {
  planId: number;
  workflow: WorkflowPanelData;
  riggers: Array<{ id: number; name: string }>;
}) {
  const { working, approved, permissions: can } = workflow;
  const lastReturn = workflow.comments.find((c) => c.kind === "return" && c.revision === working.revision);
  return (
    <section
      className="mb-6 space-y-3 rounded border border-rule bg-card p-4"
      aria-labelledby="workflow-heading"
      data-testid="workflow"
    >
      <h2 id="workflow-heading" className="text-lg">
        Where the plan stands
      </h2>
      <p className="text-sm">
        Working revision {working.revision}: <span className="font-semibold">{PLAN_STATUS_LABELS[working.status]}</span>
        {approved && approved.revision !== working.revision && (
          <>
            {" "}
            · revision {approved.revision} is{" "}
            <span className="font-semibold">{PLAN_STATUS_LABELS[approved.status]}</span>
          </>
        )}
      </p>
      {approved?.status === "approved" && <LiftFitness live={workflow.live ?? null} />}
      {lastReturn && working.status === "returned" && (
        <div className="rounded border border-warn/40 bg-warn-soft p-3 text-sm">
          <p className="font-semibold">
            Returned by {lastReturn.by} on {when(lastReturn.at)}:
          </p>
          <p className="whitespace-pre-line">{lastReturn.body}</p>
        </div>
      )}
      {approved?.approverName && (
        <div className="rounded border border-pass/40 bg-pass-soft p-3 text-sm" data-testid="approval">
          <p>
            Revision {approved.revision} approved by <span className="font-semibold">{approved.approverName}</span>{" "}
            (appointed person) on {when(approved.approvedAt)}.
          </p>
          {approved.selfApproved && (
            <p className="font-semibold">
              The appointed person approved a plan they planned, as the organisation's setting for one-person firms
              allows.
            </p>
          )}
          {approved.approvalComment && <p>Comment: {approved.approvalComment}</p>}
          {approved.fingerprint && (
            <p className="break-all text-xs text-ink-soft">Fingerprint {approved.fingerprint}</p>
          )}
        </div>
      )}
      {workflow.liftRecord && <LiftRecordView planId={planId} record={workflow.liftRecord} />}
      {workflow.acknowledgements.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer">
            Warnings acknowledged on submission ({workflow.acknowledgements.length})
          </summary>
          <ul className="mt-1 space-y-1">
            {workflow.acknowledgements.map((a, i) => (
              <li key={i}>
                <span className="font-semibold">{a.checkItem}</span>: {a.reason}{" "}
                <span className="text-ink-soft">
                  ({a.by}, {when(a.at)})
                </span>
              </li>
            ))}
          </ul>
        </details>
      )}
      <div className="flex flex-wrap items-start gap-2">
        {can.submit.allowed && (
          <a href={`/plans/${planId}/submit`} className={linkButton}>
            Submit for review
          </a>
        )}
        {(can.approve.allowed || can.return.allowed) && (
          <a href={`/plans/${planId}/review`} className={linkButton}>
            Review and approve or return
          </a>
        )}
        {can.print.allowed && (
          <a href={`/plans/${planId}/print.pdf`} className={linkSecondary}>
            Print the approved plan (PDF)
          </a>
        )}
        {can["record-lift"].allowed && (
          <a href={`/plans/${planId}/lift`} className={linkButton}>
            At the lift: checklist and record
          </a>
        )}
        {can["new-revision"].allowed && (
          <Form method="post">
            <input type="hidden" name="intent" value="new-revision" />
            <Button type="submit" tone="secondary">
              Start a new revision
            </Button>
          </Form>
        )}
      </div>
      {can["assign-rigger"].allowed && (
        <Form method="post" className="flex flex-wrap items-end gap-2 text-sm">
          <input type="hidden" name="intent" value="assign-rigger" />
          <label className="block">
            <span className="block text-ink-soft">
              Rigger for the lift{workflow.assignedRigger ? ` (now ${workflow.assignedRigger.name})` : ""}
            </span>
            <select
              name="riggerId"
              className="mt-1 rounded border border-rule px-2 py-1.5"
              defaultValue={workflow.assignedRigger?.id ?? ""}
            >
              <option value="" disabled>
                Choose…
              </option>
              {riggers.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name}
                </option>
              ))}
            </select>
          </label>
          <Button type="submit" tone="secondary">
            Assign and tell them
          </Button>
        </Form>
      )}
      {can.cancel.allowed && (
        <details className="text-sm">
          <summary className="cursor-pointer text-fail">Cancel the plan</summary>
          <Form method="post" className="mt-2 flex flex-wrap items-end gap-2">
            <input type="hidden" name="intent" value="cancel" />
            <label className="block grow">
              <span className="block text-ink-soft">Why is it cancelled?</span>
              <input
                name="reason"
                required
                minLength={5}
                className="mt-1 w-full rounded border border-rule px-2 py-1.5"
              />
            </label>
            <Button type="submit" tone="danger">
              Cancel the plan
            </Button>
          </Form>
        </details>
      )}
      {!can.submit.allowed &&
        !can.approve.allowed &&
        !can.print.allowed &&
        can.submit.reason &&
        working.status !== "draft" && <p className="text-xs text-ink-soft">{can.print.reason}</p>}
    </section>
  );
}
