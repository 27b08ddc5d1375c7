import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  calibrateImageScale,
  canRedo,
  canUndo,
  editorReducer,
  fitView,
  handleKey,
  initialEditorState,
  movableHandles,
  nextListIndex,
  nudgeHandle,
  scaleBarLengthM,
  screenToWorld,
  snapToGrid,
  snapViewPoint,
  worldToScreen,
  zoomAbout,
  type PlanEdit,
} from "~/plans/editor-state";
import { fromDisplayLength, toDisplayLength } from "~/utils/format";

const up = { x: 0, y: 0, z: 1 };
const edit: PlanEdit = {
  cog: { x: 0, y: 0, z: 0.4 },
  override: null,
  liftPoints: [
    { label: "A", position: { x: -0.8, y: 0, z: 0.9 }, axis: up, thread: "M20" },
    { label: "B", position: { x: 0.2, y: 0, z: 0.9 }, axis: up, thread: "M20" },
    { label: "C", position: { x: 0.2, y: 0.3, z: 0.9 }, axis: up, thread: "M20" },
  ],
  arrangement: { kind: "bridle", mode: "level", hookHeightM: 1.7, legLengthsM: {}, liftPointLabels: ["A", "B"] },
  rigging: { legs: {} },
};

describe("editor history", () => {
  it("states, and withdraws in one undo step, that the crane hook takes the legs directly", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "set-hook-takes-legs", value: true });
    expect(s.present.rigging.hookTakesLegs).toBe(true);
    s = editorReducer(s, { type: "set-hook-takes-legs", value: false });
    expect("hookTakesLegs" in s.present.rigging).toBe(false);
    s = editorReducer(s, { type: "undo" });
    expect(s.present.rigging.hookTakesLegs).toBe(true);
  });

  it("undoes and redoes each edit in order", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "set-hook-height", hookHeightM: 2 });
    s = editorReducer(s, {
      type: "set-load-override",
      override: { massKg: null, cog: { x: 0.1, y: 0, z: 0.4 }, reason: "Weighed at the corners" },
      cog: { x: 0.1, y: 0, z: 0.4 },
    });
    expect(s.present.arrangement.hookHeightM).toBe(2);
    s = editorReducer(s, { type: "undo" });
    expect(s.present.cog.x).toBe(0);
    expect(s.present.override).toBeNull();
    expect(s.present.arrangement.hookHeightM).toBe(2);
    s = editorReducer(s, { type: "undo" });
    expect(s.present).toEqual(edit);
    expect(canUndo(s)).toBe(false);
    s = editorReducer(s, { type: "redo" });
    s = editorReducer(s, { type: "redo" });
    expect(s.present.cog.x).toBe(0.1);
    expect(canRedo(s)).toBe(false);
  });

  it("a new edit after an undo drops the redo branch", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "set-hook-height", hookHeightM: 2 });
    s = editorReducer(s, { type: "undo" });
    s = editorReducer(s, { type: "set-hook-height", hookHeightM: 3 });
    expect(canRedo(s)).toBe(false);
    expect(editorReducer(s, { type: "redo" })).toBe(s);
  });

  it("a drag is one undo step however many moves it makes", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "checkpoint" });
    for (let i = 1; i <= 30; i++)
      s = editorReducer(s, {
        type: "move-lift-point",
        label: "A",
        position: { x: -0.8 + i * 0.01, y: 0, z: 0.9 },
        transient: true,
      });
    expect(s.present.liftPoints[0]!.position.x).toBeCloseTo(-0.5, 12);
    s = editorReducer(s, { type: "undo" });
    expect(s.present.liftPoints[0]!.position.x).toBe(-0.8);
  });

  it("keeps between one and four lift points in use and drops the gear of a leg taken out", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "allocate", label: "B", slot: "slingItemId", itemId: 7 });
    expect(s.present.rigging.legs.B).toEqual({ hitch: "straight", slingItemId: 7 });
    s = editorReducer(s, { type: "toggle-lift-point", label: "C" });
    expect(s.present.arrangement.liftPointLabels).toEqual(["A", "B", "C"]);
    s = editorReducer(s, { type: "toggle-lift-point", label: "B" });
    expect(s.present.arrangement.liftPointLabels).toEqual(["A", "C"]);
    expect(s.present.rigging.legs.B).toBeUndefined();
    s = editorReducer(s, { type: "toggle-lift-point", label: "A" });
    s = editorReducer(s, { type: "toggle-lift-point", label: "C" });
    expect(s.present.arrangement.liftPointLabels).toEqual(["C"]);
  });

  it("switching a lift point off and on again keeps its eyebolt, shackle, sling, hitch and given length", () => {
    let s = initialEditorState({
      ...edit,
      arrangement: { ...edit.arrangement, mode: "lengths", legLengthsM: { A: 1.2, B: 1.3 } },
    });
    s = editorReducer(s, { type: "allocate", label: "B", slot: "eyeboltItemId", itemId: 3 });
    s = editorReducer(s, { type: "allocate", label: "B", slot: "shackleItemId", itemId: 4 });
    s = editorReducer(s, { type: "allocate", label: "B", slot: "slingItemId", itemId: 5 });
    s = editorReducer(s, { type: "set-hitch", label: "B", hitch: "choke" });
    const before = s.present.rigging.legs.B;
    s = editorReducer(s, { type: "toggle-lift-point", label: "B" });
    expect(s.present.rigging.legs.B).toBeUndefined();
    expect(s.present.arrangement.legLengthsM.B).toBeUndefined();
    s = editorReducer(s, { type: "toggle-lift-point", label: "B" });
    expect(s.present.rigging.legs.B).toEqual(before);
    expect(s.present.arrangement.legLengthsM.B).toBe(1.3);
  });

  it("an eyebolt moved to another leg while its point was off stays on the other leg", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "allocate", label: "B", slot: "eyeboltItemId", itemId: 3 });
    s = editorReducer(s, { type: "allocate", label: "B", slot: "slingItemId", itemId: 5 });
    s = editorReducer(s, { type: "toggle-lift-point", label: "B" });
    s = editorReducer(s, { type: "allocate", label: "A", slot: "eyeboltItemId", itemId: 3 });
    s = editorReducer(s, { type: "allocate", label: "A", slot: "slingItemId", itemId: 5 });
    s = editorReducer(s, { type: "toggle-lift-point", label: "B" });
    expect(s.present.rigging.legs.A).toMatchObject({ eyeboltItemId: 3, slingItemId: 5 });
    expect(s.present.rigging.legs.B).toEqual({ hitch: "straight", slingItemId: 5 });
  });

  it("a leg given an eyebolt or shackle hangs straight (it cannot choke or basket); the eye plane is set per leg", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, { type: "allocate", label: "A", slot: "slingItemId", itemId: 7 });
    s = editorReducer(s, { type: "set-hitch", label: "A", hitch: "basket" });
    expect(s.present.rigging.legs.A!.hitch).toBe("basket");
    s = editorReducer(s, { type: "allocate", label: "A", slot: "shackleItemId", itemId: 8 });
    expect(s.present.rigging.legs.A!.hitch).toBe("straight");
    s = editorReducer(s, { type: "set-eye-plane", label: "A", eyePlane: "y" });
    expect(s.present.rigging.legs.A!.eyePlane).toBe("y");
    s = editorReducer(s, { type: "set-eye-plane", label: "A", eyePlane: "pull" });
    expect(s.present.rigging.legs.A!.eyePlane).toBeUndefined();
  });

  it("law: any sequence of edits undone in full gives back the start", () => {
    const actionArb = fc.oneof(
      fc.record({
        type: fc.constant("set-hook-height" as const),
        hookHeightM: fc.double({ min: 1, max: 5, noNaN: true }),
      }),
      fc.record({
        type: fc.constant("set-load-override" as const),
        override: fc.constant({ massKg: 1200, cog: null, reason: "Weighed" }),
        cog: fc.record({ x: fc.double({ min: -1, max: 1, noNaN: true }), y: fc.constant(0), z: fc.constant(0.4) }),
      }),
      fc.record({ type: fc.constant("toggle-lift-point" as const), label: fc.constantFrom("A", "B", "C") }),
    );
    fc.assert(
      fc.property(fc.array(actionArb, { maxLength: 30 }), (actions) => {
        let s = initialEditorState(edit);
        for (const a of actions) s = editorReducer(s, a);
        while (canUndo(s)) s = editorReducer(s, { type: "undo" });
        expect(s.present).toEqual(edit);
      }),
    );
  });
});

describe("snapping", () => {
  it("snaps to a 50 mm grid, and to a lift point nearby before the grid", () => {
    expect(snapToGrid(0.437, 0.05)).toBeCloseTo(0.45, 12);
    expect(snapToGrid(-0.024, 0.05)).toBeCloseTo(0, 12);
    const candidates = [{ a: 0.2, b: 0.9 }];
    expect(snapViewPoint({ a: 0.21, b: 0.88 }, { gridM: 0.05, radiusM: 0.03, candidates, enabled: true })).toEqual({
      a: 0.2,
      b: 0.9,
    });
    const far = snapViewPoint({ a: 0.33, b: 0.61 }, { gridM: 0.05, radiusM: 0.03, candidates, enabled: true });
    expect(far.a).toBeCloseTo(0.35, 12);
    expect(far.b).toBeCloseTo(0.6, 12);
    expect(snapViewPoint({ a: 0.33, b: 0.61 }, { gridM: 0.05, radiusM: 0.03, candidates, enabled: false })).toEqual({
      a: 0.33,
      b: 0.61,
    });
  });

  it("a dragged lift point is not held at its own last place, but still snaps to the others", () => {
    // Point 0 is being dragged and was last drawn at (0.212, 0.887), off the grid; point 1 stands at (0.5, 0.5).
    const candidates = [
      { a: 0.212, b: 0.887 },
      { a: 0.5, b: 0.5 },
    ];
    const options = { gridM: 0.05, radiusM: 0.03, candidates, enabled: true, draggedIndex: 0 };
    const nudged = snapViewPoint({ a: 0.205, b: 0.895 }, options);
    expect(nudged.a).toBeCloseTo(0.2, 12);
    expect(nudged.b).toBeCloseTo(0.9, 12);
    // Without naming the dragged point its old place would win and the drag could not move it a few pixels.
    expect(snapViewPoint({ a: 0.205, b: 0.895 }, { ...options, draggedIndex: undefined })).toEqual(candidates[0]);
    expect(snapViewPoint({ a: 0.51, b: 0.49 }, options)).toEqual(candidates[1]);
  });
});

describe("the view", () => {
  it("law: zooming about a screen point keeps the world point under it", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 800, noNaN: true }),
        fc.double({ min: 0, max: 600, noNaN: true }),
        (factor, x, y) => {
          const view = { scalePxPerM: 300, originX: 400, originY: 500 };
          const before = screenToWorld(view, x, y);
          const zoomed = zoomAbout(view, factor, x, y);
          const after = worldToScreen(zoomed, before.a, before.b);
          expect(after.x).toBeCloseTo(x, 6);
          expect(after.y).toBeCloseTo(y, 6);
        },
      ),
    );
  });

  it("fits a box inside the screen with its margin", () => {
    const view = fitView({ minA: -0.8, maxA: 0.8, minB: 0, maxB: 1.7 }, 600, 400);
    const low = worldToScreen(view, -0.8, 0);
    const high = worldToScreen(view, 0.8, 1.7);
    expect(low.x).toBeGreaterThanOrEqual(40 - 1e-9);
    expect(high.y).toBeGreaterThanOrEqual(40 - 1e-9);
    expect(low.y).toBeLessThanOrEqual(360 + 1e-9);
  });

  it("scale bars are 1, 2 or 5 times a power of ten", () => {
    expect(scaleBarLengthM(0.37)).toBeCloseTo(0.2, 12);
    expect(scaleBarLengthM(1.9)).toBe(1);
    expect(scaleBarLengthM(7)).toBe(5);
  });
});

describe("tracing over a drawing", () => {
  it("two clicks 200 px apart typed as 1,000 mm give 5 mm per pixel", () => {
    expect(calibrateImageScale({ x: 10, y: 10 }, { x: 130, y: 170 }, fromDisplayLength(1000, "metric"))).toBeCloseTo(
      0.005,
      12,
    );
    expect(calibrateImageScale({ x: 10, y: 10 }, { x: 10, y: 10 }, 1)).toBeNull();
    expect(calibrateImageScale({ x: 0, y: 0 }, { x: 100, y: 0 }, 0)).toBeNull();
  });

  it("a distance typed in inches calibrates the same drawing (1 in = 25.4 mm exactly)", () => {
    const perPixel = calibrateImageScale({ x: 0, y: 0 }, { x: 254, y: 0 }, fromDisplayLength(10, "imperial"))!;
    expect(toDisplayLength(perPixel, "metric")).toBeCloseTo(1, 12);
  });
});

describe("the keyboard", () => {
  const fine = { gridM: 0.05, coarse: false, snap: true };

  it("the arrow keys can move every lift point and, in a level lift, the hook; never the CoG (the component's unless overridden)", () => {
    expect(movableHandles(edit).map(handleKey)).toEqual(["lift-point:A", "lift-point:B", "lift-point:C", "hook"]);
    expect(nudgeHandle(edit, { kind: "cog" }, "plan", "ArrowLeft", { ...fine, coarse: true })).toBeNull();
    const lengths: PlanEdit = { ...edit, arrangement: { ...edit.arrangement, mode: "lengths" } };
    expect(movableHandles(lengths).map(handleKey)).not.toContain("hook");
  });

  it("→ moves a lift point one grid step along x in either view; ↑ is z in the elevation and y in the plan", () => {
    const b = { kind: "lift-point", label: "B" } as const;
    expect(nudgeHandle(edit, b, "elevation", "ArrowRight", fine)).toEqual({
      type: "move-lift-point",
      label: "B",
      position: { x: 0.25, y: 0, z: 0.9 },
    });
    expect(nudgeHandle(edit, b, "elevation", "ArrowUp", fine)).toEqual({
      type: "move-lift-point",
      label: "B",
      position: { x: 0.2, y: 0, z: 0.95 },
    });
    expect(nudgeHandle(edit, b, "plan", "ArrowDown", fine)).toEqual({
      type: "move-lift-point",
      label: "B",
      position: { x: 0.2, y: -0.05, z: 0.9 },
    });
  });

  it("with snapping on, a step from off the grid lands on the grid in the direction pressed", () => {
    const a = { kind: "lift-point", label: "A" } as const;
    const off: PlanEdit = {
      ...edit,
      liftPoints: edit.liftPoints.map((p) => (p.label === "A" ? { ...p, position: { x: 0.03, y: 0, z: 0.9 } } : p)),
    };
    const x = (action: ReturnType<typeof nudgeHandle>) => (action as { position: { x: number } }).position.x;
    expect(x(nudgeHandle(off, a, "elevation", "ArrowRight", fine))).toBeCloseTo(0.1, 12);
    expect(x(nudgeHandle(off, a, "elevation", "ArrowLeft", fine))).toBe(0);
    expect(x(nudgeHandle(off, a, "elevation", "ArrowLeft", { ...fine, snap: false }))).toBeCloseTo(-0.02, 12);
  });

  it("the hook goes only up and down, only in the elevation and only in a level lift", () => {
    const hook = { kind: "hook" } as const;
    expect(nudgeHandle(edit, hook, "elevation", "ArrowUp", { ...fine, coarse: true })).toEqual({
      type: "set-hook-height",
      hookHeightM: 2.2,
    });
    expect(nudgeHandle(edit, hook, "elevation", "ArrowLeft", fine)).toBeNull();
    expect(nudgeHandle(edit, hook, "plan", "ArrowUp", fine)).toBeNull();
    expect(
      nudgeHandle(
        { ...edit, arrangement: { ...edit.arrangement, mode: "lengths" } },
        hook,
        "elevation",
        "ArrowUp",
        fine,
      ),
    ).toBeNull();
  });

  it("other keys and unknown lift points move nothing", () => {
    expect(nudgeHandle(edit, { kind: "cog" }, "elevation", "Enter", fine)).toBeNull();
    expect(nudgeHandle(edit, { kind: "lift-point", label: "Z" }, "elevation", "ArrowUp", fine)).toBeNull();
  });

  it("a nudge is one undo step", () => {
    let s = initialEditorState(edit);
    s = editorReducer(s, nudgeHandle(edit, { kind: "lift-point", label: "A" }, "elevation", "ArrowRight", fine)!);
    expect(s.present.liftPoints[0]!.position.x).toBeCloseTo(-0.75, 12);
    s = editorReducer(s, { type: "undo" });
    expect(s.present).toEqual(edit);
  });

  it("law: ← undoes →, and ↓ undoes ↑, whenever the start is on the grid", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -200, max: 200 }),
        fc.integer({ min: -200, max: 200 }),
        fc.boolean(),
        (i, k, coarse) => {
          const a = { kind: "lift-point", label: "A" } as const;
          const at = (position: PlanEdit["cog"]): PlanEdit => ({
            ...edit,
            liftPoints: edit.liftPoints.map((p) => (p.label === "A" ? { ...p, position } : p)),
          });
          const start = { x: i * 0.05, y: 0, z: k * 0.05 };
          const options = { ...fine, coarse };
          const right = nudgeHandle(at(start), a, "elevation", "ArrowRight", options) as { position: PlanEdit["cog"] };
          const back = nudgeHandle(at(right.position), a, "elevation", "ArrowLeft", options) as {
            position: PlanEdit["cog"];
          };
          expect(back.position.x).toBeCloseTo(start.x, 9);
          const upped = nudgeHandle(at(start), a, "elevation", "ArrowUp", options) as { position: PlanEdit["cog"] };
          expect(upped.position.z - start.z).toBeCloseTo(coarse ? 0.5 : 0.05, 9);
        },
      ),
    );
  });

  it("a list is walked with ↓ and ↑ from its search box and back, Home and End within it", () => {
    expect(nextListIndex("ArrowDown", null, 3)).toBe(0);
    expect(nextListIndex("ArrowDown", 2, 3)).toBe(2);
    expect(nextListIndex("ArrowUp", 1, 3)).toBe(0);
    expect(nextListIndex("ArrowUp", 0, 3)).toBeNull();
    expect(nextListIndex("End", 0, 3)).toBe(2);
    expect(nextListIndex("Home", 2, 3)).toBe(0);
    expect(nextListIndex("Home", null, 3)).toBeUndefined();
    expect(nextListIndex("ArrowDown", null, 0)).toBeUndefined();
    expect(nextListIndex("a", 1, 3)).toBeUndefined();
  });
});
