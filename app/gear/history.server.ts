// An item's history as its page shows it: every audited change, with who made it.
import { listAuditEvents } from "~/models/audit-event.server";
import { GEAR_ENTITY } from "~/models/gear-item.server";
import { User } from "~/models/user.server";

export type GearHistoryEntry = {
  id: number;
  at: string;
  who: string;
  action: string;
  details: Record<string, unknown>;
};

/** The item's audit trail, oldest first, with the name of whoever acted. */
export async function listGearHistory(organisationId: number, itemId: number): Promise<GearHistoryEntry[]> {
  const events = await listAuditEvents(organisationId, GEAR_ENTITY, itemId);
  const userIds = [...new Set(events.map((e) => e.userId).filter((id): id is number => id !== null))];
  const users = userIds.length
    ? await User.findAll({ where: { organisationId, id: userIds }, attributes: ["id", "name"] })
    : [];
  const names = new Map(users.map((u) => [u.id, u.name]));
  return events.map((e) => ({
    id: e.id,
    at: e.createdAt.toISOString(),
    who: e.userId === null ? "Plumbline" : (names.get(e.userId) ?? "a former user"),
    action: e.action,
    details: e.details ? (JSON.parse(e.details) as Record<string, unknown>) : {},
  }));
}
