// The gear's state now beside a sealed record: an allocated item quarantined, withdrawn, overdue for
// thorough examination on the lift date, or changed since approval (identity, WLL, mass) makes the
// plan NOT FIT TO LIFT. Pure and shared: the server reads the register and calls judgeLiveState.
import type { SealedItem } from "~/plans/sealed";

/** An allocated item as the register has it now. */
export type GearNow = {
  id: number;
  itemCode: string;
  kind: string;
  serial: string;
  manufacturer: string;
  wllKg: number;
  massKg: number | null;
  status: "in_service" | "quarantined" | "withdrawn";
  statusReason: string;
  statusChangedAt: string | null;
  nextDueOn: string | null;
  updatedAt: string;
};

export type LiveProblemKind = "missing" | "withdrawn" | "quarantined" | "overdue" | "changed";

export type LiveProblem = {
  itemId: number;
  itemCode: string;
  position: string;
  kind: LiveProblemKind;
  /** When it started (ISO date or timestamp), when known. */
  since: string | null;
  /** One sentence naming the item, what is wrong and since when. */
  message: string;
  /** The register's reason (a defect report, a failed examination), for people of the organisation. */
  detail: string;
};

export type LiveGearState = {
  fit: boolean;
  /** When the register was read, ISO timestamp. */
  checkedAt: string;
  /** The day examinations are judged for (the lift day), YYYY-MM-DD. */
  liftDate: string;
  problems: LiveProblem[];
};

/** WLLs and masses closer than this are the same figure (kg): unit conversions, not changes. */
const SAME_KG = 1e-6;

/** "2025-05-13 08:40 UTC" from an ISO timestamp; a bare date stays as it is. */
export function sinceText(iso: string | null): string {
  if (!iso) return "a time not on record";
  if (/^\d{4}-\d{2}-\d{2}$/.test(iso)) return iso;
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const s = d.toISOString();
  return `${s.slice(0, 10)} ${s.slice(11, 16)} UTC`;
}

/** What changed in the item's identity, WLL or mass since it was sealed; empty when nothing did. */
export function changesSinceSealed(sealed: SealedItem, now: GearNow): string[] {
  const changes: string[] = [];
  if (now.itemCode !== sealed.itemCode) changes.push(`its id is now ${now.itemCode} (was ${sealed.itemCode})`);
  if (now.kind !== sealed.kind) changes.push("its kind changed");
  if (now.serial !== sealed.serial)
    changes.push(`its serial is now ${now.serial || "blank"} (was ${sealed.serial || "blank"})`);
  if (now.manufacturer !== sealed.manufacturer) changes.push("its manufacturer changed");
  if (Math.abs(now.wllKg - sealed.wllKg) > SAME_KG)
    changes.push(`its WLL is now ${fmtKg(now.wllKg)} (was ${fmtKg(sealed.wllKg)})`);
  if ((now.massKg ?? null) !== (sealed.massKg ?? null) && Math.abs((now.massKg ?? 0) - (sealed.massKg ?? 0)) > SAME_KG)
    changes.push(`its mass is now ${now.massKg === null ? "not recorded" : fmtKg(now.massKg)}`);
  return changes;
}

const fmtKg = (kg: number) => `${Number(kg.toFixed(kg < 10 ? 2 : 1)).toLocaleString("en-GB")} kg`;

/** The sealed items judged against the register now, for a lift on `liftDate`. */
export function judgeLiveState(
  items: readonly SealedItem[],
  now: ReadonlyMap<number, GearNow>,
  liftDate: string,
  checkedAt: string,
): LiveGearState {
  const problems: LiveProblem[] = [];
  const seen = new Set<number>();
  for (const item of items) {
    // A multi-leg sling appears once per leg; judge it once.
    if (seen.has(item.itemId)) continue;
    seen.add(item.itemId);
    const named = `${item.itemCode} (${item.position})`;
    const add = (kind: LiveProblemKind, since: string | null, what: string, detail = "") =>
      problems.push({
        itemId: item.itemId,
        itemCode: item.itemCode,
        position: item.position,
        kind,
        since,
        message: `${named} ${what}.`,
        detail,
      });
    const current = now.get(item.itemId);
    if (!current) {
      add("missing", null, "is no longer in the register");
      continue;
    }
    if (current.status === "withdrawn")
      add(
        "withdrawn",
        current.statusChangedAt,
        `has been withdrawn from service since ${sinceText(current.statusChangedAt)}`,
        current.statusReason,
      );
    else if (current.status === "quarantined")
      add(
        "quarantined",
        current.statusChangedAt,
        `has been quarantined since ${sinceText(current.statusChangedAt)}`,
        current.statusReason,
      );
    if (!current.nextDueOn) add("overdue", null, "has no thorough examination on record");
    else if (current.nextDueOn < liftDate)
      add(
        "overdue",
        current.nextDueOn,
        `is overdue for thorough examination on the lift date ${liftDate} (it was due ${current.nextDueOn})`,
      );
    const changes = changesSinceSealed(item, current);
    if (changes.length)
      add(
        "changed",
        current.updatedAt,
        `has changed since approval: ${changes.join("; ")} (changed ${sinceText(current.updatedAt)})`,
      );
  }
  return { fit: problems.length === 0, checkedAt, liftDate, problems };
}

/** The sentence that opens every NOT FIT TO LIFT notice. */
export function notFitSentence(state: LiveGearState): string {
  return `NOT FIT TO LIFT: ${state.problems.map((p) => p.message).join(" ")} Do not lift to this plan: it needs a new revision, approved again.`;
}
