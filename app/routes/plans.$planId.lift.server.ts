import { CONTROL_CHARACTER_MESSAGE, hasControlCharacters } from "~/utils/forms";
// Reading the lift page's form: the ticks and when the page saw each ticked, the landing time and the
// hold point releases in the site's time zone, the gear confirmed on the hook, the people present.
import { isTimeZone, zonedTimeToUtc, type LiftRecordForm } from "~/plans/lift-record";
import type { LiftRecordInput } from "~/plans/lift.server";
import { PRE_LIFT_CHECKLIST, type ChecklistId } from "~/plans/workflow";

const text = (form: FormData, name: string) => {
  const value = form.get(name);
  return typeof value === "string" ? value : "";
};

/** The lift record as sent, or the sentence saying which time could not be read. */
export function readLiftForm(
  form: FormData,
): { ok: true; input: LiftRecordInput } | { ok: false; message: string; field: string } {
  const zone = text(form, "timeZone");
  const timeZone = isTimeZone(zone) ? zone : "UTC";
  const checklist = Object.fromEntries(
    PRE_LIFT_CHECKLIST.map((c) => [c.id, text(form, `check-${c.id}`) === "on"]),
  ) as Record<ChecklistId, boolean>;
  const tickedAt: LiftRecordForm["tickedAt"] = {};
  for (const c of PRE_LIFT_CHECKLIST) {
    const at = new Date(text(form, `check-${c.id}-at`));
    if (checklist[c.id] && !Number.isNaN(at.getTime())) tickedAt[c.id] = at;
  }
  const landed = text(form, "liftedAt");
  const liftedAt = landed ? zonedTimeToUtc(landed, timeZone) : new Date();
  if (!liftedAt) return { ok: false, message: "Give the time of the lift as a date and time.", field: "liftedAt" };
  const holdPoints: LiftRecordForm["holdPoints"] = [];
  for (const [key] of form.entries()) {
    const m = /^hold-(\d{1,2})-by$/.exec(key);
    if (!m) continue;
    const step = Number(m[1]);
    const at = text(form, `hold-${step}-at`);
    holdPoints.push({ step, releasedBy: text(form, key), releasedAt: at ? zonedTimeToUtc(at, timeZone) : null });
  }
  // Free text (notes, near miss, who released a hold point, who was there) keeps no control characters.
  const freeText = [
    text(form, "notes"),
    text(form, "nearMissDetails"),
    ...holdPoints.map((h) => h.releasedBy),
    ...form.getAll("present").map(String),
  ];
  if (freeText.some((t) => hasControlCharacters(t, true)))
    return { ok: false, message: CONTROL_CHARACTER_MESSAGE, field: "notes" };
  const gearConfirmed = [...form.keys()]
    .map((k) => /^gear-(\d{1,9})$/.exec(k))
    .filter((m) => m !== null && text(form, m[0]) === "on")
    .map((m) => Number(m![1]));
  return {
    ok: true,
    input: {
      checklist,
      liftedAt,
      form: {
        timeZone,
        tickedAt,
        holdPoints,
        gearConfirmed,
        peoplePresent: form.getAll("present").filter((v): v is string => typeof v === "string"),
      },
      notes: text(form, "notes"),
      nearMiss: text(form, "nearMiss") === "on",
      nearMissDetails: text(form, "nearMissDetails"),
    },
  };
}
