import { useSyncExternalStore } from "react";
import { clockTime } from "~/components/offline-banner";
import { outboxServerSnapshot, outboxSnapshot, sendWaitingWork, subscribeOutbox } from "~/offline/outbox";
import { phoneStore, type OutboxEntry } from "~/offline/store";
import { useConnection } from "~/offline/use-connection";

const STATE_WORDS: Record<OutboxEntry["state"], string> = {
  waiting: "Waiting to send",
  sent: "Arrived",
  refused: "Not recorded",
  invalid: "Needs putting right",
};

/** What this phone has saved and not yet sent, and what became of what it sent: oldest first. */
export function OutboxPanel() {
  const entries = useSyncExternalStore(subscribeOutbox, outboxSnapshot, outboxServerSnapshot);
  const { online } = useConnection();
  if (!entries.length) return null;
  const waiting = entries.filter((e) => e.state === "waiting").length;
  return (
    <section className="rounded border-2 border-ink bg-white p-4" data-testid="outbox">
      <h2 className="text-lg font-semibold">Saved on this phone</h2>
      <p className="text-base">
        {waiting
          ? `${waiting} waiting to send${online ? "." : ": they go when signal returns."}`
          : "Everything saved here has been sent."}
      </p>
      <ul className="mt-2 space-y-2">
        {entries.map((e) => (
          <li key={e.clientId} className="rounded border border-rule p-2 text-base" data-state={e.state}>
            <span className="font-semibold">{STATE_WORDS[e.state]}</span>: {e.label}, made {clockTime(e.madeAt)}
            {e.answer?.receivedAt ? `, arrived ${clockTime(e.answer.receivedAt)}` : ""}
            {e.attempts > 0 && e.state === "waiting" ? ` (tried ${e.attempts}×)` : ""}
            {e.answer?.message && <span className="block text-ink-soft">{e.answer.message}</span>}
            {(e.answer?.changes ?? []).map((c, i) => (
              <span key={i} className="block font-semibold text-fail">
                Changed after it was made: {c.message}
              </span>
            ))}
          </li>
        ))}
      </ul>
      <div className="mt-3 flex flex-wrap gap-2">
        {waiting > 0 && online && (
          <button
            type="button"
            onClick={() => void sendWaitingWork()}
            className="min-h-12 rounded bg-steel px-4 py-2 font-semibold text-white"
          >
            Send now
          </button>
        )}
        {entries.some((e) => e.state === "sent") && (
          <button
            type="button"
            onClick={() => void phoneStore.outbox.where("state").equals("sent").delete()}
            className="min-h-12 rounded border-2 border-ink/50 bg-white px-4 py-2 font-semibold text-ink"
          >
            Clear what has arrived
          </button>
        )}
      </div>
    </section>
  );
}
