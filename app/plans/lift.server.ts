// Recording the lift: the rigger's record completes the current approved revision, only while every
// pre-lift check is ticked and the gear it allocates is still fit to lift on the day of the lift.
import { recordAudit } from "~/models/audit-event.server";
import { createLiftRecord } from "~/models/lift-record.server";
import { addLiftRecordPhoto } from "~/models/lift-record-photo.server";
import { getPlanForWorkflow, moveRevision } from "~/models/plan.server";
import type { SessionUser } from "~/models/user.server";
import { buildLiftRecordDocument, siteTimeText, type LiftRecordForm } from "~/plans/lift-record";
import { notFitSentence, type LiveProblem } from "~/plans/live-state";
import { judgedAsMade } from "~/plans/made-offline";
import { liveStateOf } from "~/plans/live-state.server";
import { readSealed } from "~/plans/sealed";
import { PRE_LIFT_CHECKLIST, type ChecklistId } from "~/plans/workflow";
import { ENTITY, fail, NOT_FOUND, refusal, type WorkflowResult } from "~/plans/workflow-context.server";
import type { Transaction } from "sequelize";
import { transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

export type LiftRecordInput = {
  checklist: Record<ChecklistId, boolean>;
  /** When the load was landed (the page reads it in the site's time zone). */
  liftedAt: Date;
  /** Who ticked and released what and when, the gear confirmed on the hook, who was there. */
  form: LiftRecordForm;
  notes: string;
  nearMiss: boolean;
  nearMissDetails: string;
};

/**
 * A record made on a phone without signal: judged at `madeAt`, and `settle` is told in the record's transaction
 * which gear problems began between then and now.
 */
export type MadeOffline = {
  madeAt: Date;
  settle: (liftRecordId: number, arisenSince: LiveProblem[], transaction: Transaction) => Promise<void>;
};

/** Records the lift on the current approved revision, which becomes completed; every checklist item must be ticked. */
export async function recordLift(
  organisationId: number,
  planId: number,
  user: SessionUser,
  input: LiftRecordInput,
  photos: readonly CheckedUpload[] = [],
  offline?: MadeOffline,
): Promise<WorkflowResult> {
  const unticked = PRE_LIFT_CHECKLIST.filter((c) => !input.checklist[c.id]);
  if (unticked.length)
    return fail(
      400,
      `Tick every pre-lift check before recording the lift: ${unticked.map((c) => c.text.toLowerCase()).join("; ")}.`,
      `check-${unticked[0]!.id}`,
    );
  if (input.nearMiss && input.nearMissDetails.trim().length < 5)
    return fail(400, "Describe the near miss.", "nearMissDetails");
  if (input.liftedAt.getTime() > Date.now() + 5 * 60_000)
    return fail(400, "The lift time cannot be in the future.", "liftedAt");
  return transactionWithFiles(async (transaction, store): Promise<WorkflowResult> => {
    const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
    if (!loaded) return fail(404, NOT_FOUND);
    if (!loaded.approved) return fail(409, "Only the current approved revision can be lifted and recorded.");
    const sealed = readSealed(loaded.approved.sealed);
    if (!sealed)
      return fail(
        409,
        "This revision was approved before approved plans were sealed, so its gear cannot be checked: start a new revision and have it approved.",
      );
    // The server re-checks the gear at the moment of recording, whatever the page showed.
    const liveNow = await liveStateOf(organisationId, sealed, {
      liftDate: input.liftedAt.toISOString().slice(0, 10),
      transaction,
    });
    // Made without signal: what began after the record was made did not stand in the rigger's way.
    const { asMade: live, arisenSince } = offline
      ? judgedAsMade(liveNow, offline.madeAt)
      : { asMade: liveNow, arisenSince: [] };
    const refused = await refusal("record-lift", user, loaded, loaded.approved, {
      ...(live.fit ? {} : { notFitToLift: notFitSentence(live) }),
    });
    if (refused) return refused;
    const built = buildLiftRecordDocument(sealed, input.form, user.name, new Date());
    if (!built.ok) return fail(400, built.problem.message, built.problem.field);
    const completed = await moveRevision(
      loaded.approved.id,
      "approved",
      { status: "completed", closedAt: new Date() },
      transaction,
    );
    if (!completed) return fail(409, "This lift has just been recorded by someone else.");
    const record = await createLiftRecord(
      {
        revisionId: loaded.approved.id,
        checklist: JSON.stringify(input.checklist),
        liftedAt: input.liftedAt,
        notes: input.notes.trim().slice(0, 4000),
        nearMiss: input.nearMiss,
        nearMissDetails: input.nearMiss ? input.nearMissDetails.trim().slice(0, 4000) : "",
        recordedBy: user.id,
        document: JSON.stringify(built.document),
      },
      transaction,
    );
    const photoIds: number[] = [];
    for (const photo of photos) {
      const stored = await store(photo, { organisationId, purpose: "photo", uploadedBy: user.id });
      await addLiftRecordPhoto(record.id, stored.id, transaction);
      photoIds.push(stored.id);
    }
    await offline?.settle(record.id, arisenSince, transaction);
    await recordAudit(
      {
        organisationId,
        userId: user.id,
        entity: ENTITY,
        entityId: planId,
        action: "lift recorded",
        details: {
          revision: loaded.approved.revision,
          landed: siteTimeText(input.liftedAt.toISOString(), built.document.timeZone),
          nearMiss: input.nearMiss,
          photos: photoIds,
        },
      },
      transaction,
    );
    return { ok: true };
  });
}
