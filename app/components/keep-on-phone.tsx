import { useEffect, useState } from "react";
import { clockTime } from "~/components/offline-banner";
import { keepPlan, noteChecked } from "~/offline/kept";
import { phoneStore, type KeptPlan } from "~/offline/store";
import { useConnection } from "~/offline/use-connection";

/**
 * "Keep on this phone": the lift page, its checklist and the printed plan are stored for a plant room without
 * signal. Opening the page with signal keeps the page itself and notes the time its gear was checked.
 */
export function KeepOnPhone({ planId, title, checkedAt }: { planId: number; title: string; checkedAt: string }) {
  const { online } = useConnection();
  const [kept, setKept] = useState<KeptPlan | null>(null);
  const [state, setState] = useState<"idle" | "keeping" | "failed">("idle");

  useEffect(() => {
    void (async () => {
      // Only a page fetched with signal carries a fresh check; a stored copy keeps its own time.
      if (navigator.onLine) await noteChecked(planId, title, checkedAt);
      setKept((await phoneStore.kept.get(planId)) ?? null);
    })();
  }, [planId, title, checkedAt]);

  async function keep() {
    setState("keeping");
    try {
      setKept(await keepPlan(planId, title, checkedAt));
      setState("idle");
    } catch {
      setState("failed");
    }
  }

  return (
    <section className="mb-4 rounded border-2 border-steel bg-white p-3 text-base" data-testid="keep-on-phone">
      {kept ? (
        <p>
          <span className="font-semibold">Kept on this phone</span> with its printed plan. Gear last checked current at{" "}
          {clockTime(kept.checkedAt)} on {new Date(kept.checkedAt).toLocaleDateString("en-GB")}.
        </p>
      ) : (
        <p>Keep this plan on the phone to open it, tick and record where there is no signal.</p>
      )}
      {online && (
        <button
          type="button"
          onClick={keep}
          disabled={state === "keeping"}
          className="mt-2 min-h-12 w-full rounded border-2 border-steel bg-steel-soft px-4 py-2 font-semibold text-ink disabled:opacity-60"
        >
          {state === "keeping" ? "Keeping…" : kept ? "Keep again, with the latest check" : "Keep on this phone"}
        </button>
      )}
      {state === "failed" && (
        <p role="alert" className="mt-2 font-semibold text-fail">
          The plan could not be kept: the signal dropped. Try again where there is signal.
        </p>
      )}
    </section>
  );
}
