// A plan's arrangement in the statics core's terms: the load, the chosen lift points, how it hangs
// and its rigging. Pure and shared: the server's results and the editor's live solve start here.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { Arrangement } from "~/plans/document";
import type { ArrangementInput, ArrangementLiftPoint, Hanging } from "~/statics/arrangement";
import type { BeamItemSpec } from "~/statics/beam-arrangement";
import type { RiggingDescription } from "~/statics/check-types";
import type { Vec3 } from "~/statics/vector";

export type PlanLoad = {
  massKg: number;
  cog: Vec3;
  liftPoints: ReadonlyArray<Pick<ComponentDefinition["liftPoints"][number], "label" | "position" | "axis" | "thread">>;
};

export type ArrangementInputOptions = Pick<ArrangementInput, "ruleSet" | "todayIso" | "extra" | "fit"> & {
  liftDate?: string | null;
  /** The register beam allocated to a beam arrangement (its geometry, mass, WLL and examination). */
  beamItem?: BeamItemSpec | null;
};

function unit(a: Vec3): Vec3 {
  const n = Math.hypot(a.x, a.y, a.z) || 1;
  return { x: a.x / n, y: a.y / n, z: a.z / n };
}

/** The core's input for the arrangement; lift points the load does not have are left out. */
export function arrangementInput(
  load: PlanLoad,
  arrangement: Arrangement,
  rigging: RiggingDescription,
  options: ArrangementInputOptions,
): ArrangementInput {
  const byLabel = new Map(load.liftPoints.map((p) => [p.label, p]));
  const liftPoints: ArrangementLiftPoint[] = arrangement.liftPointLabels.flatMap((label) => {
    const p = byLabel.get(label);
    if (!p) return [];
    return [{ id: label, position: p.position, axis: unit(p.axis), ...(p.thread ? { thread: p.thread } : {}) }];
  });
  const hanging: Hanging =
    arrangement.kind === "beam" && arrangement.beam
      ? { kind: "beam", hookZM: arrangement.hookHeightM, beam: { ...arrangement.beam, item: options.beamItem ?? null } }
      : arrangement.mode === "level"
        ? { kind: "level", hookZM: arrangement.hookHeightM }
        : { kind: "lengths", legLengthsM: liftPoints.map((p) => arrangement.legLengthsM[p.id] ?? 0) };
  return {
    load: { massKg: load.massKg, cog: load.cog },
    liftPoints,
    hanging,
    rigging,
    ruleSet: options.ruleSet,
    ...(options.todayIso !== undefined ? { todayIso: options.todayIso } : {}),
    liftDateIso: options.liftDate || null,
    ...(options.extra ? { extra: options.extra } : {}),
    ...(options.fit !== undefined && hanging.kind !== "beam" ? { fit: options.fit } : {}),
  };
}
