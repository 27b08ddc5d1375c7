// The register's items that need an admin's attention, in the groups an inspector works through:
// overdue, quarantined awaiting examination, never examined, and due within DUE_SOON_DAYS. Pure:
// the reminders mail and the admin's dashboard group the same way.
import { DUE_SOON_DAYS } from "~/gear/due";
import type { GearStatus } from "~/gear/kinds";
import { addDays } from "~/utils/dates";

export const ATTENTION_GROUPS = ["overdue", "quarantined", "never_examined", "due_soon"] as const;
export type AttentionGroup = (typeof ATTENTION_GROUPS)[number];

export const ATTENTION_GROUP_TITLES: Record<AttentionGroup, string> = {
  overdue: "OVERDUE (do not use until examined)",
  quarantined: "QUARANTINED, awaiting thorough examination",
  never_examined: "NEVER EXAMINED (do not use until examined)",
  due_soon: `Due within ${DUE_SOON_DAYS} days`,
};

export type AttentionItem = { status: GearStatus; nextDueOn: string | null };

/** Which group an item falls in on `today`, or null when it needs nothing (withdrawn items never do). */
export function attentionGroup(item: AttentionItem, today: string): AttentionGroup | null {
  if (item.status === "withdrawn") return null;
  if (item.status === "quarantined") return "quarantined";
  if (!item.nextDueOn) return "never_examined";
  if (item.nextDueOn < today) return "overdue";
  if (item.nextDueOn <= addDays(today, DUE_SOON_DAYS)) return "due_soon";
  return null;
}

/** The items grouped for `today`, each group in the order given; groups with nothing are empty arrays. */
export function groupForAttention<T extends AttentionItem>(items: readonly T[], today: string) {
  const groups: Record<AttentionGroup, T[]> = { overdue: [], quarantined: [], never_examined: [], due_soon: [] };
  for (const item of items) {
    const group = attentionGroup(item, today);
    if (group) groups[group].push(item);
  }
  return groups;
}
