// Recording a thorough examination: the rule set's interval, the certificate's file, the item's due
// date and status, and the audit trail, in one transaction.
import { defaultNextDue, examinationIntervalMonths, intervalsOf } from "~/gear/due";
import { GEAR_KIND_INFO } from "~/gear/kinds";
import type { ExaminationFields } from "~/gear/schema";
import { recordAudit } from "~/models/audit-event.server";
import { Examination, getLatestExamination } from "~/models/examination.server";
import { GearItem, setGearStatus } from "~/models/gear-item.server";
import { getOrganisationRuleSet } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { ruleSetRow } from "~/statics/rule-sets";
import { transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

export type RecordedExamination =
  | { ok: true; examination: Examination; nextDueOn: string; quarantined: boolean; released: boolean }
  | { ok: false; field: keyof ExaminationFields; message: string }
  | null;

/**
 * Records an examination and its certificate in one transaction. The next due date defaults to the
 * organisation's rule set's interval for the item's kind (LOLER's 6 / 12 months under UK / EU rules)
 * and may not pass it unless the examination follows a named written scheme; the item's due date follows its latest examination.
 * A failed examination (or one finding a defect of immediate danger) quarantines an item in service;
 * a passed one dated on or after the day a quarantined item was taken out of use returns it to
 * service, recorded against the defect. A withdrawn item stays withdrawn.
 */
export async function recordExamination(
  organisationId: number,
  gearItemId: number,
  fields: ExaminationFields,
  certificate: CheckedUpload | null,
  actorId: number,
): Promise<RecordedExamination> {
  return transactionWithFiles(async (transaction, store) => {
    const item = await GearItem.findOne({ where: { organisationId, id: gearItemId }, transaction });
    if (!item) return null;
    const intervals = intervalsOf(
      ruleSetRow(await getReferenceTables(), await getOrganisationRuleSet(organisationId, transaction)),
    );
    const nextDueOn = fields.nextDueOn ?? defaultNextDue(item.kind, fields.examinedOn, intervals);
    const latestAllowed = defaultNextDue(item.kind, fields.examinedOn, intervals);
    if (nextDueOn > latestAllowed && !fields.schemeReference) {
      const months = examinationIntervalMonths(item.kind, intervals);
      const what = GEAR_KIND_INFO[item.kind].accessory ? "a lifting accessory" : "lifting equipment";
      return {
        ok: false,
        field: "nextDueOn",
        message: `Your rules (${intervals.source ?? "the organisation's rule set"}) want ${what} examined at least every ${months} months: the next examination is due by ${latestAllowed} at the latest. A longer interval needs a written examination scheme: name it.`,
      };
    }
    const file = certificate
      ? await store(certificate, { organisationId, purpose: "certificate", uploadedBy: actorId })
      : null;
    const examination = await Examination.create(
      {
        organisationId,
        gearItemId,
        kind: fields.kind,
        examinedOn: fields.examinedOn,
        reportNumber: fields.reportNumber,
        examiner: fields.examiner,
        examinerOrganisation: fields.examinerOrganisation,
        result: fields.result,
        defects: fields.defects,
        defectUrgency: fields.defectUrgency,
        defectsDueBy: fields.defectUrgency === "by_date" ? fields.defectsDueBy : null,
        schemeReference: fields.schemeReference,
        nextDueOn,
        certificateFileId: file?.id ?? null,
        recordedBy: actorId,
      },
      { transaction },
    );
    const latest = await getLatestExamination(organisationId, gearItemId, transaction);
    if (latest) await item.update({ lastExaminedOn: latest.examinedOn, nextDueOn: latest.nextDueOn }, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "gear_item",
        entityId: gearItemId,
        action: "examination recorded",
        details: {
          examinationId: examination.id,
          kind: fields.kind,
          examinedOn: fields.examinedOn,
          reportNumber: fields.reportNumber,
          result: fields.result,
          defectUrgency: fields.defectUrgency,
          nextDueOn,
          examiner: fields.examiner,
          examinerOrganisation: fields.examinerOrganisation,
          schemeReference: fields.schemeReference,
        },
      },
      transaction,
    );
    const report = [fields.reportNumber && `report ${fields.reportNumber}`, fields.examiner].filter(Boolean).join(", ");
    const fails = fields.result === "fail" || fields.defectUrgency === "immediate";
    const quarantined = fails && item.status === "in_service";
    if (quarantined) {
      await setGearStatus(
        item,
        {
          status: "quarantined",
          reason: `Failed thorough examination on ${fields.examinedOn} (${report}): ${fields.defects}`,
          actorId,
        },
        transaction,
      );
    }
    const quarantinedOn = item.statusChangedAt ? item.statusChangedAt.toISOString().slice(0, 10) : "";
    const released =
      !fails && item.status === "quarantined" && fields.examinedOn >= quarantinedOn && latest?.id === examination.id;
    if (released) {
      await setGearStatus(
        item,
        {
          status: "in_service",
          reason: `Passed thorough examination on ${fields.examinedOn} (${report}) after being quarantined: ${item.statusReason}`,
          actorId,
          action: "returned to service",
          details: { examinationId: examination.id },
        },
        transaction,
      );
    }
    return { ok: true, examination, nextDueOn, quarantined, released };
  });
}
