// The plan editor's state: the editable parts of a plan, with undo and redo, snapping and the
// view transform of the drawing. Pure (no React, no Konva, no I/O), so it is tested on its own.
import type { Arrangement, LegRiggingAllocation, RiggingAllocation } from "~/plans/document";
import type { LoadOverride } from "~/plans/load-override";

export type Vec3 = { x: number; y: number; z: number };
export type EditorLiftPoint = { label: string; position: Vec3; axis: Vec3; thread: string };

/**
 * What the planner edits on the drawing: the load's lift points (the plan's own copy), the override of the
 * component's mass and CoG (with its reason), the arrangement and the gear. `cog` is the CoG as planned: the
 * component's, or the override's; it moves only with the override.
 */
export type PlanEdit = {
  cog: Vec3;
  override: LoadOverride | null;
  liftPoints: EditorLiftPoint[];
  arrangement: Arrangement;
  rigging: RiggingAllocation;
  /**
   * The gear and given length of lift points switched out of use in this editing session, kept so that
   * switching a point back on brings them back. Never saved: a plan carries rigging only for legs in use.
   */
  parked?: Record<string, { leg?: RiggingAllocation["legs"][string]; lengthM?: number }>;
};

export type EditorState = { past: PlanEdit[]; present: PlanEdit; future: PlanEdit[] };

/** Undo keeps this many steps. */
export const HISTORY_LIMIT = 200;

export type EditorAction =
  | { type: "load"; edit: PlanEdit }
  /** Starts a drag: the state before it becomes one undo step, and the moves that follow are transient. */
  | { type: "checkpoint" }
  /** Sets or (null) removes the override; `cog` is the CoG as planned that follows from it. */
  | { type: "set-load-override"; override: LoadOverride | null; cog: Vec3 }
  | { type: "move-lift-point"; label: string; position: Vec3; transient?: boolean }
  | { type: "set-hook-height"; hookHeightM: number; transient?: boolean }
  | { type: "set-leg-length"; label: string; lengthM: number }
  | { type: "set-mode"; mode: Arrangement["mode"]; legLengthsM?: Record<string, number> }
  | { type: "set-kind"; kind: Arrangement["kind"]; beam?: Arrangement["beam"] }
  | { type: "toggle-lift-point"; label: string }
  | {
      type: "allocate";
      label: string | null;
      slot: "eyeboltItemId" | "shackleItemId" | "slingItemId" | "masterLinkItemId" | "craneItemId" | "beamItemId";
      itemId: number | null;
    }
  | { type: "set-hitch"; label: string; hitch: "straight" | "choke" | "basket" }
  | { type: "set-eye-plane"; label: string; eyePlane: "pull" | "x" | "y" }
  /** No master link: the crane hook takes the legs (or the beam's top rigging) directly. */
  | { type: "set-hook-takes-legs"; value: boolean }
  | { type: "undo" }
  | { type: "redo" };

/** Every register item id allocated anywhere in `rigging`. */
function allocatedItemIds(rigging: RiggingAllocation): Set<number> {
  const ids = new Set<number>();
  for (const leg of Object.values(rigging.legs))
    for (const id of Object.values(leg ?? {})) if (typeof id === "number") ids.add(id);
  for (const id of Object.values(rigging)) if (typeof id === "number") ids.add(id);
  return ids;
}

export function initialEditorState(edit: PlanEdit): EditorState {
  return { past: [], present: edit, future: [] };
}

function commit(state: EditorState, next: PlanEdit, transient = false): EditorState {
  if (next === state.present) return state;
  if (transient) return { ...state, present: next };
  return { past: [...state.past, state.present].slice(-HISTORY_LIMIT), present: next, future: [] };
}

function apply(edit: PlanEdit, action: EditorAction): PlanEdit {
  switch (action.type) {
    case "set-load-override":
      return { ...edit, override: action.override, cog: action.cog };
    case "move-lift-point":
      return {
        ...edit,
        liftPoints: edit.liftPoints.map((p) => (p.label === action.label ? { ...p, position: action.position } : p)),
      };
    case "set-hook-height":
      return { ...edit, arrangement: { ...edit.arrangement, hookHeightM: action.hookHeightM } };
    case "set-leg-length":
      return {
        ...edit,
        arrangement: {
          ...edit.arrangement,
          legLengthsM: { ...edit.arrangement.legLengthsM, [action.label]: action.lengthM },
        },
      };
    case "set-mode":
      return {
        ...edit,
        arrangement: {
          ...edit.arrangement,
          mode: action.mode,
          legLengthsM: action.legLengthsM ?? edit.arrangement.legLengthsM,
        },
      };
    case "set-kind": {
      // A bridle hangs from no beam: the beam's allocation goes with the beam arrangement.
      const { beamItemId: _beam, ...withoutBeam } = edit.rigging;
      return {
        ...edit,
        arrangement: {
          ...edit.arrangement,
          kind: action.kind,
          mode: action.kind === "beam" ? "level" : edit.arrangement.mode,
          beam: action.beam ?? edit.arrangement.beam,
        },
        rigging: action.kind === "beam" ? edit.rigging : withoutBeam,
      };
    }
    case "toggle-lift-point": {
      const used = edit.arrangement.liftPointLabels;
      const isUsed = used.includes(action.label);
      if (!isUsed && used.length >= 4) return edit;
      if (isUsed && used.length <= 1) return edit;
      const order = edit.liftPoints.map((p) => p.label);
      const labels = isUsed
        ? used.filter((l) => l !== action.label)
        : [...used, action.label].sort((a, b) => order.indexOf(a) - order.indexOf(b));
      const legs = { ...edit.rigging.legs };
      const legLengthsM = { ...edit.arrangement.legLengthsM };
      const parked = { ...edit.parked };
      if (isUsed) {
        parked[action.label] = { leg: legs[action.label], lengthM: legLengthsM[action.label] };
        delete legs[action.label];
        delete legLengthsM[action.label];
      } else {
        const back = parked[action.label];
        delete parked[action.label];
        if (back?.leg) {
          // An eyebolt or shackle allocated elsewhere since the point was switched off stays where it is now
          // (one item, one place); a sling may serve several legs, so it always comes back.
          const inUse = allocatedItemIds({ ...edit.rigging, legs });
          const restored = Object.fromEntries(
            Object.entries(back.leg).filter(
              ([slot, id]) => slot === "slingItemId" || typeof id !== "number" || !inUse.has(id),
            ),
          );
          if (Object.keys(restored).length) legs[action.label] = restored as typeof back.leg;
        }
        if (back?.lengthM !== undefined) legLengthsM[action.label] = back.lengthM;
      }
      return {
        ...edit,
        arrangement: { ...edit.arrangement, liftPointLabels: labels, legLengthsM },
        rigging: { ...edit.rigging, legs },
        parked,
      };
    }
    case "allocate": {
      if (action.slot === "masterLinkItemId" || action.slot === "craneItemId" || action.slot === "beamItemId") {
        const rigging = { ...edit.rigging };
        if (action.itemId === null) delete rigging[action.slot];
        else rigging[action.slot] = action.itemId;
        return { ...edit, rigging };
      }
      if (!action.label) return edit;
      const leg: LegRiggingAllocation = { hitch: "straight" as const, ...edit.rigging.legs[action.label] };
      if (action.itemId === null) delete leg[action.slot];
      else leg[action.slot] = action.itemId;
      // A leg pinned in an eyebolt or shackle can only hang straight (rule-sets.ts allowedHitches).
      if (leg.eyeboltItemId !== undefined || leg.shackleItemId !== undefined) leg.hitch = "straight";
      return { ...edit, rigging: { ...edit.rigging, legs: { ...edit.rigging.legs, [action.label]: leg } } };
    }
    case "set-hook-takes-legs": {
      const rigging = { ...edit.rigging };
      if (action.value) rigging.hookTakesLegs = true;
      else delete rigging.hookTakesLegs;
      return { ...edit, rigging };
    }
    case "set-hitch": {
      const leg = { ...edit.rigging.legs[action.label], hitch: action.hitch };
      return { ...edit, rigging: { ...edit.rigging, legs: { ...edit.rigging.legs, [action.label]: leg } } };
    }
    case "set-eye-plane": {
      const leg: LegRiggingAllocation = { hitch: "straight", ...edit.rigging.legs[action.label] };
      if (action.eyePlane === "pull") delete leg.eyePlane;
      else leg.eyePlane = action.eyePlane;
      return { ...edit, rigging: { ...edit.rigging, legs: { ...edit.rigging.legs, [action.label]: leg } } };
    }
    default:
      return edit;
  }
}

/** The editor's reducer: every edit is one undo step unless marked transient (a drag after its checkpoint). */
export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  switch (action.type) {
    case "load":
      return initialEditorState(action.edit);
    case "checkpoint":
      return { past: [...state.past, state.present].slice(-HISTORY_LIMIT), present: state.present, future: [] };
    case "undo": {
      const previous = state.past.at(-1);
      if (!previous) return state;
      return { past: state.past.slice(0, -1), present: previous, future: [state.present, ...state.future] };
    }
    case "redo": {
      const [next, ...rest] = state.future;
      if (!next) return state;
      return { past: [...state.past, state.present], present: next, future: rest };
    }
    default: {
      const transient = "transient" in action && action.transient === true;
      return commit(state, apply(state.present, action), transient);
    }
  }
}

export function canUndo(state: EditorState) {
  return state.past.length > 0;
}

export function canRedo(state: EditorState) {
  return state.future.length > 0;
}

// ----- snapping -----

/** Rounds a coordinate (m) to the nearest multiple of the grid step (m). */
export function snapToGrid(valueM: number, gridM: number): number {
  if (!(gridM > 0)) return valueM;
  return Math.round(valueM / gridM) * gridM;
}

/** The candidate within `radiusM` of `point` that is nearest, else null. Points are 2-D view coordinates in metres. */
export function nearestWithin(
  point: { a: number; b: number },
  candidates: ReadonlyArray<{ a: number; b: number }>,
  radiusM: number,
) {
  let best: { a: number; b: number } | null = null;
  let bestDistance = radiusM;
  for (const c of candidates) {
    const d = Math.hypot(c.a - point.a, c.b - point.b);
    if (d <= bestDistance) {
      best = c;
      bestDistance = d;
    }
  }
  return best;
}

/**
 * Snaps a dragged view point: to a candidate point when within `radiusM`, else to the grid. `draggedIndex` names the
 * candidate being dragged: where it stood is no target (it would hold the point at its old place).
 */
export function snapViewPoint(
  point: { a: number; b: number },
  options: {
    gridM: number;
    radiusM: number;
    candidates: ReadonlyArray<{ a: number; b: number }>;
    enabled: boolean;
    draggedIndex?: number;
  },
) {
  if (!options.enabled) return point;
  const targets =
    options.draggedIndex === undefined
      ? options.candidates
      : options.candidates.filter((_, i) => i !== options.draggedIndex);
  const near = nearestWithin(point, targets, options.radiusM);
  if (near) return { a: near.a, b: near.b };
  return { a: snapToGrid(point.a, options.gridM), b: snapToGrid(point.b, options.gridM) };
}

/** Grid steps by unit preference: 50 mm, or 2 in (0.0508 m). */
export function gridStepM(units: "metric" | "imperial") {
  return units === "metric" ? 0.05 : 0.0508;
}

// ----- the view: zoom and pan -----

/** Screen = origin + scale * (a, -b): b (z or y) points up on the screen. */
export type ViewTransform = { scalePxPerM: number; originX: number; originY: number };

export function worldToScreen(view: ViewTransform, a: number, b: number) {
  return { x: view.originX + a * view.scalePxPerM, y: view.originY - b * view.scalePxPerM };
}

export function screenToWorld(view: ViewTransform, x: number, y: number) {
  return { a: (x - view.originX) / view.scalePxPerM, b: (view.originY - y) / view.scalePxPerM };
}

export const MIN_SCALE_PX_PER_M = 5;
export const MAX_SCALE_PX_PER_M = 20000;

/** Zooms by `factor` about the screen point (x, y), which stays over the same world point. */
export function zoomAbout(view: ViewTransform, factor: number, x: number, y: number): ViewTransform {
  const scale = Math.min(MAX_SCALE_PX_PER_M, Math.max(MIN_SCALE_PX_PER_M, view.scalePxPerM * factor));
  const world = screenToWorld(view, x, y);
  return { scalePxPerM: scale, originX: x - world.a * scale, originY: y + world.b * scale };
}

/** The view that fits the box [minA, maxA] x [minB, maxB] (m) in a width x height screen with a margin (px). */
export function fitView(
  box: { minA: number; maxA: number; minB: number; maxB: number },
  width: number,
  height: number,
  marginPx = 40,
): ViewTransform {
  const spanA = Math.max(box.maxA - box.minA, 1e-3);
  const spanB = Math.max(box.maxB - box.minB, 1e-3);
  const scale = Math.max(
    MIN_SCALE_PX_PER_M,
    Math.min((width - 2 * marginPx) / spanA, (height - 2 * marginPx) / spanB, MAX_SCALE_PX_PER_M),
  );
  const midA = (box.minA + box.maxA) / 2;
  const midB = (box.minB + box.maxB) / 2;
  return { scalePxPerM: scale, originX: width / 2 - midA * scale, originY: height / 2 + midB * scale };
}

// ----- tracing over a drawing: scale calibration -----

/**
 * Metres per image pixel from two points clicked on the drawing (image pixels) and the distance
 * typed between them (m). Null when the points coincide or the distance is not positive.
 */
export function calibrateImageScale(
  p1: { x: number; y: number },
  p2: { x: number; y: number },
  distanceM: number,
): number | null {
  const pixels = Math.hypot(p2.x - p1.x, p2.y - p1.y);
  if (!(pixels > 0.5) || !(distanceM > 0) || !Number.isFinite(distanceM)) return null;
  return distanceM / pixels;
}

/** A "nice" scale-bar length (1, 2 or 5 x 10^n m) no longer than `maxM`. */
export function scaleBarLengthM(maxM: number) {
  if (!(maxM > 0)) return 0;
  const power = 10 ** Math.floor(Math.log10(maxM));
  return [5, 2, 1].map((m) => m * power).find((v) => v <= maxM) ?? power;
}

// ----- the keyboard -----

/** Something on the drawing that can be moved: a lift point, the CoG or the hook. */
export type Handle = { kind: "lift-point"; label: string } | { kind: "cog" } | { kind: "hook" };

export type DrawingView = "elevation" | "plan";

/** The component-frame axes across (a, to the right) and up (b) each view. */
export const VIEW_AXES: Record<DrawingView, readonly [keyof Vec3, keyof Vec3]> = {
  elevation: ["x", "z"],
  plan: ["x", "y"],
};

/** A handle's stable key, for radio values and comparisons: "lift-point:A", "cog", "hook". */
export function handleKey(handle: Handle) {
  return handle.kind === "lift-point" ? `lift-point:${handle.label}` : handle.kind;
}

export function handleName(handle: Handle) {
  return handle.kind === "lift-point" ? `Lift point ${handle.label}` : handle.kind === "cog" ? "CoG" : "Hook";
}

/**
 * What the arrow keys can move: every lift point, and the hook when its height is what is given (level mode).
 * Not the CoG: it is the component's unless the planner overrides it with a reason.
 */
export function movableHandles(edit: PlanEdit): Handle[] {
  const handles: Handle[] = edit.liftPoints.map((p) => ({ kind: "lift-point", label: p.label }));
  if (edit.arrangement.mode === "level") handles.push({ kind: "hook" });
  return handles;
}

const ARROWS: Record<string, { axis: 0 | 1; sign: 1 | -1 }> = {
  ArrowRight: { axis: 0, sign: 1 },
  ArrowLeft: { axis: 0, sign: -1 },
  ArrowUp: { axis: 1, sign: 1 },
  ArrowDown: { axis: 1, sign: -1 },
};

/** A coordinate stepped by a key: one grid step (ten when coarse), landing on the grid when snapping is on; to the micrometre. */
function stepped(valueM: number, sign: 1 | -1, options: { gridM: number; coarse: boolean; snap: boolean }) {
  const moved = valueM + sign * options.gridM * (options.coarse ? 10 : 1);
  const micrometres = Math.round((options.snap ? snapToGrid(moved, options.gridM) : moved) * 1e6);
  // Adding 0 turns -0 into 0, so a point stepped back onto zero reads and saves as 0.
  return micrometres / 1e6 + 0;
}

/**
 * The edit an arrow key makes to a handle in a view, as one undo step, or null when that key does
 * not move it there. ← → move along the view's across axis (x), ↑ ↓ along its up axis (z in the
 * elevation, y in the plan); the hook only goes up and down, in the elevation.
 */
export function nudgeHandle(
  edit: PlanEdit,
  handle: Handle,
  view: DrawingView,
  key: string,
  options: { gridM: number; coarse: boolean; snap: boolean },
): EditorAction | null {
  const arrow = ARROWS[key];
  if (!arrow) return null;
  const axis = VIEW_AXES[view][arrow.axis];
  if (handle.kind === "hook") {
    if (view !== "elevation" || arrow.axis !== 1 || edit.arrangement.mode !== "level") return null;
    return { type: "set-hook-height", hookHeightM: stepped(edit.arrangement.hookHeightM, arrow.sign, options) };
  }
  if (handle.kind === "cog") return null;
  const point = edit.liftPoints.find((p) => p.label === handle.label);
  if (!point) return null;
  return {
    type: "move-lift-point",
    label: point.label,
    position: { ...point.position, [axis]: stepped(point.position[axis], arrow.sign, options) },
  };
}

/**
 * Where focus goes in a list for a key: ↓ from the box above it (null) to the first item and on
 * down, ↑ back up and from the first item to the box, Home and End within the list. Undefined
 * when the key does not move focus (so the box keeps its own Home and End).
 */
export function nextListIndex(key: string, current: number | null, count: number): number | null | undefined {
  if (count === 0) return undefined;
  switch (key) {
    case "ArrowDown":
      return current === null ? 0 : Math.min(current + 1, count - 1);
    case "ArrowUp":
      return current === null || current === 0 ? null : current - 1;
    case "Home":
      return current === null ? undefined : 0;
    case "End":
      return current === null ? undefined : count - 1;
    default:
      return undefined;
  }
}
