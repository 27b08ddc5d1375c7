import { describe, expect, it } from "vitest";
import { rectangleOutlines, type ComponentDefinition } from "~/loads/component-definition";
import {
  effectiveOverride,
  overrideIssues,
  overrideMark,
  overrideSentences,
  plannedLoad,
  readStoredLoad,
  storedLoadJson,
} from "~/plans/load-override";

const component: ComponentDefinition = {
  name: "Element",
  description: "",
  massKg: 2000,
  massSource: "certified",
  massNote: "",
  contingencyPct: 3,
  lengthM: 1.8,
  widthM: 0.8,
  heightM: 0.9,
  cog: { x: 0, y: 0, z: 0.5 },
  cogSource: "manufacturer",
  cogNote: "",
  ...rectangleOutlines(1.8, 0.8, 0.9),
  liftPoints: [],
  parts: [],
};

describe("the load as planned", () => {
  it("follows the component without an override, and the override's figures with one, kept beside the component's", () => {
    expect(plannedLoad(component, null)).toBe(component);
    const override = { massKg: 2150, cog: null, reason: "Weighed" };
    const stored = readStoredLoad(storedLoadJson(component, override));
    expect(stored.component).toEqual(component);
    expect(stored.override).toEqual(override);
    expect(plannedLoad(stored.component, stored.override)).toMatchObject({ massKg: 2150, cog: component.cog });
  });

  it("drops figures equal to the component's (0.5 mm, as the component comparison) and refuses an override of nothing", () => {
    const same = { massKg: 2000, cog: { x: 0.0004, y: 0, z: 0.5 }, reason: "No change" };
    expect(effectiveOverride(component, same)).toBeNull();
    expect(overrideIssues(component, same)[0]!.message).toMatch(/nothing to override/);
    expect(JSON.parse(storedLoadJson(component, same))).not.toHaveProperty("override");
  });

  it("refuses a CoG outside the outline on each axis with the component form's sentence", () => {
    const issues = overrideIssues(component, { massKg: null, cog: { x: 1, y: -0.5, z: 0.95 }, reason: "Moved" });
    expect(issues.map((i) => i.path.at(-1))).toEqual(["x", "y", "z"]);
    expect(issues[0]!.message).toBe(
      "The CoG lies outside the component's outline along x; check the figure and the datum.",
    );
  });

  it("says both figures in the user's units: 2150 kg is 4,740 lb (1 lb = 0.45359237 kg exactly)", () => {
    const mark = overrideMark(component, { massKg: 2150, cog: null, reason: "Weighed" })!;
    expect(overrideSentences(mark, "metric")[0]).toBe(
      "Mass differs from the component: 2,150 kg as planned, 2,000 kg on the component.",
    );
    expect(overrideSentences(mark, "imperial")[0]).toContain("4,740 lb as planned");
  });
});
