import { describe, expect, it } from "vitest";
import { loadPathGaps } from "~/plans/load-path";

// A load path is complete when every used leg has its attachment at the load and its sling, the legs
// meet in a top fitting on the hook, and a crane carries it (common practice; BS 7121-1 on planning
// the lifting accessories between the load and the hook).
const point = (label: string, thread: string) => ({
  label,
  position: { x: 0, y: 0, z: 1 },
  axis: { x: 0, y: 0, z: 1 },
  thread,
});
const snapshot = { liftPoints: [point("A", "M20"), point("B", "M20"), point("L", "")] };
const bridle = (labels: string[]) => ({ kind: "bridle" as const, liftPointLabels: labels });
const leg = (ids: { eyebolt?: number; shackle?: number; sling?: number }) => ({
  hitch: "straight" as const,
  ...(ids.eyebolt ? { eyeboltItemId: ids.eyebolt } : {}),
  ...(ids.shackle ? { shackleItemId: ids.shackle } : {}),
  ...(ids.sling ? { slingItemId: ids.sling } : {}),
});

describe("the load path from the load to the crane", () => {
  it("is complete with an eyebolt and a sling on each tapped lift point, a master link and a crane", () => {
    const rigging = {
      legs: { A: leg({ eyebolt: 1, sling: 2 }), B: leg({ eyebolt: 3, shackle: 4, sling: 5 }) },
      masterLinkItemId: 6,
      craneItemId: 7,
    };
    expect(loadPathGaps(snapshot, bridle(["A", "B"]), rigging)).toEqual([]);
  });

  it("names every gap by its position", () => {
    const rigging = { legs: { A: leg({ sling: 2 }), L: leg({ eyebolt: 3 }) } };
    expect(loadPathGaps(snapshot, bridle(["A", "B", "L"]), rigging)).toEqual([
      "Leg A has no eyebolt at the load (lift point A is a tapped M20 hole).",
      "Leg B has no eyebolt at the load (lift point B is a tapped M20 hole).",
      "Leg B has no sling.",
      "Leg L has no shackle at the load (lift point L has no thread, so it is taken as a lug).",
      "Leg L has no sling.",
      "The legs have no top fitting: allocate a master link, or state that the crane hook takes the legs directly.",
      "No crane or hoist is allocated.",
    ]);
  });

  it("takes a lug with a shackle, and the crane hook stated as taking the legs directly as the top fitting", () => {
    const rigging = { legs: { L: leg({ shackle: 1, sling: 2 }) }, hookTakesLegs: true, craneItemId: 3 };
    expect(loadPathGaps(snapshot, bridle(["L"]), rigging)).toEqual([]);
  });

  it("asks a beam for its own rigging: each drop's attachment and sling, the beam's top fitting and the crane", () => {
    const beam = { kind: "beam" as const, liftPointLabels: ["A", "B"] };
    expect(
      loadPathGaps(snapshot, beam, { legs: { A: leg({ eyebolt: 1, sling: 2 }), B: leg({ eyebolt: 3 }) } }),
    ).toEqual([
      "Drop B has no sling.",
      "The beam has no top fitting: allocate a master link, or state that the crane hook takes the beam's top rigging directly.",
      "No crane or hoist is allocated.",
    ]);
  });
});
