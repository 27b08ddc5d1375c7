import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { coincidentLabels, placeFiguresBox, segmentHitsBox } from "~/plans/drawing-layout";

describe("lift point labels that would print over each other", () => {
  it("become one label naming both, e.g. A and B one behind the other in the elevation", () => {
    const shown = coincidentLabels([
      { label: "A", x: 137, y: 344 },
      { label: "B", x: 137.4, y: 344 },
      { label: "C", x: 424, y: 344 },
    ]);
    expect(shown.get("A")).toBe("A/B");
    expect(shown.get("B")).toBeNull();
    expect(shown.get("C")).toBe("C");
  });
  it("law: every point is named exactly once, whatever the layout", () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.constantFrom("A", "B", "C", "D"), { minLength: 1, maxLength: 4 }).chain((labels) =>
          fc.tuple(
            fc.constant(labels),
            fc.array(fc.record({ x: fc.integer({ min: 0, max: 60 }), y: fc.integer({ min: 0, max: 60 }) }), {
              minLength: labels.length,
              maxLength: labels.length,
            }),
          ),
        ),
        ([labels, at]) => {
          const shown = coincidentLabels(labels.map((label, i) => ({ label, ...at[i]! })));
          const named = [...shown.values()].filter((t): t is string => t !== null).flatMap((t) => t.split("/"));
          expect(named.sort()).toEqual([...labels].sort());
        },
      ),
    );
  });
});

describe("the leg figures box", () => {
  it("knows when a line crosses it", () => {
    const box = { x: 10, y: 10, width: 100, height: 40 };
    expect(segmentHitsBox({ x: 0, y: 0 }, { x: 200, y: 100 }, box)).toBe(true);
    expect(segmentHitsBox({ x: 0, y: 100 }, { x: 200, y: 100 }, box)).toBe(false);
    expect(segmentHitsBox({ x: 50, y: 20 }, { x: 60, y: 30 }, box)).toBe(true);
  });
  it("moves to a corner no sling crosses", () => {
    // A flat leg from the hook at the top centre out to the left crosses the top-left corner; top-right is clear.
    const at = placeFiguresBox({ width: 200, height: 60 }, { width: 550, height: 414 }, [
      [
        { x: 275, y: 20 },
        { x: 20, y: 60 },
      ],
      [
        { x: 275, y: 20 },
        { x: 150, y: 340 },
      ],
    ]);
    expect(at).toEqual({ x: 342, y: 8 });
  });
  it("stays top left when nothing is in the way", () => {
    expect(placeFiguresBox({ width: 200, height: 60 }, { width: 550, height: 414 }, [])).toEqual({ x: 8, y: 8 });
  });
});
