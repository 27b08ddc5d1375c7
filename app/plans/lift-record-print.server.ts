// Gathers the record of a lift for its own PDF: the sealed plan it was made to, the record and its
// document, and the photos' bytes.
import { getLiftRecord } from "~/models/lift-record.server";
import { listLiftRecordPhotoIds } from "~/models/lift-record-photo.server";
import { getPlanRevision, getPlanRow, listRevisionSummaries } from "~/models/plan.server";
import { getStoredFile } from "~/models/stored-file.server";
import { userNames, type SessionUser } from "~/models/user.server";
import { readLiftRecordDocument } from "~/plans/lift-record";
import type { PrintableLiftRecord } from "~/plans/pdf/lift-record.server";
import { printableFrom } from "~/plans/printable.server";
import { readSealed } from "~/plans/sealed";
import { readStoredBytes } from "~/utils/uploads.server";

export type LiftRecordOutcome =
  { ok: true; record: PrintableLiftRecord; revision: number } | { ok: false; status: 404 | 409; message: string };

/** The record of the plan's lift, ready to print; 409 while no lift has been recorded. */
export async function buildPrintableLiftRecord(
  user: SessionUser,
  planId: number,
  request: Request,
): Promise<LiftRecordOutcome> {
  const plan = await getPlanRow(user.organisationId, planId);
  if (!plan) return { ok: false, status: 404, message: "There is no such plan in your organisation." };
  const completed = (await listRevisionSummaries(plan.id)).find((r) => r.status === "completed");
  const row = completed ? await getPlanRevision(plan.id, completed.id) : null;
  const record = row ? await getLiftRecord(row.id) : null;
  const sealed = row ? readSealed(row.sealed) : null;
  if (!row || !record || !sealed)
    return { ok: false, status: 409, message: "No lift has been recorded to a sealed revision of this plan yet." };
  const recorder = (await userNames(user.organisationId, [record.recordedBy])).get(record.recordedBy) ?? "unknown";
  const photos: PrintableLiftRecord["photos"] = [];
  for (const id of await listLiftRecordPhotoIds(record.id)) {
    const file = await getStoredFile(user.organisationId, id, "photo");
    const bytes = file ? await readStoredBytes(file) : null;
    if (file && bytes) photos.push({ bytes, type: file.contentType === "image/png" ? "png" : "jpeg" });
  }
  return {
    ok: true,
    revision: row.revision,
    record: {
      plan: printableFrom(user, row, sealed, request, {
        live: null,
        liftRecord: { liftedAt: record.liftedAt.toISOString(), by: recorder },
      }),
      liftedAt: record.liftedAt.toISOString(),
      recordedBy: recorder,
      notes: record.notes,
      nearMiss: record.nearMiss,
      nearMissDetails: record.nearMissDetails,
      document: readLiftRecordDocument(record.document),
      photos,
    },
  };
}
