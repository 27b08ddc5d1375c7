// The mail a plan's steps send: submitted -> the appointed persons; approved or returned -> the
// planner; assigned -> the rigger; an allocated item of an approved plan no longer fit -> the planner,
// the appointed person and the assigned rigger; a lift record from a phone that arrived refused, or
// recorded though the gear changed after the lift -> the planner (and, when refused, the appointed
// person). Each message links to the plan.
import type { SessionUser } from "~/models/user.server";
import type { LiveProblem } from "~/plans/live-state";
import { absoluteUrl, sendMail } from "~/utils/mail.server";

type Recipient = { name: string; email: string };
type PlanRef = { id: number; title: string; revision: number };

async function notify(
  organisationId: number,
  to: readonly Recipient[],
  subject: string,
  lines: string[],
  planId: number,
  request?: Request,
) {
  if (to.length === 0) return;
  const link = absoluteUrl(`/plans/${planId}`, request);
  await sendMail({
    organisationId,
    to: to.map((u) => `${u.name} <${u.email}>`),
    subject,
    text: [...lines, "", `Open the plan: ${link}`].join("\n"),
  });
}

export async function mailSubmitted(
  organisationId: number,
  approvers: readonly Recipient[],
  by: SessionUser,
  plan: PlanRef,
  request?: Request,
) {
  await notify(
    organisationId,
    approvers,
    `Lift plan to review: ${plan.title} (revision ${plan.revision})`,
    [
      `${by.name} has submitted the lift plan "${plan.title}", revision ${plan.revision}, for your review.`,
      "Check it and approve it, or return it with comments.",
    ],
    plan.id,
    request,
  );
}

export async function mailApproved(
  organisationId: number,
  planner: Recipient,
  by: SessionUser,
  plan: PlanRef,
  request?: Request,
) {
  await notify(
    organisationId,
    [planner],
    `Lift plan approved: ${plan.title} (revision ${plan.revision})`,
    [
      `${by.name}, appointed person, approved revision ${plan.revision} of "${plan.title}".`,
      "It can now be printed and a rigger assigned.",
    ],
    plan.id,
    request,
  );
}

export async function mailReturned(
  organisationId: number,
  planner: Recipient,
  by: SessionUser,
  plan: PlanRef,
  comment: string,
  request?: Request,
) {
  await notify(
    organisationId,
    [planner],
    `Lift plan returned: ${plan.title} (revision ${plan.revision})`,
    [
      `${by.name}, appointed person, returned revision ${plan.revision} of "${plan.title}" with these comments:`,
      "",
      comment,
    ],
    plan.id,
    request,
  );
}

export async function mailRiggerAssigned(
  organisationId: number,
  rigger: Recipient,
  by: SessionUser,
  plan: PlanRef,
  request?: Request,
) {
  await notify(
    organisationId,
    [rigger],
    `Lift assigned to you: ${plan.title} (revision ${plan.revision})`,
    [
      `${by.name} has assigned you the approved lift plan "${plan.title}", revision ${plan.revision}.`,
      "Print it, check the gear against its schedule, brief the crew and make the trial lift as it says.",
    ],
    plan.id,
    request,
  );
}

/** An allocated item of an approved plan has become unfit: nobody may lift to the plan until a new revision is approved. */
export async function mailNotFitToLift(
  organisationId: number,
  to: readonly Recipient[],
  plan: PlanRef,
  problems: readonly LiveProblem[],
  request?: Request,
) {
  // One message each: every one of them must act on it, whoever else was told.
  for (const person of to)
    await notify(
      organisationId,
      [person],
      `NOT FIT TO LIFT: ${plan.title} (revision ${plan.revision})`,
      [
        `The approved lift plan "${plan.title}", revision ${plan.revision}, is not fit to lift:`,
        "",
        ...problems.map((p) => `- ${p.message}${p.detail ? ` ${p.detail}` : ""}`),
        "",
        "Do not lift to this plan. Start a new revision with other gear, or put the item right, and have it approved again.",
      ],
      plan.id,
      request,
    );
}

/**
 * A lift record made on a phone without signal arrived and was refused (the plan could not take it), or was recorded
 * though the allocated gear changed after the lift was made. The rigger's phone says so; this tells the people who
 * must follow it up.
 */
export async function mailArrivedFromPhone(
  organisationId: number,
  to: readonly Recipient[],
  rigger: SessionUser,
  plan: PlanRef,
  arrived: { madeAt: string; refusal?: string; changes: ReadonlyArray<{ message: string }> },
  request?: Request,
) {
  const made = `${rigger.name} recorded the lift to "${plan.title}", revision ${plan.revision}, on a phone without signal (made ${arrived.madeAt}).`;
  const lines = arrived.refusal
    ? [
        made,
        "When it arrived it could not be recorded:",
        "",
        arrived.refusal,
        "",
        "The record as typed is kept on the plan's page. Speak to the rigger: if the lift was made, find out with what gear, and have the gear examined before it is used again.",
      ]
    : [
        made,
        "It is recorded as made, but the gear changed after the lift was made:",
        "",
        ...arrived.changes.map((c) => `- ${c.message}`),
        "",
        "Check the gear named above before it is used again.",
      ];
  const subject = arrived.refusal
    ? `Lift record from a phone NOT RECORDED: ${plan.title} (revision ${plan.revision})`
    : `Lift recorded from a phone, gear changed since: ${plan.title} (revision ${plan.revision})`;
  // One message each: every one of them must act on it, whoever else was told.
  for (const person of to) await notify(organisationId, [person], subject, lines, plan.id, request);
}
