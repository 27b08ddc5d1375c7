import { useEffect, useRef, useState, useSyncExternalStore } from "react";
import { Card, FormError } from "~/components/ui/form";
import { FieldProblem, TickRow } from "~/components/tick-row";
import { clockTime } from "~/components/offline-banner";
import { dropDraft, loadDraft, putDraft, readForm, restoreForm, saveDraft } from "~/offline/drafts";
import { outboxServerSnapshot, outboxSnapshot, queueWork, sendWaitingWork, subscribeOutbox } from "~/offline/outbox";
import { phoneStore } from "~/offline/store";
import { PERSON_ROLE_LABELS, type PersonRole } from "~/plans/document";
import { PRE_LIFT_CHECKLIST, type ChecklistId } from "~/plans/workflow";

const input = "mt-1 block min-h-12 w-full rounded border-2 border-ink/50 bg-white px-3 py-2 text-base text-ink";
const labelText = "block text-base font-semibold text-ink";

type Problem = { field: string | null; message: string };

/**
 * The rigger's record of the lift: each pre-lift check (the page notes when each was ticked), each hold point's
 * release, the gear confirmed on the hook by its id, who was there, the landing time in the site's time zone,
 * notes and photos. Everything typed is kept on the phone as it is entered; sending saves the record on the phone
 * first and sends it when there is signal (once, by the phone's id for it). Without script the form posts as a
 * plain form.
 */
export function LiftRecordEntry({
  planId,
  planTitle,
  error,
  errorField,
  schedule,
  holdPoints,
  people,
  supervisor,
  timeZone,
}: {
  planId: number;
  planTitle: string;
  error?: string;
  errorField?: string | null;
  schedule: Array<{ itemId: number; itemCode: string; position: string }>;
  holdPoints: Array<{ step: number; title: string }>;
  people: Array<{ name: string; role: PersonRole }>;
  supervisor: string;
  /** The organisation's (the site's) time zone: the times are entered in it. */
  timeZone: string;
}) {
  const draftKey = `lift-${planId}`;
  const formRef = useRef<HTMLFormElement>(null);
  const [tickedAt, setTickedAt] = useState<Partial<Record<ChecklistId, string>>>({});
  const [problem, setProblem] = useState<Problem | null>(error ? { field: errorField ?? null, message: error } : null);
  const [sending, setSending] = useState(false);
  const outbox = useSyncExternalStore(subscribeOutbox, outboxSnapshot, outboxServerSnapshot);
  const mine = outbox.filter((e) => e.kind === "lift" && e.planId === planId);
  const saved = mine.find((e) => e.state === "waiting" || e.state === "sent");
  const bounced = mine.find((e) => e.state === "invalid");

  // What was typed before a reload or a closed tab comes back into the form.
  useEffect(() => {
    void loadDraft(draftKey).then((draft) => {
      if (!draft || !formRef.current) return;
      restoreForm(formRef.current, draft);
      setTickedAt(
        Object.fromEntries(
          draft.fields.filter(([n]) => /^check-.+-at$/.test(n)).map(([n, v]) => [n.slice(6, -3), v]),
        ) as Partial<Record<ChecklistId, string>>,
      );
    });
  }, [draftKey]);

  // A record the server sent back to put right returns to the form, its problem beside the field.
  useEffect(() => {
    if (!bounced) return;
    void (async () => {
      await putDraft({ key: draftKey, fields: bounced.fields, photos: bounced.photos, updatedAt: bounced.madeAt });
      await phoneStore.outbox.delete(bounced.seq!);
      if (formRef.current) restoreForm(formRef.current, bounced);
      setProblem({ field: bounced.answer?.field ?? null, message: bounced.answer?.message ?? "Check the record." });
    })();
  }, [bounced, draftKey]);

  // The first problem takes the focus, so a gloved rigger is taken to it on a long card.
  useEffect(() => {
    if (!problem?.field || !formRef.current) return;
    const field = formRef.current.querySelector<HTMLElement>(`[name="${CSS.escape(problem.field)}"]`);
    field?.scrollIntoView({ block: "center" });
    field?.focus();
  }, [problem]);

  const keep = () => {
    // After React has rendered the tick's time, so the draft holds it too.
    window.setTimeout(() => formRef.current && void saveDraft(draftKey, formRef.current), 0);
  };

  async function send(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const unticked = PRE_LIFT_CHECKLIST.find(
      (c) => !(form.elements.namedItem(`check-${c.id}`) as HTMLInputElement)?.checked,
    );
    if (unticked) {
      setProblem({
        field: `check-${unticked.id}`,
        message: `Tick every pre-lift check before recording the lift: ${unticked.text.toLowerCase()}.`,
      });
      return;
    }
    setProblem(null);
    setSending(true);
    const { fields, photos } = readForm(form);
    const entry = await queueWork({
      kind: "lift",
      planId,
      itemId: null,
      label: `Lift record: ${planTitle}`,
      fields,
      photos,
    });
    await dropDraft(draftKey);
    await sendWaitingWork();
    const after = await phoneStore.outbox.get(entry.seq!);
    if (after?.state === "sent") {
      window.location.assign(`/plans/${planId}`);
      return;
    }
    setSending(false);
  }

  const problemFor = (name: string) => (problem?.field === name ? problem.message : null);
  const gear = schedule.filter((row, i) => schedule.findIndex((r) => r.itemId === row.itemId) === i);

  if (saved)
    return (
      <Card title="Lift record">
        <p
          role="status"
          data-testid="lift-saved"
          className="rounded border-2 border-steel bg-steel-soft p-3 text-base text-ink"
        >
          {saved.state === "sent"
            ? `The lift record made at ${clockTime(saved.madeAt)} has arrived${
                saved.answer?.receivedAt ? ` (${clockTime(saved.answer.receivedAt)})` : ""
              }. ${saved.answer?.message ?? ""}`
            : `The lift record made at ${clockTime(saved.madeAt)} is saved on this phone and waiting to send. It goes when signal returns; nothing more to do.`}
        </p>
        {saved.state === "sent" && (
          <p className="mt-3">
            <a href={`/plans/${planId}`}>Open the plan</a>
          </p>
        )}
      </Card>
    );

  return (
    <Card title="Pre-lift checklist and lift record">
      <form
        ref={formRef}
        method="post"
        encType="multipart/form-data"
        className="space-y-5"
        onSubmit={send}
        onChange={keep}
        noValidate
        data-testid="lift-form"
      >
        <FormError message={problem && !problem.field ? problem.message : null} />
        <input type="hidden" name="timeZone" value={timeZone} />
        <fieldset className="space-y-2">
          <legend className="mb-2 text-base font-semibold">Tick each before lifting</legend>
          {PRE_LIFT_CHECKLIST.map((c) => (
            <TickRow
              key={c.id}
              name={`check-${c.id}`}
              problem={problemFor(`check-${c.id}`)}
              onChange={(checked) =>
                setTickedAt((t) => ({ ...t, [c.id]: checked ? new Date().toISOString() : undefined }))
              }
            >
              {c.text}
              {tickedAt[c.id] && <input type="hidden" name={`check-${c.id}-at`} value={tickedAt[c.id]} />}
            </TickRow>
          ))}
        </fieldset>
        {gear.length > 0 && (
          <fieldset className="space-y-2">
            <legend className="mb-2 text-base font-semibold">Gear on the hook, each checked by its id</legend>
            {gear.map((row) => (
              <TickRow key={row.itemId} name={`gear-${row.itemId}`} problem={problemFor(`gear-${row.itemId}`)}>
                {row.itemCode} <span className="text-ink-soft">({row.position})</span>
              </TickRow>
            ))}
          </fieldset>
        )}
        {holdPoints.map((h) => (
          <fieldset key={h.step} className="space-y-3 rounded border-2 border-brass p-3">
            <legend className="px-1 text-base font-semibold">
              Hold point, step {h.step}: {h.title}
            </legend>
            <label className={labelText}>
              Released by
              <input name={`hold-${h.step}-by`} defaultValue={supervisor} className={input} />
            </label>
            <FieldProblem id={`hold-${h.step}-by-problem`} message={problemFor(`hold-${h.step}-by`)} />
            <label className={labelText}>
              Released at (site time, {timeZone})
              <input type="datetime-local" name={`hold-${h.step}-at`} className={input} />
            </label>
            <FieldProblem id={`hold-${h.step}-at-problem`} message={problemFor(`hold-${h.step}-at`)} />
          </fieldset>
        ))}
        {people.length > 0 && (
          <fieldset className="space-y-2">
            <legend className="mb-2 text-base font-semibold">Who was there</legend>
            {people.map((p) => (
              <TickRow key={p.name} name="present" value={p.name} defaultChecked>
                {p.name} <span className="text-ink-soft">({PERSON_ROLE_LABELS[p.role]})</span>
              </TickRow>
            ))}
          </fieldset>
        )}
        <label className={labelText}>
          When the load was landed (site time, {timeZone})
          <input type="datetime-local" name="liftedAt" className={input} />
        </label>
        <FieldProblem id="liftedAt-problem" message={problemFor("liftedAt")} />
        <label className={labelText}>
          Notes
          <textarea name="notes" rows={3} className={input} />
        </label>
        <FieldProblem id="notes-problem" message={problemFor("notes")} />
        <TickRow name="nearMiss">There was a near miss</TickRow>
        <label className={labelText}>
          What happened (for a near miss)
          <textarea name="nearMissDetails" rows={2} className={input} />
        </label>
        <FieldProblem id="nearMissDetails-problem" message={problemFor("nearMissDetails")} />
        <label className={labelText}>
          Photos (PNG or JPEG, up to 3, 10 MB each)
          <input type="file" name="photos" accept="image/png,image/jpeg" multiple className={`${input} text-sm`} />
        </label>
        <FieldProblem id="photos-problem" message={problemFor("photos")} />
        <button
          type="submit"
          disabled={sending}
          className="min-h-14 w-full rounded bg-steel px-4 py-3 text-lg font-semibold text-white disabled:opacity-60"
        >
          Record the lift as done
        </button>
        <p className="text-sm text-ink-soft">
          What you enter is saved on this phone as you go. Without signal the record waits on the phone and is sent once
          when signal returns.
        </p>
      </form>
    </Card>
  );
}
