import { useState, useSyncExternalStore } from "react";
import { Form } from "react-router";
import { Button, Card, FormError } from "~/components/ui/form";
import { PERSON_ROLE_LABELS, type PersonRole } from "~/plans/document";
import { PRE_LIFT_CHECKLIST, type ChecklistId } from "~/plans/workflow";

const input = "mt-1 block w-full rounded border border-rule px-2 py-2";

/**
 * The rigger's record of the lift: each pre-lift check (the page notes when each was ticked), each
 * hold point's release, the gear confirmed on the hook by its id, who was there, the landing time in
 * the site's time (this device's zone, sent with the form), notes and photos.
 */
const noSubscription = () => () => undefined;

export function LiftRecordEntry({
  error,
  schedule,
  holdPoints,
  people,
  supervisor,
}: {
  error?: string;
  schedule: Array<{ itemId: number; itemCode: string; position: string }>;
  holdPoints: Array<{ step: number; title: string }>;
  people: Array<{ name: string; role: PersonRole }>;
  supervisor: string;
}) {
  const [tickedAt, setTickedAt] = useState<Partial<Record<ChecklistId, string>>>({});
  // The rigger's device zone, read once hydrated (the server renders UTC).
  const timeZone = useSyncExternalStore(
    noSubscription,
    () => Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC",
    () => "UTC",
  );
  const gear = schedule.filter((row, i) => schedule.findIndex((r) => r.itemId === row.itemId) === i);
  return (
    <Card title="Pre-lift checklist and lift record">
      <Form method="post" encType="multipart/form-data" className="space-y-4">
        <FormError message={error} />
        <input type="hidden" name="timeZone" value={timeZone} />
        <fieldset className="space-y-3">
          <legend className="text-sm font-semibold">Tick each before lifting</legend>
          {PRE_LIFT_CHECKLIST.map((c) => (
            <label key={c.id} className="flex items-start gap-3 text-base">
              <input
                type="checkbox"
                name={`check-${c.id}`}
                className="mt-1 h-5 w-5"
                onChange={(e) =>
                  setTickedAt((t) => ({ ...t, [c.id]: e.target.checked ? new Date().toISOString() : undefined }))
                }
              />
              <span>{c.text}</span>
              {tickedAt[c.id] && <input type="hidden" name={`check-${c.id}-at`} value={tickedAt[c.id]} />}
            </label>
          ))}
        </fieldset>
        {gear.length > 0 && (
          <fieldset className="space-y-2">
            <legend className="text-sm font-semibold">Gear on the hook, each checked by its id</legend>
            {gear.map((row) => (
              <label key={row.itemId} className="flex items-start gap-3 text-base">
                <input type="checkbox" name={`gear-${row.itemId}`} className="mt-1 h-5 w-5" />
                <span>
                  {row.itemCode} <span className="text-ink-soft">({row.position})</span>
                </span>
              </label>
            ))}
          </fieldset>
        )}
        {holdPoints.map((h) => (
          <fieldset key={h.step} className="space-y-2 rounded border border-brass/40 p-3">
            <legend className="px-1 text-sm font-semibold">
              Hold point, step {h.step}: {h.title}
            </legend>
            <label className="block text-sm">
              Released by
              <input name={`hold-${h.step}-by`} defaultValue={supervisor} className={input} />
            </label>
            <label className="block text-sm">
              Released at (site time, {timeZone})
              <input type="datetime-local" name={`hold-${h.step}-at`} className={input} />
            </label>
          </fieldset>
        ))}
        {people.length > 0 && (
          <fieldset className="space-y-2">
            <legend className="text-sm font-semibold">Who was there</legend>
            {people.map((p) => (
              <label key={p.name} className="flex items-center gap-3 text-base">
                <input type="checkbox" name="present" value={p.name} defaultChecked className="h-5 w-5" />
                <span>
                  {p.name} <span className="text-ink-soft">({PERSON_ROLE_LABELS[p.role]})</span>
                </span>
              </label>
            ))}
          </fieldset>
        )}
        <label className="block text-sm">
          When the load was landed (site time, {timeZone})
          <input type="datetime-local" name="liftedAt" className={input} />
        </label>
        <label className="block text-sm">
          Notes
          <textarea name="notes" rows={3} className={input} />
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" name="nearMiss" className="h-5 w-5" /> There was a near miss
        </label>
        <label className="block text-sm">
          What happened (for a near miss)
          <textarea name="nearMissDetails" rows={2} className={input} />
        </label>
        <label className="block text-sm">
          Photos (PNG or JPEG, up to 3, 10 MB each)
          <input type="file" name="photos" accept="image/png,image/jpeg" multiple className="mt-1 block w-full" />
        </label>
        <Button type="submit" className="w-full">
          Record the lift as done
        </Button>
      </Form>
    </Card>
  );
}
