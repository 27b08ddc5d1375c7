// The lift record as a document: each pre-lift check with who ticked it and when, each hold point with
// who released it and when, the gear confirmed on the hook by its id, the people present, the landing
// time and the site's time zone. Pure and shared: the lift page builds the form from it, the server
// checks and stores it, the plan page, the history and the record's PDF show it.
import type { SealedPlan } from "~/plans/sealed";
import { PRE_LIFT_CHECKLIST, type ChecklistId } from "~/plans/workflow";

export type LiftRecordDocument = {
  /** The site's IANA time zone (the rigger's device at the lift), or "UTC" when the page could not tell. */
  timeZone: string;
  ticks: Array<{ id: ChecklistId; text: string; by: string; at: string }>;
  holdPoints: Array<{ step: number; title: string; releasedBy: string; at: string }>;
  gear: Array<{ itemId: number; itemCode: string; position: string }>;
  people: Array<{ name: string; role: string; present: boolean }>;
};

/** Whether the text names a time zone this runtime knows. */
export function isTimeZone(zone: string): boolean {
  if (!zone || zone.length > 64) return false;
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** Minutes the zone is ahead of UTC at the instant `utcMs`. */
function offsetMinutes(utcMs: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat("en-GB", {
    timeZone,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(new Date(utcMs));
  const n = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  const wall = Date.UTC(n("year"), n("month") - 1, n("day"), n("hour"), n("minute"), n("second"));
  return Math.round((wall - Math.floor(utcMs / 1000) * 1000) / 60_000);
}

/**
 * The instant a wall-clock time ("2025-06-02T14:05", as a datetime-local field sends it) names in the
 * zone; null when the text is not such a time. A time the clocks skip is taken an hour on; a time they
 * pass twice, the first.
 */
export function zonedTimeToUtc(wall: string, timeZone: string): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(wall);
  if (!m || !isTimeZone(timeZone)) return null;
  const asUtc = Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!, +m[4]!, +m[5]!, +(m[6] ?? 0));
  if (Number.isNaN(asUtc)) return null;
  // Two passes settle the offset for any time not within an hour of a change of the clocks.
  let guess = asUtc - offsetMinutes(asUtc, timeZone) * 60_000;
  guess = asUtc - offsetMinutes(guess, timeZone) * 60_000;
  return new Date(guess);
}

/** "2 June 2025, 14:05 (Europe/London)" */
export function siteTimeText(iso: string, timeZone: string): string {
  const zone = isTimeZone(timeZone) ? timeZone : "UTC";
  const text = new Date(iso).toLocaleString("en-GB", {
    timeZone: zone,
    day: "numeric",
    month: "long",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
  });
  return `${text} (${zone})`;
}

/** The hold points of the sealed sequence, numbered as the print numbers its steps. */
export function holdPointsOf(sealed: Pick<SealedPlan, "details">) {
  return sealed.details.sequence.flatMap((s, i) => (s.holdPoint ? [{ step: i + 1, title: s.title }] : []));
}

export type LiftRecordForm = {
  timeZone: string;
  /** When each check was ticked, as the page saw it; the server's time where the page sent none. */
  tickedAt: Partial<Record<ChecklistId, Date>>;
  holdPoints: Array<{ step: number; releasedBy: string; releasedAt: Date | null }>;
  gearConfirmed: number[];
  peoplePresent: string[];
};

export type LiftRecordProblem = { field: string; message: string };

/**
 * The record's document from what the rigger sent, checked against the sealed plan: every hold point
 * released by a named person at a time no later than now, every item on the hook confirmed by its id.
 */
export function buildLiftRecordDocument(
  sealed: Pick<SealedPlan, "details" | "schedule">,
  form: LiftRecordForm,
  rigger: string,
  now: Date,
): { ok: true; document: LiftRecordDocument } | { ok: false; problem: LiftRecordProblem } {
  const soon = now.getTime() + 5 * 60_000;
  const holdPoints: LiftRecordDocument["holdPoints"] = [];
  for (const hold of holdPointsOf(sealed)) {
    const given = form.holdPoints.find((h) => h.step === hold.step);
    const by = given?.releasedBy.trim() ?? "";
    if (by.length < 2)
      return {
        ok: false,
        problem: {
          field: `hold-${hold.step}-by`,
          message: `Say who released hold point ${hold.step} (${hold.title}).`,
        },
      };
    if (!given?.releasedAt || given.releasedAt.getTime() > soon)
      return {
        ok: false,
        problem: {
          field: `hold-${hold.step}-at`,
          message: `Give the time hold point ${hold.step} (${hold.title}) was released, not later than now.`,
        },
      };
    holdPoints.push({
      step: hold.step,
      title: hold.title,
      releasedBy: by.slice(0, 120),
      at: given.releasedAt.toISOString(),
    });
  }
  const seen = new Set<number>();
  const gear: LiftRecordDocument["gear"] = [];
  for (const item of sealed.schedule) {
    if (seen.has(item.itemId)) continue;
    seen.add(item.itemId);
    if (!form.gearConfirmed.includes(item.itemId))
      return {
        ok: false,
        problem: {
          field: `gear-${item.itemId}`,
          message: `Confirm ${item.itemCode} (${item.position}) is on the hook by its id. If other gear was used, stop: the plan needs a new revision.`,
        },
      };
    gear.push({ itemId: item.itemId, itemCode: item.itemCode, position: item.position });
  }
  const ticks = PRE_LIFT_CHECKLIST.map((c) => {
    const at = form.tickedAt[c.id];
    const when = at && !Number.isNaN(at.getTime()) && at.getTime() <= soon ? at : now;
    return { id: c.id, text: c.text, by: rigger, at: when.toISOString() };
  });
  const present = new Set(form.peoplePresent);
  return {
    ok: true,
    document: {
      timeZone: isTimeZone(form.timeZone) ? form.timeZone : "UTC",
      ticks,
      holdPoints,
      gear,
      people: sealed.details.people.map((p) => ({ name: p.name, role: p.role, present: present.has(p.name) })),
    },
  };
}

/** The stored document, or null for a record made before documents were kept. */
export function readLiftRecordDocument(json: string | null | undefined): LiftRecordDocument | null {
  if (!json) return null;
  return JSON.parse(json) as LiftRecordDocument;
}

/** The form of a lift made exactly as planned: every hold point released by `releasedBy` at `at`, all gear confirmed, everyone present. */
export function formAsPlanned(
  sealed: Pick<SealedPlan, "details" | "schedule">,
  releasedBy: string,
  at: Date,
  timeZone = "UTC",
): LiftRecordForm {
  return {
    timeZone,
    tickedAt: {},
    holdPoints: holdPointsOf(sealed).map((h) => ({ step: h.step, releasedBy, releasedAt: at })),
    gearConfirmed: sealed.schedule.map((s) => s.itemId),
    peoplePresent: sealed.details.people.map((p) => p.name),
  };
}
