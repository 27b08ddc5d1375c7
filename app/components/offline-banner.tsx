import { useSyncExternalStore } from "react";
import { useConnection } from "~/offline/use-connection";
import { outboxServerSnapshot, outboxSnapshot, subscribeOutbox } from "~/offline/outbox";

/** "14:05" in the device's clock, from an ISO time. */
export function clockTime(iso: string) {
  return new Date(iso).toLocaleTimeString("en-GB", { hour: "2-digit", minute: "2-digit" });
}

/**
 * Across the top of every page while the phone has no signal: since when, and that what is entered is kept on
 * the phone; and, with signal, how much work is still waiting to be sent.
 */
export function OfflineBanner() {
  const { online, offlineSince } = useConnection();
  const outbox = useSyncExternalStore(subscribeOutbox, outboxSnapshot, outboxServerSnapshot);
  const waiting = outbox.filter((e) => e.state === "waiting").length;
  if (online && !waiting) return null;
  return (
    <div
      role="status"
      data-testid="offline-banner"
      className={`no-print px-4 py-3 text-base font-semibold ${online ? "bg-steel text-white" : "bg-ink text-white"}`}
    >
      <p className="mx-auto max-w-6xl">
        {online
          ? `Sending ${waiting} saved ${waiting === 1 ? "record" : "records"} now that there is signal…`
          : `No signal${offlineSince ? ` since ${clockTime(offlineSince)}` : ""}. What you enter is saved on this phone${
              waiting ? ` (${waiting} waiting to send)` : ""
            } and sent when signal returns.`}
      </p>
    </div>
  );
}
