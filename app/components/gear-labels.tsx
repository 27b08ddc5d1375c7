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

/** The due state in words (and a mark), with colour only as a second signal. */
export function DueLabel({ state }: { state: DueState }) {
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

/** "2 t" as marked, with the kg figure when the mark is not in kg. */
export function formatWll(value: number, unit: MassUnit, kg: number) {
  const marked = `${value} ${WLL_UNIT_LABELS[unit]}`;
  return unit === "kg" ? marked : `${marked} (${Math.round(kg).toLocaleString("en-GB")} kg)`;
}
