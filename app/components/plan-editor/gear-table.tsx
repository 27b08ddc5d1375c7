// Gear allocation: a picker from the register for each position of each used leg, the leg's hitch and eye
// plane, and the master link and crane at the top.
import { useMemo } from "react";
import { GearPicker } from "~/components/gear-picker";
import { HitchSelect, hitchesForLeg } from "~/components/hitch-select";
import type { LiveSolution } from "~/components/plan-editor/use-live-solve";
import type { ComponentDefinition } from "~/loads/component-definition";
import { EYE_PLANE_LABELS, EYE_PLANES } from "~/plans/document";
import type { EditorAction, PlanEdit } from "~/plans/editor-state";
import { checkIdFor, judgePick, type PickSlot } from "~/plans/pick-fit";
import { GEAR_ROLE_LABELS, type GearPick, type GearRole } from "~/plans/rigging";
import type { CheckResult, RiggingDescription } from "~/statics/check-types";
import type { ReferenceTables } from "~/statics/reference";
import type { Units } from "~/utils/format";

export function GearTable({
  edit,
  dispatch,
  canEdit,
  units,
  snapshot,
  solution,
  usedPoints,
  picks,
  addPick,
  body = null,
  tables = null,
}: {
  edit: PlanEdit;
  dispatch: (action: EditorAction) => void;
  canEdit: boolean;
  units: Units;
  snapshot: ComponentDefinition;
  solution: LiveSolution | null;
  usedPoints: PlanEdit["liftPoints"];
  picks: ReadonlyMap<number, GearPick>;
  addPick: (pick: GearPick) => void;
  /** The editor's solve body and the reference tables: each candidate is judged by the plan's own check. */
  body?: ({ rigging?: RiggingDescription } & Record<string, unknown>) | null;
  tables?: ReferenceTables | null;
}) {
  // An allocated item's note is its own check in the live solve (the plan's check, as judgePick would give it:
  // pick-fit.test.ts), so the move costs no solve per item; other candidates are judged one by one as listed.
  const liveChecks = useMemo(() => new Map((solution?.checks ?? []).map((c) => [c.id, c as CheckResult])), [solution]);
  const judgeFor = (slot: PickSlot, allocated: GearPick | null) =>
    body && tables
      ? (pick: GearPick) =>
          pick === allocated && pick.spec.role === slot.role
            ? (liveChecks.get(checkIdFor(slot)) ?? null)
            : judgePick(body, slot, pick, tables)
      : undefined;
  const legLoadKg = (label: string) => solution?.legs.find((l) => l.liftPointId === label)?.tensionKg ?? null;

  return (
    <section className="rounded border border-rule bg-card p-4" aria-labelledby="gear-heading">
      <h2 id="gear-heading" className="text-lg">
        Gear from the register
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Search the register for each position. The picker marks what fits the lift point and the leg load, and items out
        of date or quarantined.
      </p>
      <div className="overflow-x-auto">
        <table className="min-w-[48rem]">
          <thead>
            <tr>
              <th scope="col">Leg</th>
              <th scope="col">Eyebolt</th>
              <th scope="col">Shackle</th>
              <th scope="col">Sling</th>
              <th scope="col">Hitch</th>
              <th scope="col">Eye or lug plane</th>
            </tr>
          </thead>
          <tbody>
            {usedPoints.map((p) => {
              const leg = edit.rigging.legs[p.label];
              const slot = (role: GearRole, key: "eyeboltItemId" | "shackleItemId" | "slingItemId") => {
                const allocated = leg?.[key] !== undefined ? (picks.get(leg[key]!) ?? null) : null;
                return (
                  <GearPicker
                    role={role}
                    label={`${GEAR_ROLE_LABELS[role]} for leg ${p.label}`}
                    selected={allocated}
                    thread={role === "eyebolt" ? p.thread : null}
                    loadKg={legLoadKg(p.label)}
                    judge={judgeFor(
                      {
                        role: role as "eyebolt" | "shackle" | "sling",
                        legId: p.label,
                        hitch: leg?.hitch ?? "straight",
                      },
                      allocated,
                    )}
                    disabled={!canEdit}
                    units={units}
                    onPick={(pick) => {
                      if (pick) addPick(pick);
                      dispatch({ type: "allocate", label: p.label, slot: key, itemId: pick?.id ?? null });
                    }}
                  />
                );
              };
              return (
                <tr key={p.label}>
                  <td className="font-semibold">{p.label}</td>
                  <td>{slot("eyebolt", "eyeboltItemId")}</td>
                  <td>{slot("shackle", "shackleItemId")}</td>
                  <td>{slot("sling", "slingItemId")}</td>
                  <td>
                    <HitchSelect
                      label={p.label}
                      hitch={leg?.hitch ?? "straight"}
                      allowed={hitchesForLeg(leg, picks)}
                      disabled={!canEdit}
                      onChange={(hitch) => dispatch({ type: "set-hitch", label: p.label, hitch })}
                    />
                  </td>
                  <td>
                    <select
                      aria-label={`Eye or lug plane at leg ${p.label}`}
                      className="rounded border border-rule px-2 py-1 text-sm"
                      value={leg?.eyePlane ?? "pull"}
                      disabled={!canEdit}
                      onChange={(e) =>
                        dispatch({
                          type: "set-eye-plane",
                          label: p.label,
                          eyePlane: e.target.value as (typeof EYE_PLANES)[number],
                        })
                      }
                    >
                      {EYE_PLANES.map((plane) => (
                        <option key={plane} value={plane}>
                          {EYE_PLANE_LABELS[plane]}
                        </option>
                      ))}
                    </select>
                  </td>
                </tr>
              );
            })}
            {edit.arrangement.kind === "beam" && (
              <tr>
                <td className="font-semibold">Beam</td>
                <td colSpan={5}>
                  <span className="block text-xs text-ink-soft">
                    Lifting beam or spreader: its length, lugs, own mass and WLL come from the register
                  </span>
                  <GearPicker
                    role="beam"
                    label="Lifting beam or spreader"
                    selected={
                      edit.rigging.beamItemId !== undefined ? (picks.get(edit.rigging.beamItemId) ?? null) : null
                    }
                    thread={null}
                    loadKg={snapshot.massKg * (1 + snapshot.contingencyPct / 100)}
                    disabled={!canEdit}
                    units={units}
                    onPick={(pick) => {
                      if (pick) addPick(pick);
                      dispatch({ type: "allocate", label: null, slot: "beamItemId", itemId: pick?.id ?? null });
                    }}
                  />
                </td>
              </tr>
            )}
            <tr>
              <td className="font-semibold">Top</td>
              <td colSpan={2}>
                <span className="block text-xs text-ink-soft">Master link</span>
                <GearPicker
                  role="masterLink"
                  label="Master link"
                  selected={
                    edit.rigging.masterLinkItemId !== undefined
                      ? (picks.get(edit.rigging.masterLinkItemId) ?? null)
                      : null
                  }
                  thread={null}
                  loadKg={snapshot.massKg * (1 + snapshot.contingencyPct / 100)}
                  judge={judgeFor(
                    { role: "masterLink" },
                    edit.rigging.masterLinkItemId !== undefined
                      ? (picks.get(edit.rigging.masterLinkItemId) ?? null)
                      : null,
                  )}
                  disabled={!canEdit}
                  units={units}
                  onPick={(pick) => {
                    if (pick) addPick(pick);
                    dispatch({ type: "allocate", label: null, slot: "masterLinkItemId", itemId: pick?.id ?? null });
                  }}
                />
                <label className="mt-1 flex items-center gap-2 text-xs">
                  <input
                    type="checkbox"
                    checked={edit.rigging.hookTakesLegs === true}
                    disabled={!canEdit}
                    onChange={(e) => dispatch({ type: "set-hook-takes-legs", value: e.target.checked })}
                  />
                  No master link: the crane hook takes the legs directly
                </label>
              </td>
              <td colSpan={3}>
                <span className="block text-xs text-ink-soft">Crane or hoist</span>
                <GearPicker
                  role="crane"
                  label="Crane or hoist"
                  selected={
                    edit.rigging.craneItemId !== undefined ? (picks.get(edit.rigging.craneItemId) ?? null) : null
                  }
                  thread={null}
                  loadKg={snapshot.massKg * (1 + snapshot.contingencyPct / 100)}
                  judge={judgeFor(
                    { role: "crane" },
                    edit.rigging.craneItemId !== undefined ? (picks.get(edit.rigging.craneItemId) ?? null) : null,
                  )}
                  disabled={!canEdit}
                  units={units}
                  onPick={(pick) => {
                    if (pick) addPick(pick);
                    dispatch({ type: "allocate", label: null, slot: "craneItemId", itemId: pick?.id ?? null });
                  }}
                />
              </td>
            </tr>
          </tbody>
        </table>
      </div>
    </section>
  );
}
