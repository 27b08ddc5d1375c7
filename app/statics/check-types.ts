// The shapes of the checks: what goes in (gear specs, the rigging description) and what comes out
// (one structured check per item and rule). No sentences and no display units here: a check is
// data, and app/plans/check-text.ts turns it into words in the user's units.
import type { Hitch, RuleSetId, SlingKind } from "./reference";
import type { MassUnit } from "./units";

export type Verdict = "pass" | "warn" | "fail";
/** The older name of a verdict, kept for stored results and API clients. */
export type CheckStatus = Verdict;

export type CheckKind =
  | "leg-angle"
  | "sling-leg"
  | "sling-assembly"
  | "eyebolt"
  | "shackle"
  | "shared-shackle"
  | "master-link"
  | "crane-load"
  | "crane-headroom"
  | "inspection"
  | "beam"
  | "load-tilt";

/** What the check found, as a code the text module words. */
export type Finding =
  | "within"
  | "over"
  | "no-wll"
  | "vertical"
  | "angle-ok"
  | "angle-warn"
  | "angle-fail"
  | "no-mode-factor"
  | "hitch-impossible"
  | "thread-mismatch"
  | "thread-unrecorded"
  | "not-in-table"
  | "pull-behind"
  | "plain-angled"
  | "out-of-plane"
  | "beyond-table"
  | "included-angle"
  | "headroom-short"
  | "masses-unrecorded"
  | "in-date"
  | "due-soon"
  | "overdue"
  | "overdue-at-lift"
  | "quarantined"
  | "withdrawn"
  | "no-due-date"
  | "tilt-ok"
  | "tilt-over";

/** What the product computed would put a failing or warning check right. */
export type Fix =
  /** Level lift: raise the hook point to at least this height, component frame, m. */
  | { kind: "raise-hook"; minHookZM: number }
  /** Given lengths: make these legs at least this long (the load re-settles, so roughly), m. */
  | { kind: "longer-legs"; legs: Array<{ legId: string; minLengthM: number }> }
  /** An item marked (or, for an eyebolt, rated axially) for at least this much, kg. */
  /** orRaiseHookToZM: in a level lift, the hook height (m) at which the same item passes. */
  | { kind: "larger-item"; minWllKg: number; orRaiseHookToZM?: number }
  /** An eyebolt with the tapped hole's thread. */
  | { kind: "tapped-size"; thread: string }
  /** The eyebolt already fills the tapped hole: a lifting point of higher WLL on that thread, or more legs. */
  | { kind: "tapped-size-limit"; thread: string; minWllKg: number; orRaiseHookToZM?: number }
  /** Change these legs by this much to hang the load level (negative: shorten), m. */
  | { kind: "level-legs"; legs: Array<{ legId: string; changeM: number }> }
  /** A hitch the sling and its attachment can make. */
  | { kind: "hitch"; allowed: Hitch[] }
  | { kind: "state-wll" }
  | { kind: "face-eye-to-pull" }
  | { kind: "collar-or-shoulder-eyebolt" }
  | { kind: "lead-away-from-surface" }
  | { kind: "confirm-thread" }
  | { kind: "tabulated-size" }
  | { kind: "shackle-per-leg" }
  /** The hook must reach this much higher than it can, m. */
  | { kind: "more-headroom"; shortfallM: number }
  | { kind: "examine-before"; dateIso: string }
  | { kind: "replace-item" }
  | { kind: "record-examination" }
  | { kind: "record-masses"; items: string[] };

export interface Wll {
  value: number;
  unit: MassUnit;
}

/** How an eyebolt's eye came to face the way it does. */
export type EyeAlignmentSource =
  /** Collar and shoulder eyebolts: screwed home and set (shimmed where needed) with the eye facing the pull. */
  | "set-to-pull"
  /** The planner fixed the eye's plane (along x or y of the component). */
  | "planner"
  /** The caller said the eye is not aligned with the pull. */
  | "given-not-aligned"
  /** A plain eyebolt: it takes in-line pull only, so the eye's plane does not matter. */
  | "not-applicable";

/** Where a shackle's side-load angle came from. */
export type SideLoadSource =
  | "given"
  /** From the pull and the eyebolt's eye plane (the pin passes through the eye). */
  | "eye-plane"
  /** From the pull and the lug's plane as the planner set it. */
  | "lug-plane"
  /** No plane recorded for the lug: taken to lie along the pull. */
  | "lug-assumed";

/** The figures and settings a check used, beyond load and capacity. Every mass kg, every length m, every angle deg. */
export interface CheckInputs {
  angleFromVerticalDeg?: number;
  limits?: { verticalDeg: number; warnDeg: number; maxDeg: number };
  mode?: "level" | "lengths";
  /** A WLL as looked up or stated, kg, and what it came from. */
  wllKg?: number;
  wllFrom?: "marked" | "table" | "assembly";
  /** The WLL as marked on the item (unit as marked), where known. */
  markedWll?: Wll;
  hitch?: Hitch;
  hitchFactor?: number;
  allowedHitches?: Hitch[];
  modeFactor?: number;
  effectiveLegs?: 1 | 2 | 3;
  modeUpToDeg?: number;
  /** The published multi-leg table value that capped the capacity, t. */
  publishedCapT?: number;
  ratingRule?: string;
  axisAngleDeg?: number;
  family?: "collar" | "shoulder" | "plain";
  thread?: string;
  liftPointThread?: string | null;
  column?: string;
  percent?: number;
  tableUpToDeg?: number;
  /** Marked WLL scaled the DIN 580 row by this factor (< 1 when marked below the table). */
  scaleToMarked?: number;
  eyeAlignment?: EyeAlignmentSource;
  eyePlane?: "x" | "y";
  outOfPlaneDeg?: number;
  sideLoadAngleDeg?: number;
  sideLoadFrom?: SideLoadSource;
  includedAngleDeg?: number;
  maxIncludedDeg?: number;
  gross?: GrossLoad;
  neededHookHeightM?: number;
  /** The load's tilt in each of its planes and the fit tolerance it is held to, deg. */
  tilt?: {
    alongLengthDeg: number;
    acrossWidthDeg: number;
    toleranceDeg: number;
    toleranceFrom: "component" | "common-practice";
  };
  maxHookHeightM?: number;
  inspection?: {
    status: "in_service" | "quarantined" | "withdrawn";
    examinationDue: string | null;
    todayIso: string;
    liftDateIso: string | null;
    daysLeftToday: number | null;
    daysLeftAtLift: number | null;
    warnDays: number;
  };
}

/** What a hook or crane carries and what it is made of, kg. */
export interface GrossLoad {
  massKg: number;
  contingencyPct: number;
  loadWithContingencyKg: number;
  /** Allocated items' own masses, each counted once. */
  items: Array<{ item: string; code: string | null; massKg: number }>;
  /** Items whose mass is not recorded (added as nothing). */
  unrecorded: string[];
  /** A lump sum the caller gave for rigging. */
  riggingMassKg: number;
  beamMassKg: number;
}

/** One check of one item (or the geometry) against one rule. Figures unrounded, in kg. */
export interface Check {
  /** Stable id: angle-A, sling-leg-A, sling-assembly, eyebolt-A, shackle-A, shared-shackle-1, master-link, crane-load, crane-headroom, inspection-<code>, beam. */
  id: string;
  kind: CheckKind;
  /** The item in the trade's words with its marked size (never a computed figure): "Sling leg A (chain 8 mm)". */
  item: string;
  /** The register's code of the item, where it comes from the register. */
  itemCode: string | null;
  /** The lift points (legs) the check is about; empty for the hook, crane or whole sling. */
  position: { legs: string[] };
  verdict: Verdict;
  finding: Finding;
  loadKg: number | null;
  capacityKg: number | null;
  /** load / capacity, unrounded; null where the check is not a load ratio (headroom: needed / available). */
  utilisation: number | null;
  /** The rule applied, in words without figures. */
  rule: string;
  ruleSet: RuleSetId;
  source: string;
  inputs: CheckInputs;
  fix: Fix | null;
}

/** A check as /api/solve answers it and plans store it: the structured check plus the older fields. */
export type CheckResult = Check & {
  /** Same as verdict (older clients read this). */
  status: Verdict;
  /** The finding as a sentence in metric units (older clients read this). */
  message: string;
};

export type ItemStatus = "in_service" | "quarantined" | "withdrawn";

export interface InspectionRecord {
  itemId: string;
  status: ItemStatus;
  /** Date the next thorough examination is due, YYYY-MM-DD. */
  examinationDue: string;
}

/** Identity and own mass of a register item, on every spec. */
interface ItemIdentity {
  /** The register's code. */
  itemCode?: string;
  /** The item's own mass, kg: added to the hook and crane loads. */
  massKg?: number;
  inspection?: InspectionRecord;
}

export interface SlingSpec extends ItemIdentity {
  kind: SlingKind;
  wllKg?: number;
  wll?: Wll;
  hitch: Hitch;
  grade?: string;
  diameterMm?: number;
  colour?: string;
  /** Legs of the sling assembly this leg belongs to (1 for a single sling); a leg of a multi-leg sling has one free end. */
  assemblyLegs?: number;
  /** The marked WLL of the whole assembly, for display where the leg's WLL is derived from it. */
  assemblyWll?: Wll;
}

export interface ShackleSpec extends ItemIdentity {
  wllKg?: number;
  wll?: Wll;
  type: "bow" | "dee";
  pin?: "screw" | "bolt";
  /** Angle between the pull and the shackle's plane, deg (0 = in line); taken from the geometry when absent. */
  sideLoadAngleDeg?: number;
}

export type EyeboltFamily = "collar" | "shoulder" | "plain";

export interface EyeboltSpec extends ItemIdentity {
  family: EyeboltFamily;
  thread: string;
  wllKg?: number;
  wll?: Wll;
  /** False when the eye cannot be turned in line with the pull; absent: the geometry decides. */
  eyeAlignedWithPull?: boolean;
}

/** The plane of the eye or lug at a lift point: set to face the pull, or fixed along the component's x or y. */
export type EyePlane = "pull" | "x" | "y";

export interface LegRigging {
  sling?: SlingSpec;
  shackle?: ShackleSpec;
  eyebolt?: EyeboltSpec;
  /** The plane of the eyebolt's eye or the lug, where the planner fixes it. */
  eyePlane?: EyePlane;
}

export interface SharedShackleSpec extends ItemIdentity {
  legIds: [string, string];
  wllKg?: number;
  wll?: Wll;
}

export interface CraneSpec {
  swlKg: number;
  /** The SWL as marked, for display. */
  swl?: Wll;
  /** Highest position of the hook's bearing point above the floor, m. */
  maxHookHeightM?: number;
  itemCode?: string;
  inspection?: InspectionRecord;
}

export interface MasterLinkSpec extends ItemIdentity {
  wllKg?: number;
  wll?: Wll;
}

export interface HeadroomSpec {
  /** Height the load's underside must reach above the floor, m. */
  clearanceAboveFloorM: number;
  /** z of the load's underside in the component frame, m (default 0). */
  loadUndersideZM?: number;
}

export interface RiggingDescription {
  legs?: Record<string, LegRigging>;
  sharedShackles?: SharedShackleSpec[];
  masterLink?: MasterLinkSpec;
  crane?: CraneSpec;
  headroom?: HeadroomSpec;
  /** Contingency on the load mass, % (0..100). */
  contingencyPct?: number;
  /** A lump sum for rigging the specs do not carry a mass for, kg: added at the master link and crane. */
  riggingMassKg?: number;
}

export interface LiftPointInfo {
  id: string;
  thread?: string;
}
