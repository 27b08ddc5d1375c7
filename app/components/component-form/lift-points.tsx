import type { Dispatch, SetStateAction } from "react";
import { newRowKey, type Errors, type LiftRow } from "~/components/component-form/rows";
import { Button, Card, FieldError } from "~/components/ui/form";
import { MAX_LIFT_POINTS } from "~/loads/component-input";
import { lengthUnitLabel, type Units } from "~/utils/format";

/** The lift points: one block of fields per point, with add and remove; a new point starts on the top face. */
export function LiftPointsCard({
  liftPoints,
  setLiftPoints,
  newPointZ,
  errors,
  units,
}: {
  liftPoints: LiftRow[];
  setLiftPoints: Dispatch<SetStateAction<LiftRow[]>>;
  /** The z a new point starts at, as typed (the component's height). */
  newPointZ: string;
  errors: Errors;
  units: Units;
}) {
  const lu = lengthUnitLabel(units);
  const nextLabel = () => {
    const used = new Set(liftPoints.map((p) => p.label.toUpperCase()));
    for (const c of "ABCDEFGHJKLMNPQRSTUVWXYZ") if (!used.has(c)) return c;
    return "";
  };

  const rowError = (key: string) => errors[key];

  return (
    <Card title="Lift points">
      <p className="mb-3 text-sm text-ink-soft">
        Each point is where a leg's line of force acts (the eye of the eyebolt, the shackle pin). The axis is the
        direction out of the tapped hole's surface: 0, 0, 1 for a hole in the top face.
      </p>
      <FieldError errors={errors.liftPoints} />
      {liftPoints.length > 0 && (
        // One block per point whose fields wrap to the card's width: nothing is clipped at any screen size.
        <div className="space-y-3">
          {liftPoints.map((p, i) => {
            const update = (field: keyof LiftRow) => (e: React.ChangeEvent<HTMLInputElement>) =>
              setLiftPoints((rows) => rows.map((r) => (r.key === p.key ? { ...r, [field]: e.target.value } : r)));
            const cell = (field: keyof LiftRow, label: string, heading: string, width = "w-20") => (
              <label className="flex flex-col text-xs font-medium text-ink-soft">
                <span aria-hidden="true">{heading}</span>
                <input
                  aria-label={`Lift point ${i + 1} ${label}`}
                  name={`lp-${i}-${field}`}
                  value={p[field]}
                  onChange={update(field)}
                  className={`${width} mt-0.5 rounded border border-rule px-2 py-1 text-sm text-ink aria-[invalid=true]:border-fail`}
                  aria-invalid={rowError(`lp-${i}-${field}`) ? true : undefined}
                />
                <FieldError errors={rowError(`lp-${i}-${field}`)} />
              </label>
            );
            return (
              <fieldset key={p.key} className="rounded border border-rule p-2">
                <legend className="px-1 text-sm font-semibold">Lift point {p.label || i + 1}</legend>
                <div className="flex flex-wrap items-end gap-x-3 gap-y-2">
                  {cell("label", "id", "Id", "w-14")}
                  {cell("x", "x", `x (${lu})`)}
                  {cell("y", "y", `y (${lu})`)}
                  {cell("z", "z", `z (${lu})`)}
                  {cell("ax", "axis x", "Axis x", "w-14")}
                  {cell("ay", "axis y", "Axis y", "w-14")}
                  {cell("az", "axis z", "Axis z", "w-14")}
                  {cell("thread", "thread", "Thread")}
                  {cell("engagement", "thread engagement", `Engagement (${lu})`)}
                  <button
                    type="button"
                    className="min-h-9 text-sm text-fail underline"
                    onClick={() => setLiftPoints((rows) => rows.filter((r) => r.key !== p.key))}
                  >
                    Remove {p.label || "point"}
                  </button>
                </div>
              </fieldset>
            );
          })}
        </div>
      )}
      <Button
        type="button"
        tone="secondary"
        className="mt-3"
        disabled={liftPoints.length >= MAX_LIFT_POINTS}
        onClick={() =>
          setLiftPoints((rows) => [
            ...rows,
            {
              key: newRowKey(),
              label: nextLabel(),
              x: "",
              y: "",
              z: newPointZ,
              ax: "0",
              ay: "0",
              az: "1",
              thread: "",
              engagement: "",
            },
          ])
        }
      >
        Add a lift point
      </Button>
    </Card>
  );
}
