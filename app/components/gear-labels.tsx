import { DUE_STATE_LABELS, type DueState } from "~/gear/due";
import { GEAR_STATUS_LABELS, WLL_UNIT_LABELS, type GearStatus } from "~/gear/kinds";
import type { MassUnit } from "~/statics/units";

const DUE_TONES: Record<DueState, string> = {
  overdue: "border-fail/50 bg-fail-soft text-fail font-bold",
  due_soon: "border-warn/50 bg-warn-soft text-warn font-semibold",
  in_date: "border-pass/40 bg-pass-soft text-pass",
  never_examined: "border-rule bg-paper text-ink-soft",
};

const DUE_MARKS: Record<DueState, string> = { overdue: "!", due_soon: "◷", in_date: "✓", never_examined: "–" };

/**
 * The due state in words (and a mark), with colour only as a second signal. An item out of use never
 * shows a green "In date": its examination date does not make it usable.
 */
export function DueLabel({ state, status = "in_service" }: { state: DueState; status?: GearStatus }) {
  if (status === "withdrawn")
    return (
      <span className="inline-flex items-center gap-1 whitespace-nowrap rounded border border-rule bg-paper px-1.5 py-0.5 text-xs text-ink-soft">
        <span aria-hidden="true">×</span>
        Withdrawn: not in use
      </span>
    );
  if (status === "quarantined" && state !== "overdue")
    return (
      <span className="inline-flex items-center gap-1 whitespace-nowrap rounded border border-fail/50 bg-fail-soft px-1.5 py-0.5 text-xs font-semibold text-fail">
        <span aria-hidden="true">!</span>
        Quarantined: examine before use
      </span>
    );
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded border px-1.5 py-0.5 text-xs ${DUE_TONES[state]}`}
    >
      <span aria-hidden="true">{DUE_MARKS[state]}</span>
      {DUE_STATE_LABELS[state]}
    </span>
  );
}

const STATUS_TONES: Record<GearStatus, string> = {
  in_service: "border-pass/40 bg-pass-soft text-pass",
  quarantined: "border-fail/50 bg-fail-soft text-fail font-semibold",
  withdrawn: "border-ink-soft/40 bg-paper text-ink-soft line-through decoration-1",
};

export function StatusLabel({ status }: { status: GearStatus }) {
  return (
    <span className={`inline-flex whitespace-nowrap rounded border px-1.5 py-0.5 text-xs ${STATUS_TONES[status]}`}>
      {GEAR_STATUS_LABELS[status]}
    </span>
  );
}

/** "2 t" as marked, with the kg figure (rounded down: a capacity is never overstated) when the mark is not in kg. */
export function formatWll(value: number, unit: MassUnit, kg: number) {
  const marked = `${value} ${WLL_UNIT_LABELS[unit]}`;
  return unit === "kg" ? marked : `${marked} (${Math.floor(kg + 1e-9).toLocaleString("en-GB")} kg)`;
}
