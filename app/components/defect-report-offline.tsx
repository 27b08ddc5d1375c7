import { useEffect, useRef, useState } from "react";
import { FieldProblem } from "~/components/tick-row";
import { dropDraft, loadDraft, saveDraft } from "~/offline/drafts";
import { queueWork, sendWaitingWork } from "~/offline/outbox";

/**
 * Reporting a defect from the lift page, with or without signal: the words are kept on the phone as typed, and
 * the report is saved and sent like a lift record (once, in order). The server quarantines the item as the item
 * page's report does.
 */
export function DefectReportOffline({ itemId, itemCode }: { itemId: number; itemCode: string }) {
  const draftKey = `defect-${itemId}`;
  const formRef = useRef<HTMLFormElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);

  useEffect(() => {
    void loadDraft(draftKey).then((draft) => {
      const text = draft?.fields.find(([n]) => n === "defect")?.[1];
      const area = formRef.current?.elements.namedItem("defect");
      if (text && area instanceof HTMLTextAreaElement) area.value = text;
    });
  }, [draftKey]);

  async function send(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const area = event.currentTarget.elements.namedItem("defect") as HTMLTextAreaElement;
    const defect = area.value.trim();
    if (defect.length < 3) {
      setProblem("Describe the defect you found.");
      area.focus();
      return;
    }
    setProblem(null);
    await queueWork({
      kind: "defect",
      planId: null,
      itemId,
      label: `Defect on ${itemCode}`,
      fields: [["defect", defect]],
      photos: [],
    });
    await dropDraft(draftKey);
    area.value = "";
    setSaved(true);
    void sendWaitingWork();
  }

  return (
    <details className="mt-1">
      <summary className="flex min-h-12 cursor-pointer items-center text-base font-semibold text-steel underline">
        Report a defect on {itemCode}
      </summary>
      <form
        ref={formRef}
        onSubmit={send}
        onChange={() => formRef.current && void saveDraft(draftKey, formRef.current)}
        className="mt-2 space-y-2"
        noValidate
      >
        <label className="block text-base font-semibold">
          What is wrong with {itemCode}
          <textarea
            name="defect"
            rows={2}
            maxLength={2000}
            aria-invalid={problem ? true : undefined}
            className="mt-1 block min-h-12 w-full rounded border-2 border-ink/50 bg-white px-3 py-2 text-base"
          />
        </label>
        <FieldProblem id={`defect-${itemId}-problem`} message={problem} />
        <button type="submit" className="min-h-12 w-full rounded bg-fail px-4 py-2 font-semibold text-white">
          Save the defect report
        </button>
        {saved && (
          <p role="status" className="font-semibold">
            Saved on this phone; it is sent when there is signal. Do not use {itemCode} meanwhile.
          </p>
        )}
      </form>
    </details>
  );
}
