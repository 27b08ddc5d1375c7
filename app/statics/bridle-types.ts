// Types, tolerances and small helpers shared by the bridle solvers (level, given lengths) and the
// multi-leg rating. Pure: no I/O.
import type { Vec3 } from "./vector";

export interface LiftPoint {
  id: string;
  /** Point where the leg's line of force acts, component frame, m. */
  position: Vec3;
  /** Unit vector of the tapped hole's axis out of the surface (default +z). */
  axis: Vec3;
}

export interface BridleLoad {
  massKg: number;
  /** Centre of gravity in the component frame, m. */
  cog: Vec3;
}

export type SolveMode = "level" | "lengths";
export type SolveMethod = "determinate" | "elastic";

export interface SolveWarning {
  code: string;
  message: string;
}

export interface LegResult {
  liftPointId: string;
  lengthM: number;
  tensionKn: number;
  tensionKg: number;
  angleFromVerticalDeg: number;
  axisAngleDeg: number;
  verticalShare: number;
  slack: boolean;
  /** Unit vector from the lift point toward the hook, component frame. */
  direction: Vec3;
}

/**
 * Which figure a leg's design tension came from:
 * - "determinate": the leg's statics tension, 1-3 carrying legs (also 4 legs after one goes slack);
 * - "elastic": the statics tension of 4 taut legs, elastic share of equal slings (k = 1/L);
 * - "three-leg-uniform": symmetric 4-leg sling, 3 legs taken to carry, W / (3 cos beta) (DGUV Regel 100-500);
 * - "one-slack": the most the leg carries in a statically admissible state with a leg slack;
 * - "diagonal": the leg's lever-rule share when only its diagonal of a 4-leg sling carries (NAVEDTRA).
 */
export type DesignGovernor = "determinate" | "elastic" | "three-leg-uniform" | "one-slack" | "diagonal";

export interface LegDesignTension {
  liftPointId: string;
  designTensionKn: number;
  designTensionKg: number;
  // The fields below are always set by the statics core; they are optional only so results stored
  // before they existed still read as this type.
  /** The rule whose figure is the design tension. */
  governedBy?: DesignGovernor;
  /** One sentence: how this leg's design tension was found. */
  rule?: string;
  /** Published source of that rule. */
  source?: string;
  /**
   * 4 legs: the leg's load if only its diagonal carried, shared by the lever rule on the plan
   * projection (NAVEDTRA "rate as 2-leg"), kN and kg. Shown beside the 3-leg figure when symmetric.
   */
  twoLegTensionKn?: number;
  twoLegTensionKg?: number;
  /**
   * 3+ legs or drops: the most the leg carries in any statically admissible state with a leg slack
   * (0 when no such state exists), and the lift points whose legs are slack in that state (one id,
   * or two when only a pair can carry).
   */
  oneSlackTensionKn?: number;
  oneSlackTensionKg?: number;
  slackLegIds?: string[];
}

/** How the sling is rated: how many legs are taken to carry, by which rule. */
export interface BridleRating {
  legCount: number;
  symmetric: boolean;
  effectiveLegs: 1 | 2 | 3;
  maxAngleFromVerticalDeg: number;
  rule: string;
  source: string;
  /** Per-leg tension to rate each leg for: the statics tension, or more where the rule asks. */
  legs: LegDesignTension[];
  designTensionKn: number;
  designTensionKg: number;
}

export interface BridleSolution {
  mode: SolveMode;
  weightKn: number;
  method: SolveMethod;
  /** Hook point H in the component frame, m. */
  hook: Vec3;
  /** True vertical (up) at equilibrium, in the component frame. */
  vertical: Vec3;
  tiltDeg: number;
  legs: LegResult[];
  warnings: SolveWarning[];
  rating: BridleRating;
}

export type SolveErrorCode =
  | "ZERO_LENGTH_LEG"
  | "HOOK_NOT_ABOVE_COG"
  | "HOOK_NOT_ABOVE_LIFT_POINT"
  | "NOT_ON_PLUMB_LINE"
  | "COG_ABOVE_LIFT_POINT"
  | "COG_ABOVE_LIFT_LINE"
  | "COG_OFF_LEG_PLANE"
  | "COG_OUTSIDE_SUPPORT"
  | "DEGENERATE_LIFT_POINTS"
  | "LEGS_CANNOT_MEET"
  | "LEGS_NEARLY_STRAIGHT"
  | "LOAD_TURNS_OVER"
  | "NO_EQUILIBRIUM";

export type SolveOutcome =
  { ok: true; solution: BridleSolution } | { ok: false; code: SolveErrorCode; message: string };

/** Geometric tolerance in metres: positions closer than this count as the same. */
export const GEOMETRY_TOL_M = 1e-6;
/** A given-lengths leg within this of its length counts as taut, m. */
export const TAUT_TOL_M = 1e-6;
/** A candidate hook point may exceed a leg length by this much and still be feasible, m. */
export const FEASIBLE_TOL_M = 1e-9;
/** |det| of the three leg unit vectors below this: the legs lie in one plane. */
export const MIN_DIRECTION_DET = 1e-9;
/** |det| below this still solves but warns that the answer is sensitive. */
export const ILL_CONDITIONED_DET = 1e-3;
/** Tension below -this x W counts as genuinely negative (not rounding). */
export const NEGATIVE_TENSION_TOL = 1e-9;
/** Legs count as symmetric when their angles agree within this and tensions within SYM_TENSION. */
export const SYMMETRY_ANGLE_TOL_DEG = 2;
export const SYMMETRY_TENSION_TOL = 0.05;
/** Tilt above this (deg) in given-lengths mode is reported as a warning. */
export const TILT_WARN_DEG = 0.05;

export const Z_UP: Vec3 = { x: 0, y: 0, z: 1 };
export const RAD_TO_DEG = 180 / Math.PI;

export function fail(code: SolveErrorCode, message: string): SolveOutcome {
  return { ok: false, code, message };
}

/**
 * The words both modes use when a leg would leave its lift point against the lift point's axis, (H - P) . a <=
 * GEOMETRY_TOL_M: it would pull from the inner side of the surface, into the part (code LOAD_TURNS_OVER).
 */
export function pullsFromBelowSurface(liftPointId: string): string {
  return `the leg to lift point ${liftPointId} would pull from below its lift point's surface`;
}

/** A length in whole millimetres for messages. */
export function mm(lengthM: number): string {
  return `${Math.round(lengthM * 1000)} mm`;
}

/** Lift point ids of the given indices, comma separated, for messages. */
export function names(points: readonly LiftPoint[], idx: readonly number[]): string {
  return idx.map((i) => points[i]?.id ?? "?").join(", ");
}
