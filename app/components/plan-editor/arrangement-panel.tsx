// The arrangement panel: how the load is hung, what is given, the hook and CoG, the lift-point table with
// sling lengths, and what would level a tilted load.
import { memo, type ReactNode } from "react";
import { NumberInput } from "~/components/plan-editor/fields";
import type { LiveSolution } from "~/components/plan-editor/use-live-solve";
import { Button } from "~/components/ui/form";
import type { EditorAction, PlanEdit, Vec3 } from "~/plans/editor-state";
import type { GearPick } from "~/plans/rigging";
import { legChangeText, LEVELLING_STEP_M } from "~/plans/check-text-tilt";
import { formatLength, lengthUnitLabel, type Units } from "~/utils/format";

export function ArrangementPanel({
  edit,
  dispatch,
  canEdit,
  units,
  solution,
  picks,
  children,
}: {
  edit: PlanEdit;
  dispatch: (action: EditorAction) => void;
  canEdit: boolean;
  units: Units;
  solution: LiveSolution | null;
  picks: ReadonlyMap<number, GearPick>;
  /** Shown at the foot of the panel (the drawing to trace over). */
  children?: ReactNode;
}) {
  const lu = lengthUnitLabel(units);

  function setMode(mode: "level" | "lengths") {
    if (mode === edit.arrangement.mode) return;
    // Switching to given lengths starts from the lengths of the level solution (the slings a level lift needs).
    const legLengthsM =
      mode === "lengths" && solution
        ? Object.fromEntries(solution.legs.map((l) => [l.liftPointId, Number(l.lengthM.toFixed(4))]))
        : undefined;
    dispatch({ type: "set-mode", mode, legLengthsM });
  }

  function useAllocatedSlingLengths() {
    const lengths: Record<string, number> = {};
    for (const label of edit.arrangement.liftPointLabels) {
      const slingId = edit.rigging.legs[label]?.slingItemId;
      const length = slingId !== undefined ? picks.get(slingId)?.lengthM : null;
      if (length) lengths[label] = length;
    }
    dispatch({ type: "set-mode", mode: "lengths", legLengthsM: { ...edit.arrangement.legLengthsM, ...lengths } });
  }

  // Given lengths: the change in each leg that would level the load, from the statics core (one leg kept,
  // the others shortened: what shorteners can do). Shown once the load tilts measurably.
  const levelling =
    edit.arrangement.mode === "lengths" && solution?.levelling && solution.tiltDeg >= 0.05
      ? solution.levelling.legs
      : null;

  return (
    <section className="space-y-4 rounded border border-rule bg-card p-4" aria-labelledby="arrangement-heading">
      <h2 id="arrangement-heading" className="text-lg">
        Arrangement
      </h2>
      <fieldset className="flex flex-wrap gap-4 text-sm" disabled={!canEdit}>
        <legend className="sr-only">How the load is hung</legend>
        <label className="flex items-center gap-1">
          <input
            type="radio"
            name="hung-by"
            checked={edit.arrangement.kind === "bridle"}
            onChange={() => dispatch({ type: "set-kind", kind: "bridle" })}
          />{" "}
          Legs to one hook
        </label>
        <label className="flex items-center gap-1">
          <input
            type="radio"
            name="hung-by"
            checked={edit.arrangement.kind === "beam"}
            onChange={() =>
              dispatch({
                type: "set-kind",
                kind: "beam",
                beam: edit.arrangement.beam ?? { dropLengthM: 0.6 },
              })
            }
          />{" "}
          Lifting beam with vertical drops
        </label>
      </fieldset>
      {edit.arrangement.kind === "bridle" && (
        <fieldset className="flex flex-wrap gap-4 text-sm" disabled={!canEdit}>
          <legend className="sr-only">What is given</legend>
          <label className="flex items-center gap-1">
            <input
              type="radio"
              name="given"
              checked={edit.arrangement.mode === "level"}
              onChange={() => setMode("level")}
            />{" "}
            Level lift: the hook height gives the leg lengths
          </label>
          <label className="flex items-center gap-1">
            <input
              type="radio"
              name="given"
              checked={edit.arrangement.mode === "lengths"}
              onChange={() => setMode("lengths")}
            />{" "}
            Given sling lengths: find the tilt
          </label>
        </fieldset>
      )}
      <HookAndCog
        hookHeightM={edit.arrangement.mode === "level" ? edit.arrangement.hookHeightM : null}
        cog={edit.cog}
        units={units}
        canEdit={canEdit}
        dispatch={dispatch}
      />
      <p className="text-xs text-ink-soft">
        The CoG and the mass are the component&apos;s; to plan with others, override them with a reason below.
      </p>
      {edit.arrangement.kind === "beam" && edit.arrangement.beam && (
        <p className="text-sm text-ink-soft">
          Drops {formatLength(edit.arrangement.beam.dropLengthM, units)}; the beam&apos;s length, lugs, mass and WLL
          come from the register item allocated as the beam (Gear). Beam figures are worked out by the server on each
          save.
        </p>
      )}
      <div className="overflow-x-auto">
        <table className="w-full table-fixed">
          <thead>
            <tr>
              <th scope="col" className="w-12">
                Use
              </th>
              <th scope="col" className="w-20">
                Lift point
              </th>
              <th scope="col">x ({lu})</th>
              <th scope="col">y ({lu})</th>
              <th scope="col">z ({lu})</th>
              {edit.arrangement.mode === "lengths" && <th scope="col">Sling length ({lu})</th>}
            </tr>
          </thead>
          <tbody>
            {edit.liftPoints.map((p) => (
              <LiftPointRow
                key={p.label}
                point={p}
                used={edit.arrangement.liftPointLabels.includes(p.label)}
                lengthM={edit.arrangement.mode === "lengths" ? (edit.arrangement.legLengthsM[p.label] ?? 0) : null}
                units={units}
                canEdit={canEdit}
                dispatch={dispatch}
              />
            ))}
          </tbody>
        </table>
      </div>
      {edit.arrangement.mode === "lengths" && (
        <div className="space-y-2 text-sm">
          <Button type="button" tone="secondary" onClick={useAllocatedSlingLengths} disabled={!canEdit}>
            Take the lengths of the allocated slings
          </Button>
          {levelling && (
            <div className="rounded border border-warn/40 bg-warn-soft p-2" data-testid="levelling">
              <p className="font-semibold">To hang level:</p>
              <ul>
                {levelling.map((l) => (
                  <li key={l.liftPointId}>
                    {Math.abs(l.changeM) < LEVELLING_STEP_M
                      ? `Leg ${l.liftPointId}: no change`
                      : `${legChangeText(l.liftPointId, l.changeM, units)} (to ${formatLength(l.levelLengthM, units)})`}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </div>
      )}
      {children}
    </section>
  );
}

/** The hook height (level lifts) and the CoG: drawn again only when they change, not on each move of a lift point. */
const HookAndCog = memo(function HookAndCog({
  hookHeightM,
  cog,
  units,
  canEdit,
  dispatch,
}: {
  hookHeightM: number | null;
  cog: Vec3;
  units: Units;
  canEdit: boolean;
  dispatch: (action: EditorAction) => void;
}) {
  const lu = lengthUnitLabel(units);
  return (
    <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      {hookHeightM !== null && (
        <NumberInput
          label={`Hook height z (${lu})`}
          valueM={hookHeightM}
          units={units}
          disabled={!canEdit}
          onCommit={(v) => dispatch({ type: "set-hook-height", hookHeightM: v })}
        />
      )}
      {(["x", "y", "z"] as const).map((axis) => (
        <NumberInput
          key={axis}
          label={`CoG ${axis} (${lu})`}
          valueM={cog[axis]}
          units={units}
          disabled
          onCommit={() => undefined}
        />
      ))}
    </div>
  );
});

/**
 * One lift point's row: whether it is used, where it is and (given lengths) its sling length. A move redraws
 * the moved point's row only: the others keep their point object, so their props are the same.
 */
const LiftPointRow = memo(function LiftPointRow({
  point: p,
  used,
  lengthM,
  units,
  canEdit,
  dispatch,
}: {
  point: PlanEdit["liftPoints"][number];
  used: boolean;
  /** The given sling length in given-lengths mode; null in a level lift. */
  lengthM: number | null;
  units: Units;
  canEdit: boolean;
  dispatch: (action: EditorAction) => void;
}) {
  return (
    <tr>
      <td>
        <input
          type="checkbox"
          aria-label={`Use lift point ${p.label}`}
          checked={used}
          disabled={!canEdit}
          onChange={() => dispatch({ type: "toggle-lift-point", label: p.label })}
        />
      </td>
      <td className="font-semibold">
        {p.label} {p.thread && <span className="font-normal text-ink-soft">{p.thread}</span>}
      </td>
      {(["x", "y", "z"] as const).map((axis) => (
        <td key={axis}>
          <NumberInput
            label={`${p.label} ${axis}`}
            valueM={p.position[axis]}
            units={units}
            disabled={!canEdit}
            onCommit={(v) =>
              dispatch({
                type: "move-lift-point",
                label: p.label,
                position: { ...p.position, [axis]: v },
              })
            }
          />
        </td>
      ))}
      {lengthM !== null && (
        <td>
          {used && (
            <NumberInput
              label={`Sling length to ${p.label}`}
              valueM={lengthM}
              units={units}
              disabled={!canEdit}
              onCommit={(v) => dispatch({ type: "set-leg-length", label: p.label, lengthM: v })}
            />
          )}
        </td>
      )}
    </tr>
  );
});
