// The gear's life as an inspector keeps it: in service -> quarantined (a defect report or a failed
// examination) -> back in service only through a passed thorough examination (recordExamination);
// withdrawn is final. The transitions and their refusals; the writes are the model's.
import { GEAR_STATUS_LABELS, type GearStatus } from "~/gear/kinds";
import { recordAudit } from "~/models/audit-event.server";
import { GEAR_ENTITY, GearItem, setGearStatus } from "~/models/gear-item.server";
import { sequelize } from "~/utils/db.server";

export type StatusChangeResult = { ok: true; item: GearItem } | { ok: false; message: string };

/**
 * An admin's change of status, along the item's life: in service -> quarantined -> withdrawn, or in
 * service -> withdrawn. Withdrawn is final (the item stays on record and is never allocated again),
 * and a quarantined item returns to service only through a passed thorough examination recorded
 * after it was quarantined (recordExamination), never by a change of status alone.
 */
export async function changeGearStatus(
  organisationId: number,
  itemId: number,
  change: { status: GearStatus; reason: string },
  actorId: number,
): Promise<StatusChangeResult> {
  return sequelize.transaction(async (transaction) => {
    const item = await GearItem.findOne({ where: { organisationId, id: itemId }, transaction });
    if (!item) return { ok: false, message: "There is no such item in your organisation." };
    if (item.status === change.status)
      return { ok: false, message: `The item is already ${GEAR_STATUS_LABELS[change.status].toLowerCase()}.` };
    if (item.status === "withdrawn")
      return {
        ok: false,
        message:
          "Withdrawn is final: the item stays on record but can never be used or allocated again. Register a replacement.",
      };
    if (change.status === "in_service")
      return {
        ok: false,
        message:
          "A quarantined item returns to service only through a passed thorough examination recorded after it was quarantined: record the examination, and a pass returns it to service.",
      };
    await setGearStatus(item, { ...change, actorId }, transaction);
    return { ok: true, item };
  });
}

/**
 * A defect reported by anyone who handles the item: an item in service is quarantined at once
 * with the report as its reason; an item already out of service keeps its status, and the report
 * is recorded either way.
 */
export async function reportGearDefect(
  organisationId: number,
  itemId: number,
  defect: string,
  reporter: { id: number; name: string },
) {
  return sequelize.transaction(async (transaction) => {
    const item = await GearItem.findOne({ where: { organisationId, id: itemId }, transaction });
    if (!item) return null;
    const quarantined = item.status === "in_service";
    if (quarantined) {
      await setGearStatus(
        item,
        {
          status: "quarantined",
          reason: `Defect reported by ${reporter.name}: ${defect}`,
          actorId: reporter.id,
          action: "defect reported",
          details: { defect },
        },
        transaction,
      );
    } else {
      await recordAudit(
        {
          organisationId,
          userId: reporter.id,
          entity: GEAR_ENTITY,
          entityId: item.id,
          action: "defect reported",
          details: { defect, from: item.status, to: item.status },
        },
        transaction,
      );
    }
    return { item, quarantined };
  });
}
