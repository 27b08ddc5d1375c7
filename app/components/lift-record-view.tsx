import { PERSON_ROLE_LABELS, type PersonRole } from "~/plans/document";
import { siteTimeText, type LiftRecordDocument } from "~/plans/lift-record";

export type LiftRecordViewData = {
  liftedAt: string;
  notes: string;
  nearMiss: boolean;
  nearMissDetails: string;
  by: string;
  photos: number[];
  document?: LiftRecordDocument | null;
};

/** The lift record as a document: landing time in the site's time, who ticked and released what and when, gear, people, photos. */
export function LiftRecordView({ planId, record }: { planId: number; record: LiftRecordViewData }) {
  const doc = record.document ?? null;
  const zone = doc?.timeZone ?? "UTC";
  const site = (iso: string) => siteTimeText(iso, zone);
  return (
    <div className="space-y-2 rounded border border-steel/40 bg-steel-soft p-3 text-sm" data-testid="lift-record">
      <p>
        Lift recorded by <span className="font-semibold">{record.by}</span>; landed {site(record.liftedAt)}.{" "}
        <a href={`/plans/${planId}/lift-record.pdf`}>The lift record (PDF)</a>
      </p>
      {record.nearMiss && <p className="font-semibold text-fail">Near miss: {record.nearMissDetails}</p>}
      {record.notes && <p className="whitespace-pre-line">Notes: {record.notes}</p>}
      {doc && (
        <details>
          <summary className="cursor-pointer">Checks, hold points, gear and people</summary>
          <ul className="mt-1 list-disc pl-5">
            {doc.ticks.map((t) => (
              <li key={t.id}>
                {t.text}: ticked by {t.by}, {site(t.at)}
              </li>
            ))}
            {doc.holdPoints.map((h) => (
              <li key={h.step}>
                Hold point, step {h.step} ({h.title}): released by {h.releasedBy}, {site(h.at)}
              </li>
            ))}
          </ul>
          <p className="mt-1">
            Gear on the hook, checked by id: {doc.gear.map((g) => `${g.itemCode} (${g.position})`).join(", ")}.
          </p>
          {doc.people.length > 0 && (
            <p>
              People:{" "}
              {doc.people
                .map(
                  (p) =>
                    `${p.name} (${PERSON_ROLE_LABELS[p.role as PersonRole] ?? p.role}${p.present ? "" : ", not there"})`,
                )
                .join(", ")}
              .
            </p>
          )}
        </details>
      )}
      {record.photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos taken at the lift">
          {record.photos.map((id, i) => (
            <li key={id}>
              <a href={`/files/${id}`}>
                <img
                  src={`/files/${id}`}
                  alt={`Photo ${i + 1} taken at the lift`}
                  className="h-24 w-auto rounded border border-rule"
                />
              </a>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
