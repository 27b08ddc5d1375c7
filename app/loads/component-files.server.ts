// A component's drawings and photos: the uploaded file stored and linked, or the link removed, with the audit trail.
import { recordAudit } from "~/models/audit-event.server";
import { ComponentFile, type ComponentFileKind } from "~/models/component.server";
import { sequelize } from "~/utils/db.server";
import { transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

/** Stores a checked upload and links it to the component, in one transaction (bytes removed again on failure). */
export async function addComponentFile(
  organisationId: number,
  componentId: number,
  upload: CheckedUpload,
  input: { kind: ComponentFileKind; caption: string },
  actorId: number,
) {
  return transactionWithFiles(async (transaction, store) => {
    const stored = await store(upload, { organisationId, purpose: input.kind, uploadedBy: actorId });
    const link = await ComponentFile.create(
      { componentId, storedFileId: stored.id, kind: input.kind, caption: input.caption },
      { transaction },
    );
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "component",
        entityId: componentId,
        action: `${input.kind} added`,
        details: { file: upload.originalName },
      },
      transaction,
    );
    return link;
  });
}

export async function removeComponentFile(
  organisationId: number,
  componentId: number,
  componentFileId: number,
  actorId: number,
) {
  return sequelize.transaction(async (transaction) => {
    const count = await ComponentFile.destroy({ where: { id: componentFileId, componentId }, transaction });
    if (count) {
      await recordAudit(
        { organisationId, userId: actorId, entity: "component", entityId: componentId, action: "file removed" },
        transaction,
      );
    }
    return count === 1;
  });
}
