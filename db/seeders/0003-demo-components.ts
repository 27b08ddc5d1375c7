import { rectangleOutlines, type ComponentDefinition } from "~/loads/component-definition";
import { addComponentFile } from "~/loads/component-files.server";
import { Component, createComponent } from "~/models/component.server";
import { drawElevation, drawPlan } from "./demo-drawing";
import { findUserByEmail } from "~/models/user.server";
import { compositeMassAndCog } from "~/statics/composite";

type LiftPointSeed = [label: string, x: number, y: number, z: number, thread: string];

function lift(points: LiftPointSeed[], engagementMm: number): ComponentDefinition["liftPoints"] {
  return points.map(([label, x, y, z, thread]) => ({
    label,
    position: { x, y, z },
    axis: { x: 0, y: 0, z: 1 },
    thread,
    engagementMm,
  }));
}

const coverParts = [
  { name: "Cover casting", massKg: 276, position: { x: 0.01, y: 0, z: 0.065 } },
  { name: "Inspection hatch and frame", massKg: 22, position: { x: -0.2, y: 0, z: 0.15 } },
  { name: "Breather and oil filler", massKg: 12, position: { x: 0.3, y: 0.1, z: 0.2 } },
];
const cover = compositeMassAndCog(coverParts)!;

/** The invented scenario's components (figures are plausible, not from any real machine). */
export const DEMO_COMPONENTS: ComponentDefinition[] = [
  {
    name: "C2 compression element (screw air-end)",
    description: "Twin-screw element of compressor C2, lifted out of the package frame for workshop overhaul.",
    massKg: 1480,
    massSource: "certified",
    massNote: "Manufacturer's dispatch certificate 7741-C2",
    contingencyPct: 3,
    lengthM: 1.3,
    widthM: 0.72,
    heightM: 0.86,
    cog: { x: 0.08, y: 0, z: 0.39 },
    cogSource: "manufacturer",
    cogNote: "General arrangement drawing GA-2210 rev C",
    ...rectangleOutlines(1.3, 0.72, 0.86),
    liftPoints: lift(
      [
        ["A", -0.45, 0, 0.86, "M20"],
        ["B", 0.55, 0, 0.86, "M20"],
      ],
      32,
    ),
    parts: [],
  },
  {
    name: "B1 gearbox top cover",
    description: "Split-line top cover of the blower B1 gearbox; lifted off level so it clears the bearing dowels.",
    massKg: cover.massKg,
    massSource: "calculated",
    massNote: "Sum of parts from drawing GB-455 (see parts)",
    contingencyPct: 10,
    lengthM: 1.1,
    widthM: 0.62,
    heightM: 0.18,
    cog: cover.cog,
    cogSource: "calculated",
    cogNote: "Composite of the parts below",
    ...rectangleOutlines(1.1, 0.62, 0.18),
    liftPoints: lift(
      [
        ["A", -0.42, -0.22, 0.18, "M12"],
        ["B", -0.42, 0.22, 0.18, "M12"],
        ["C", 0.45, 0, 0.18, "M12"],
      ],
      20,
    ),
    parts: coverParts,
  },
  {
    name: "B1 blower gearbox",
    description: "Complete speed-increasing gearbox of blower B1, lifted off its baseplate onto the transport skid.",
    massKg: 1950,
    massSource: "weighed",
    massNote: "Crane scale reading at the last overhaul, record WR-0931",
    contingencyPct: 0,
    lengthM: 1.25,
    widthM: 0.95,
    heightM: 0.9,
    cog: { x: -0.06, y: 0.03, z: 0.41 },
    cogSource: "measured",
    cogNote: "From leg loads measured at the last lift",
    ...rectangleOutlines(1.25, 0.95, 0.9),
    liftPoints: lift(
      [
        ["A", -0.5, -0.38, 0.9, "M24"],
        ["B", 0.5, -0.38, 0.9, "M24"],
        ["C", 0.5, 0.38, 0.9, "M24"],
        ["D", -0.5, 0.38, 0.9, "M24"],
      ],
      38,
    ),
    parts: [],
  },
  {
    name: "P4 drive motor, 75 kW",
    description:
      "Foot-mounted induction motor driving pump P4; lifted from a lifting beam to keep the slings off the terminal box.",
    massKg: 520,
    massSource: "certified",
    massNote: "Rating plate",
    contingencyPct: 3,
    lengthM: 0.98,
    widthM: 0.45,
    heightM: 0.5,
    cog: { x: 0.04, y: 0, z: 0.23 },
    cogSource: "estimated",
    cogNote: "Estimated from the frame size; heavier at the drive end",
    ...rectangleOutlines(0.98, 0.45, 0.5),
    liftPoints: lift(
      [
        ["A", -0.22, 0, 0.5, "M16"],
        ["B", 0.3, 0, 0.5, "M16"],
      ],
      24,
    ),
    parts: [],
  },
];

export async function up() {
  const planner = await findUserByEmail("planner@example.com");
  if (!planner) return;
  if (await Component.count({ where: { organisationId: planner.organisationId } })) return;
  for (const definition of DEMO_COMPONENTS) {
    const component = await createComponent(planner.organisationId, definition, planner.id);
    if (definition === DEMO_COMPONENTS[0]) {
      // The C2 element's general arrangement drawing, to trace over in the editor (invented, drawn from the data).
      const sheets = [
        { name: "GA-2210-rev-C-sheet-1-elevation.png", caption: "GA-2210 elevation", bytes: drawElevation(definition) },
        { name: "GA-2210-rev-C-sheet-2-plan.png", caption: "GA-2210 plan", bytes: drawPlan(definition) },
      ];
      for (const sheet of sheets)
        await addComponentFile(
          planner.organisationId,
          component.id,
          { bytes: new Uint8Array(sheet.bytes), kind: "png", contentType: "image/png", originalName: sheet.name },
          { kind: "drawing", caption: sheet.caption },
          planner.id,
        );
    }
  }
}
