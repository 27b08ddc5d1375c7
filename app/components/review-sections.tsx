// The parts of the review page that show what the appointed person signs for: the gear as the register
// has it now, the sequence with hold points, hazards and controls, exclusion zone, communication and
// people, and the reasons an approval would be refused.
import { Card, EmptyState } from "~/components/ui/form";
import type { ApprovalRefusal, ReviewGearRow } from "~/plans/approval-readiness";
import { PERSON_ROLE_LABELS, type PlanDetails } from "~/plans/document";
import { formatAngle, formatLength, formatLoad, formatUtilisation, type Units } from "~/utils/format";

const STATUS_TEXT: Record<ReviewGearRow["status"], string> = {
  in_service: "In service",
  quarantined: "Quarantined",
  withdrawn: "Withdrawn",
  missing: "Not in the register",
};

export function GearNowCard({ gear, liftDate, units }: { gear: ReviewGearRow[]; liftDate: string; units: Units }) {
  return (
    <Card title="Gear, as the register has it now">
      <p className="mb-2 text-sm text-ink-soft">
        Read from the register as this page opened; examinations judged for a lift on {liftDate}.
      </p>
      {gear.length === 0 ? (
        <p className="text-sm">No gear is allocated.</p>
      ) : (
        <div className="overflow-x-auto">
          <table data-testid="review-gear">
            <thead>
              <tr>
                <th scope="col">Position</th>
                <th scope="col">Item</th>
                <th scope="col">WLL</th>
                <th scope="col">Load</th>
                <th scope="col">Utilisation</th>
                <th scope="col">Next examination due</th>
                <th scope="col">Status now</th>
              </tr>
            </thead>
            <tbody>
              {gear.map((g) => (
                <tr key={`${g.position}-${g.itemId}`}>
                  <td>{g.position}</td>
                  <td>
                    <a href={`/gear/${g.itemId}`} className="font-semibold">
                      {g.itemCode}
                    </a>
                    {g.description && <span className="block text-xs text-ink-soft">{g.description}</span>}
                  </td>
                  <td>{g.wllMarked || "—"}</td>
                  <td>{g.loadKg === null ? "—" : formatLoad(g.loadKg, units)}</td>
                  <td>{g.utilisation === null ? "—" : formatUtilisation(g.utilisation)}</td>
                  <td>{g.nextDueOn ?? "none on record"}</td>
                  <td>
                    {g.problems.length === 0 ? (
                      <span className="text-pass">{STATUS_TEXT[g.status]}</span>
                    ) : (
                      <span className="font-semibold text-fail">
                        {STATUS_TEXT[g.status]}: not fit to lift
                        {g.problems.map((p, i) => (
                          <span key={i} className="block font-normal">
                            {p}
                          </span>
                        ))}
                        {g.statusReason && <span className="block font-normal">Reason: {g.statusReason}</span>}
                      </span>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Card>
  );
}

export function PlanDetailsCards({ details, units }: { details: PlanDetails; units: Units }) {
  return (
    <>
      <Card title="Sequence and hold points">
        <SequenceList sequence={details.sequence} testId="review-sequence" />
      </Card>
      <Card title="Hazards and controls">
        {details.hazards.length === 0 ? (
          <EmptyState title="No hazards recorded">Every lift has some: return the plan if they are missing.</EmptyState>
        ) : (
          <HazardTable hazards={details.hazards} testId="review-hazards" />
        )}
        <LiftConditions details={details} units={units} />
      </Card>
      <Card title="People">
        <PeopleList people={details.people} none="Nobody named." testId="review-people" />
      </Card>
    </>
  );
}

/** The steps of the lift in order, each hold point marked. */
export function SequenceList({ sequence, testId }: { sequence: PlanDetails["sequence"]; testId?: string }) {
  return (
    <ol className="list-decimal space-y-2 pl-5 text-sm" data-testid={testId}>
      {sequence.map((step, i) => (
        <li key={i}>
          <span className="font-semibold">{step.title}</span>
          {step.holdPoint && (
            <span className="ml-2 rounded bg-brass-soft px-2 py-0.5 text-xs font-semibold text-brass-deep">
              Hold point: stop until cleared
            </span>
          )}
          {step.notes && <span className="block text-ink-soft">{step.notes}</span>}
        </li>
      ))}
    </ol>
  );
}

/** The people named for the lift, each with their part in it; `none` when nobody is. */
export function PeopleList({ people, none, testId }: { people: PlanDetails["people"]; none: string; testId?: string }) {
  if (people.length === 0) return <p className="text-sm text-ink-soft">{none}</p>;
  return (
    <ul className="space-y-1 text-sm" data-testid={testId}>
      {people.map((p, i) => (
        <li key={i}>
          <span className="font-semibold">{p.name}</span> · {PERSON_ROLE_LABELS[p.role]}
        </li>
      ))}
    </ul>
  );
}

/** How the figures were found: the arrangement, whether the legs' shares are determinate, and the load's tilt. */
export function figuresBasis(f: { beam: boolean; mode: string; method: string; tiltDeg: number }): string {
  const arrangement = f.beam
    ? "Vertical drops from a lifting beam"
    : f.mode === "level"
      ? "Level lift from one hook"
      : "Given sling lengths";
  const method =
    f.method === "elastic"
      ? "share of a rigid load on equally stretchy legs (four legs are statically indeterminate)"
      : "statically determinate";
  return `${arrangement} · ${method}${f.tiltDeg > 0.05 ? ` · the load tilts ${formatAngle(f.tiltDeg)}` : ""}`;
}

/** Why the approver cannot approve now: shown in place of the signature form, so no password is asked for. */
export function ApprovalRefusals({ refusals }: { refusals: ApprovalRefusal[] }) {
  return (
    <Card title="Approval is not possible now">
      <div role="alert" data-testid="approval-refusals" className="text-sm">
        <p className="font-semibold text-fail">
          This revision cannot be approved as it stands, for {refusals.length === 1 ? "this reason" : "these reasons"}:
        </p>
        <ul className="mt-2 list-disc space-y-1 pl-5">
          {refusals.map((r, i) => (
            <li key={i} data-kind={r.kind}>
              {r.message}
            </li>
          ))}
        </ul>
        <p className="mt-2 text-ink-soft">
          Return it to the planner with what should change, or have the gear put right and open this page again.
        </p>
      </div>
    </Card>
  );
}

/** Each hazard beside its control, as the plan and review pages list them. */
export function HazardTable({ hazards, testId }: { hazards: PlanDetails["hazards"]; testId?: string }) {
  return (
    <table data-testid={testId}>
      <thead>
        <tr>
          <th scope="col">Hazard</th>
          <th scope="col">Control</th>
        </tr>
      </thead>
      <tbody>
        {hazards.map((h, i) => (
          <tr key={i}>
            <td>{h.hazard}</td>
            <td>{h.control}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The exclusion zone, communication, floor clearance and planned lift date. */
export function LiftConditions({ details, units }: { details: PlanDetails; units: Units }) {
  return (
    <dl className="mt-4 grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
      <div>
        <dt className="text-ink-soft">Exclusion zone</dt>
        <dd className="whitespace-pre-line">{details.exclusionZone || "—"}</dd>
      </div>
      <div>
        <dt className="text-ink-soft">Communication</dt>
        <dd className="whitespace-pre-line">{details.communication || "—"}</dd>
      </div>
      <div>
        <dt className="text-ink-soft">Underside clear of the floor by</dt>
        <dd>{formatLength(details.floorClearanceM, units)}</dd>
      </div>
      <div>
        <dt className="text-ink-soft">Planned lift date</dt>
        <dd>{details.liftDate ?? "not set"}</dd>
      </div>
    </dl>
  );
}
