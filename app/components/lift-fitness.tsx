import { OfflineCurrency } from "~/components/offline-currency";
import { sinceText, type LiveGearState } from "~/plans/live-state";

const KIND_WORDS = {
  missing: "Not in the register",
  withdrawn: "Withdrawn",
  quarantined: "Quarantined",
  overdue: "Examination overdue",
  changed: "Changed since approval",
} as const;

/**
 * The gear of an approved plan judged now, beside its sealed record: NOT FIT TO LIFT in words and
 * colour, naming each item and since when; or fit, with the time it was checked.
 */
export function LiftFitness({ live, sealedMissing = false }: { live: LiveGearState | null; sealedMissing?: boolean }) {
  if (sealedMissing)
    return (
      <p role="alert" className="mb-4 rounded border-2 border-warn bg-warn-soft px-3 py-2 text-sm text-warn">
        This revision was approved before approved plans were sealed, so its gear cannot be checked against it. Start a
        new revision and have it approved before lifting.
      </p>
    );
  if (!live) return null;
  if (live.fit)
    return (
      // Without signal the page says when it was last checked, not that the gear is fit now.
      <OfflineCurrency checkedAt={live.checkedAt}>
        <p className="mb-4 rounded border border-pass/40 bg-pass-soft px-3 py-2 text-sm text-pass" data-testid="fit">
          <span className="font-semibold">Fit to lift</span> as checked {sinceText(live.checkedAt)}: every allocated
          item is in service, in date for thorough examination on {live.liftDate} and as approved.
        </p>
      </OfflineCurrency>
    );
  return (
    <div role="alert" className="mb-4 rounded border-4 border-fail bg-fail p-4 text-white" data-testid="not-fit">
      <p className="text-xl font-semibold">NOT FIT TO LIFT</p>
      <p className="mt-1 font-semibold">
        Do not lift to this plan: gear it names has changed since it was approved (checked {sinceText(live.checkedAt)}).
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        {live.problems.map((p, i) => (
          <li key={i}>
            <span className="font-semibold">
              {KIND_WORDS[p.kind]}
              {p.since ? ` since ${sinceText(p.since)}` : ""}:
            </span>{" "}
            {p.message}
            {p.detail && <span className="block">{p.detail}</span>}
          </li>
        ))}
      </ul>
      <p className="mt-2 text-sm">
        Start a new revision with other gear (or put the item right) and have it approved again.
      </p>
    </div>
  );
}
