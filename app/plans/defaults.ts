// A new plan's starting point: the default arrangement for a load, and the default sequence and
// details. Pure and shared with the browser.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { Arrangement, PlanDetails, PlanDocument, RiggingAllocation, SequenceStep } from "~/plans/document";

/** The lift as most component lifts go (common practice): the trial lift and the level check are hold points. */
export function defaultSequence(): SequenceStep[] {
  return [
    {
      title: "Rig",
      holdPoint: false,
      notes: "Fit the eyebolts and shackles, hang the legs from the master link, check every item against the plan.",
    },
    {
      title: "Trial lift a short way off the floor and hold",
      holdPoint: true,
      notes: "Take the weight and lift no more than a short way clear; stop and hold.",
    },
    {
      title: "Check level and balance",
      holdPoint: true,
      notes: "Check the load hangs level and steady and the rigging sits as planned; land and re-rig if not.",
    },
    { title: "Travel", holdPoint: false, notes: "Move slowly along the planned path, load low, tag lines as needed." },
    { title: "Land", holdPoint: false, notes: "Lower onto the prepared landing or dowels under control." },
    { title: "De-rig", holdPoint: false, notes: "Slacken off, remove the rigging, return the gear for inspection." },
  ];
}

export function defaultDetails(): PlanDetails {
  return {
    sequence: defaultSequence(),
    hazards: [],
    exclusionZone: "",
    communication: "Hand signals to BS 7121 from one appointed signaller in sight of the operator.",
    people: [],
    floorClearanceM: 0.1,
  };
}

// ----- default arrangement -----

/** Angle from vertical the default hook height aims the longest leg at, deg (well inside the 45 deg warning). */
export const DEFAULT_LEG_ANGLE_DEG = 30;
/** Least rise from the highest lift point to the hook in the default, m. */
export const MIN_HOOK_RISE_M = 0.3;

/**
 * The starting arrangement for a load: a level bridle from its first (up to) four lift points, the
 * hook high enough that the leg farthest from the CoG's plumb line hangs 30 deg from vertical.
 */
export function defaultArrangement(snapshot: ComponentDefinition): Arrangement {
  const points = snapshot.liftPoints.slice(0, 4);
  const zMax = points.length ? Math.max(...points.map((p) => p.position.z)) : snapshot.heightM;
  const reach = points.length
    ? Math.max(...points.map((p) => Math.hypot(p.position.x - snapshot.cog.x, p.position.y - snapshot.cog.y)))
    : 0;
  const rise = Math.max(reach / Math.tan((DEFAULT_LEG_ANGLE_DEG * Math.PI) / 180), MIN_HOOK_RISE_M);
  return {
    kind: "bridle",
    mode: "level",
    hookHeightM: Number((zMax + rise).toFixed(3)),
    legLengthsM: {},
    liftPointLabels: points.map((p) => p.label),
  };
}

/** Drops the labels the snapshot no longer has from an arrangement and its rigging; falls back to the default arrangement when none are left. */
export function fitToSnapshot(doc: Pick<PlanDocument, "arrangement" | "rigging">, snapshot: ComponentDefinition) {
  const known = new Set(snapshot.liftPoints.map((p) => p.label));
  const labels = doc.arrangement.liftPointLabels.filter((l) => known.has(l));
  const arrangement: Arrangement =
    labels.length === 0
      ? defaultArrangement(snapshot)
      : {
          ...doc.arrangement,
          liftPointLabels: labels,
          legLengthsM: Object.fromEntries(
            Object.entries(doc.arrangement.legLengthsM).filter(([k]) => labels.includes(k)),
          ),
        };
  const rigging: RiggingAllocation = {
    ...doc.rigging,
    legs: Object.fromEntries(Object.entries(doc.rigging.legs).filter(([k]) => arrangement.liftPointLabels.includes(k))),
  };
  return { arrangement, rigging };
}
