// Work made on a phone without signal, arriving later: each piece carries the phone's id for it, so a piece
// sent again (the answer was lost on the way back) is recognised and done once. The server decides when it
// arrives: a lift record is judged against the gear as it stood when the record was made, and whatever changed
// in between is kept beside it for the rigger and the planner.
import { z } from "zod";
import { sendDefectReportMail } from "~/gear/mail.server";
import { defectReportSchema } from "~/gear/schema";
import { reportGearDefect } from "~/gear/lifecycle.server";
import { recordAudit } from "~/models/audit-event.server";
import { getGearItem } from "~/models/gear-item.server";
import {
  claimSubmission,
  findSubmission,
  releaseSubmission,
  settleSubmission,
  type OfflineSubmission,
} from "~/models/offline-submission.server";
import { getOrganisationSettings } from "~/models/organisation.server";
import { getPlan, planExists } from "~/models/plan.server";
import { getOrganisationUser } from "~/models/user.server";
import type { SessionUser } from "~/models/user.server";
import { recordLift } from "~/plans/lift.server";
import { mailArrivedFromPhone } from "~/plans/notifications.server";
import type { LiveProblem } from "~/plans/live-state";
import { watchAllocatedGear } from "~/plans/live-state.server";
import { ENTITY } from "~/plans/workflow-context.server";
import { readLiftForm } from "~/routes/plans.$planId.lift.server";
import { formatDateTime } from "~/utils/dates";
import { parseForm, safeText } from "~/utils/forms";
import { checkUpload, type CheckedUpload } from "~/utils/uploads.server";

const envelopeSchema = z.object({
  clientId: safeText().regex(/^[A-Za-z0-9-]{8,64}$/, "The phone's id for this work is not valid."),
  kind: z.enum(["lift", "defect"]),
  madeAt: z.iso.datetime({ offset: true, message: "When the work was made is not a time." }),
  planId: z.coerce.number().int().positive().optional(),
  itemId: z.coerce.number().int().positive().optional(),
});

/** A change between the work being made and it arriving, as the phone and the plan page show it. */
export type ArrivedChange = { itemCode: string; kind: LiveProblem["kind"]; message: string };

/**
 * The answer to one piece of work. `recorded` and `refused` are final (the phone stops sending it); `invalid`
 * asks the rigger to put a field right and send again; `busy` means the same piece is being done now.
 */
export type SyncAnswer = {
  status: 200 | 400 | 404 | 409 | 413;
  clientId: string | null;
  outcome: "recorded" | "refused" | "invalid" | "busy";
  message: string;
  field?: string | null;
  madeAt?: string;
  receivedAt?: string;
  changes?: ArrivedChange[];
};

const FIVE_MINUTES = 5 * 60_000;

function answerFrom(row: OfflineSubmission, repeat: boolean): SyncAnswer {
  if (row.outcome === "pending")
    return {
      status: 409,
      clientId: row.clientId,
      outcome: "busy",
      message: "This work is being recorded now; the phone will ask again.",
    };
  return {
    status: 200,
    clientId: row.clientId,
    outcome: row.outcome,
    message: repeat ? `${row.message} (This had already arrived; it was recorded once.)` : row.message,
    madeAt: row.madeAt.toISOString(),
    receivedAt: row.receivedAt.toISOString(),
    changes: JSON.parse(row.changes) as ArrivedChange[],
  };
}

const invalid = (clientId: string | null, message: string, field: string | null = null, status: 400 | 413 = 400) =>
  ({ status, clientId, outcome: "invalid", message, field }) satisfies SyncAnswer;

/** Takes one piece of work sent from a phone (its fields, the envelope and any photos) and answers what became of it. */
export async function receiveSubmission(user: SessionUser, form: FormData, request?: Request): Promise<SyncAnswer> {
  const envelope = envelopeSchema.safeParse({
    clientId: form.get("clientId"),
    kind: form.get("kind"),
    madeAt: form.get("madeAt"),
    planId: form.get("planId") || undefined,
    itemId: form.get("itemId") || undefined,
  });
  if (!envelope.success) return invalid(null, envelope.error.issues[0]!.message);
  const { clientId, kind } = envelope.data;
  const earlier = await findSubmission(user.organisationId, clientId);
  if (earlier) return answerFrom(earlier, true);
  const receivedAt = new Date();
  const madeAt = new Date(envelope.data.madeAt);
  // The phone's clock decides when the work was made, but never a time still to come.
  if (madeAt.getTime() > receivedAt.getTime() + FIVE_MINUTES)
    return invalid(
      clientId,
      "The phone's clock says this work was made in the future: set the phone's clock and send again.",
    );
  if (kind === "lift") return receiveLift(user, form, envelope.data.planId, { clientId, madeAt, receivedAt }, request);
  return receiveDefect(user, form, envelope.data.itemId, { clientId, madeAt, receivedAt }, request);
}

type Stamp = { clientId: string; madeAt: Date; receivedAt: Date };

async function receiveLift(
  user: SessionUser,
  form: FormData,
  planId: number | undefined,
  stamp: Stamp,
  request?: Request,
) {
  if (!user.roles.includes("rigger"))
    return invalid(
      stamp.clientId,
      "Only a rigger records the lift. Ask your organisation's admin if you should be one.",
    );
  if (!planId || !(await planExists(user.organisationId, planId)))
    return {
      status: 404,
      clientId: stamp.clientId,
      outcome: "invalid",
      message: "There is no such plan in your organisation.",
    } satisfies SyncAnswer;
  const read = readLiftForm(form);
  if (!read.ok) return invalid(stamp.clientId, read.message, read.field);
  const photos: CheckedUpload[] = [];
  for (const value of form.getAll("photos")) {
    if (!(value instanceof File) || (value.size === 0 && !value.name)) continue;
    const checked = await checkUpload(value, ["png", "jpeg"]);
    if (!checked.ok) return invalid(stamp.clientId, checked.message, "photos");
    photos.push(checked.upload);
  }
  const claim = await claimSubmission({
    organisationId: user.organisationId,
    userId: user.id,
    kind: "lift",
    planId,
    gearItemId: null,
    ...stamp,
  });
  if (!claim) return answerFrom((await findSubmission(user.organisationId, stamp.clientId))!, true);
  try {
    let changes: ArrivedChange[] = [];
    const result = await recordLift(user.organisationId, planId, user, read.input, photos, {
      madeAt: stamp.madeAt,
      settle: async (liftRecordId, arisenSince, transaction) => {
        changes = arisenSince.map((p) => ({ itemCode: p.itemCode, kind: p.kind, message: p.message }));
        const message = changes.length
          ? "The lift is recorded as made. The gear changed after it was made: the planner sees this too."
          : "The lift is recorded and the plan is completed.";
        await settleSubmission(
          claim.id,
          { outcome: "recorded", liftRecordId, message, changes: JSON.stringify(changes) },
          transaction,
        );
        await recordAudit(
          {
            organisationId: user.organisationId,
            userId: user.id,
            entity: ENTITY,
            entityId: planId,
            action: "lift arrived from phone",
            details: { madeAt: stamp.madeAt.toISOString(), receivedAt: stamp.receivedAt.toISOString(), changes },
          },
          transaction,
        );
      },
    });
    if (result.ok) {
      if (changes.length) await tellPlanner(user, planId, stamp, { changes }, request);
      return answerFrom((await findSubmission(user.organisationId, stamp.clientId))!, false);
    }
    if (result.status === 400) {
      // Input to put right: nothing was written, the id may come again with the corrected record.
      await releaseSubmission(claim.id);
      return invalid(stamp.clientId, result.message, result.field ?? null);
    }
    // The plan could not take the record (not fit when it was made, already completed, no longer approved): the
    // refusal and the record as typed are kept for the planner, and the phone keeps its copy with the photos.
    const fields = [...form.entries()].filter(([, v]) => typeof v === "string");
    await settleSubmission(claim.id, {
      outcome: "refused",
      message: `Not recorded: ${result.message}`,
      payload: JSON.stringify(fields),
    });
    await recordAudit({
      organisationId: user.organisationId,
      userId: user.id,
      entity: ENTITY,
      entityId: planId,
      action: "lift from phone refused",
      details: { madeAt: stamp.madeAt.toISOString(), reason: result.message },
    });
    await tellPlanner(user, planId, stamp, { refusal: result.message, changes: [] }, request);
    return answerFrom((await findSubmission(user.organisationId, stamp.clientId))!, false);
  } catch (error) {
    await releaseSubmission(claim.id);
    throw error;
  }
}

/**
 * Mails the plan's planner (and, for a refused record, the appointed person who approved it) about a lift record
 * that arrived refused or with gear changed since. The record is settled first: a mail that cannot go changes
 * nothing of it, and the plan page shows the same.
 */
async function tellPlanner(
  rigger: SessionUser,
  planId: number,
  stamp: Stamp,
  arrived: { refusal?: string; changes: readonly ArrivedChange[] },
  request?: Request,
) {
  try {
    const found = await getPlan(rigger.organisationId, planId);
    if (!found) return;
    const { plan, revision } = found;
    const ids = [revision.plannedBy, ...(arrived.refusal && revision.approvedBy ? [revision.approvedBy] : [])];
    const people = await Promise.all([...new Set(ids)].map((id) => getOrganisationUser(rigger.organisationId, id)));
    const timeZone = (await getOrganisationSettings(rigger.organisationId))?.timeZone ?? "UTC";
    await mailArrivedFromPhone(
      rigger.organisationId,
      people.filter((p) => p !== null && p.id !== rigger.id).map((p) => ({ name: p!.name, email: p!.email })),
      rigger,
      { id: plan.id, title: plan.title, revision: revision.revision },
      { ...arrived, madeAt: formatDateTime(stamp.madeAt, timeZone) },
      request,
    );
  } catch {
    // The record stands as settled; the planner sees it on the plan's page.
  }
}

async function receiveDefect(
  user: SessionUser,
  form: FormData,
  itemId: number | undefined,
  stamp: Stamp,
  request?: Request,
) {
  const item = itemId ? await getGearItem(user.organisationId, itemId) : null;
  if (!item)
    return {
      status: 404,
      clientId: stamp.clientId,
      outcome: "invalid",
      message: "There is no such item in your organisation's register.",
    } satisfies SyncAnswer;
  const parsed = parseForm(defectReportSchema, form);
  if (!parsed.ok)
    return invalid(stamp.clientId, Object.values(parsed.errors).flat()[0] ?? "Describe the defect.", "defect");
  const claim = await claimSubmission({
    organisationId: user.organisationId,
    userId: user.id,
    kind: "defect",
    planId: null,
    gearItemId: item.id,
    ...stamp,
  });
  if (!claim) return answerFrom((await findSubmission(user.organisationId, stamp.clientId))!, true);
  try {
    const report = await watchAllocatedGear(
      user.organisationId,
      item.id,
      () => reportGearDefect(user.organisationId, item.id, parsed.data.defect, { id: user.id, name: user.name }),
      request,
    );
    if (!report) throw new Error("The item left the register while its defect report was being recorded.");
    await settleSubmission(claim.id, {
      outcome: "recorded",
      message: report.quarantined
        ? `The defect on ${item.itemCode} is recorded and the item is quarantined: do not use it.`
        : `The defect on ${item.itemCode} is recorded.`,
    });
    try {
      await sendDefectReportMail(
        user.organisationId,
        item,
        { defect: parsed.data.defect, reporterName: user.name, quarantined: report.quarantined },
        request,
      );
    } catch {
      // The report stands; the admins see it on the item's page.
    }
    return answerFrom((await findSubmission(user.organisationId, stamp.clientId))!, false);
  } catch (error) {
    await releaseSubmission(claim.id);
    throw error;
  }
}
