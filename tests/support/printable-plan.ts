// Printable plans for the PDF tests and the PDF benchmark, built from a real statics solve of an
// invented scenario (invented organisation, site, people and gear).
import type { ComponentDefinition } from "~/loads/component-definition";
import { type PlanResultsBody } from "~/plans/document";
import { defaultSequence } from "~/plans/defaults";
import type { PrintablePlan, PrintableScheduleRow } from "~/plans/printable";
import { handleSolve, type SolveBody } from "~/statics/api";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";

/** The day the fixture's checks are run on (inspection dates are judged against it). */
export const FIXTURE_TODAY = "2025-05-12";

/**
 * A 2000 kg gearbox lifted on two legs from lift points 200 mm (A) and 800 mm (B) either side of
 * its CoG, level, the hook 800 mm above them: the geometry of the Furley Engineering "Sling Load"
 * worked example (near leg 1649.2 kg, published 1650 kg; far leg 565.7 kg).
 */
export function gearboxDefinition(): ComponentDefinition {
  return {
    name: "Gearbox GX-40 (invented)",
    description: "Two-stage helical gearbox, input shaft to the right.",
    massKg: 2000,
    massSource: "certified",
    massNote: "Nameplate",
    contingencyPct: 3,
    lengthM: 1.45,
    widthM: 0.7,
    heightM: 0.9,
    cog: { x: 0, y: 0, z: 0.42 },
    cogSource: "manufacturer",
    cogNote: "General arrangement drawing",
    outlineElevation: [
      [-0.5, 0],
      [0.7, 0],
      [0.7, 0.08],
      [0.65, 0.08],
      [0.65, 0.72],
      [0.95, 0.72],
      [0.95, 0.5],
      [0.65, 0.5],
      [0.65, 0.9],
      [-0.4, 0.9],
      [-0.5, 0.78],
      [-0.5, 0.08],
      [-0.45, 0.08],
      [-0.45, 0.0],
    ],
    outlinePlan: [
      [-0.5, -0.35],
      [0.65, -0.35],
      [0.65, -0.07],
      [0.95, -0.07],
      [0.95, 0.07],
      [0.65, 0.07],
      [0.65, 0.35],
      [-0.5, 0.35],
    ],
    liftPoints: [
      { label: "A", position: { x: -0.2, y: 0, z: 0.9 }, axis: { x: 0, y: 0, z: 1 }, thread: "M30", engagementMm: 45 },
      { label: "B", position: { x: 0.8, y: 0, z: 0.9 }, axis: { x: 0, y: 0, z: 1 }, thread: "M30", engagementMm: 45 },
    ],
    parts: [],
  };
}

const inService = (itemId: string, examinationDue: string) => ({
  itemId,
  status: "in_service" as const,
  examinationDue,
});

/** The solve body for the gearbox: hook 800 mm above the lift points, chain legs, M30 collar eyebolts, 2 t shackles. */
function gearboxSolveBody(def: ComponentDefinition): SolveBody {
  const legGear = (leg: "A" | "B") => ({
    sling: {
      kind: "chain" as const,
      diameterMm: 10,
      hitch: "straight" as const,
      inspection: inService(`NW-CH10-0${leg === "A" ? 1 : 2}`, "2025-10-30"),
    },
    shackle: {
      wllKg: 2000,
      type: "bow" as const,
      pin: "screw" as const,
      inspection: inService(`NW-SH2-1${leg === "A" ? 1 : 2}`, "2025-09-15"),
    },
    eyebolt: {
      family: "collar" as const,
      thread: "M30",
      inspection: inService(`NW-EB30-0${leg === "A" ? 3 : 4}`, leg === "A" ? "2025-05-30" : "2025-11-02"),
    },
  });
  return {
    load: { massKg: def.massKg, cog: def.cog },
    liftPoints: def.liftPoints.map((p) => ({ id: p.label, ...p.position, thread: p.thread })),
    hook: { z: 0.9 + 0.8 },
    rigging: {
      legs: { A: legGear("A"), B: legGear("B") },
      masterLink: { wllKg: 4250, inspection: inService("NW-ML-07", "2025-08-01") },
      crane: { swlKg: 5000, inspection: inService("NW-OHC-5T", "2025-12-01") },
      contingencyPct: def.contingencyPct,
      riggingMassKg: 35,
    },
  };
}

/** The results of the gearbox lift, exactly as /api/solve returns them. */
export function gearboxResults(def: ComponentDefinition = gearboxDefinition()): PlanResultsBody {
  const solved = handleSolve(gearboxSolveBody(def), REFERENCE_TABLES, { todayIso: FIXTURE_TODAY });
  if (solved.status !== 200) throw new Error(`fixture solve failed: ${JSON.stringify(solved.body)}`);
  return solved.body;
}

function scheduleFrom(results: PlanResultsBody): PrintableScheduleRow[] {
  const check = (id: string) => results.checks?.find((c) => c.id === id);
  const row = (
    position: string,
    itemCode: string,
    description: string,
    wllKg: number,
    checkId: string,
    nextDueOn: string,
  ): PrintableScheduleRow => ({
    position,
    itemCode,
    description,
    wllKg,
    loadKg: check(checkId)?.loadKg ?? null,
    utilisation: check(checkId)?.utilisation ?? null,
    nextDueOn,
  });
  return [
    row("Leg A eyebolt", "NW-EB30-03", "Collar eyebolt M30, DIN 580", 3200, "eyebolt-A", "2025-05-30"),
    row("Leg A shackle", "NW-SH2-11", "Bow shackle 2 t, screw pin", 2000, "shackle-A", "2025-09-15"),
    row("Leg A sling", "NW-CH10-01", "Chain sling leg 10 mm grade 8, 1.2 m", 3150, "sling-leg-A", "2025-10-30"),
    row("Leg B eyebolt", "NW-EB30-04", "Collar eyebolt M30, DIN 580", 3200, "eyebolt-B", "2025-11-02"),
    row("Leg B shackle", "NW-SH2-12", "Bow shackle 2 t, screw pin", 2000, "shackle-B", "2025-09-15"),
    row("Leg B sling", "NW-CH10-02", "Chain sling leg 10 mm grade 8, 1.2 m", 3150, "sling-leg-B", "2025-10-30"),
    row("Master link", "NW-ML-07", "Master link grade 8, 4.25 t", 4250, "master-link", "2025-08-01"),
    row("Crane or hoist", "NW-OHC-5T", "Overhead travelling crane, bay 2, 5 t", 5000, "crane-load", "2025-12-01"),
  ];
}

/** A typical approved plan: the gearbox lift with its schedule, sequence, hazards and people. */
export function printablePlanFixture(overrides: Partial<PrintablePlan> = {}): PrintablePlan {
  const snapshot = gearboxDefinition();
  const results = gearboxResults(snapshot);
  const warned = results.checks?.find((c) => c.status === "warn");
  return {
    organisationName: "Northwold Mechanical Services Ltd",
    title: "Lift the GX-40 gearbox off the test bed onto the transport skid",
    site: {
      name: "Harrowgate Compressor Works",
      customer: "Harrowgate Air Ltd",
      address: "Unit 4, Canal Road, Harrowgate HG9 4QT",
    },
    job: { workOrder: "WO-24117", title: "Gearbox overhaul and return" },
    revision: 3,
    status: "approved",
    units: "metric",
    planner: { name: "Priya Nandakumar" },
    approval: {
      name: "Gareth Olumide",
      role: "Appointed person",
      approvedAt: "2025-05-12T08:40:00.000Z",
      comment: "Approved for bay 2 with the 5 t crane. Keep the skid chocked while landing.",
      selfApproved: false,
    },
    fingerprint: "3f9a1c0e7b2d4458a6e1f0c93b7d2e5a8c4f6b1d9e0a7c3b5f2e8d4a1c6b9e07",
    verifyUrl: "https://plumbline.example/verify/Yk3vQm9TzR2pLw8s",
    printedAt: "2025-05-13T06:55:00.000Z",
    printedBy: "Sam Okafor",
    snapshot,
    arrangement: { kind: "bridle", mode: "level", hookHeightM: 1.7, legLengthsM: {}, liftPointLabels: ["A", "B"] },
    results,
    schedule: scheduleFrom(results),
    details: {
      sequence: defaultSequence(),
      hazards: [
        {
          hazard: "Load swings as it leaves the test bed (CoG off the centre line)",
          control: "Hook plumb over the CoG mark; trial lift a short way and hold; tag line on the input shaft end.",
        },
        {
          hazard: "Fingers trapped at the eyebolts while taking up slack",
          control: "Hands off the rigging once the legs are tensioned; slinger stands clear before the signal to lift.",
        },
        {
          hazard: "Other trades walking under the load in bay 2",
          control: "Barriered exclusion zone with signs; banksman at the bay entrance.",
        },
      ],
      exclusionZone:
        "Barrier 3 m all round the test bed and the skid, and the travel path between them in bay 2. Nobody under the load at any time.",
      communication:
        "Hand signals to BS 7121 from one appointed signaller in sight of the operator; radio channel 3 as back-up.",
      people: [
        { name: "Gareth Olumide", role: "appointed_person" },
        { name: "Dee Marchetti", role: "lift_supervisor" },
        { name: "Tomasz Wren", role: "slinger_signaller" },
        { name: "Alun Pryce", role: "crane_operator" },
      ],
      floorClearanceM: 0.1,
    },
    acknowledgements: warned
      ? [
          {
            checkItem: warned.item,
            reason: "Eyebolt is booked in for examination on 28 May; this lift is on 14 May.",
            by: "Gareth Olumide",
            at: "2025-05-12T08:38:00.000Z",
          },
        ]
      : [],
    ...overrides,
  };
}

/** A plan at the limits of what a plan holds: 40 steps, 30 hazards, 25 schedule rows, long text. */
export function longPrintablePlan(): PrintablePlan {
  const base = printablePlanFixture();
  const note =
    "Check the rigging against the schedule, take the weight slowly and watch the load for any movement; stop if anything is not as planned and tell the lift supervisor before carrying on. ";
  return {
    ...base,
    title: `${base.title}, then on to the paint shop and back again through the south doors once the skid has been cleared by the yard team`,
    schedule: Array.from({ length: 25 }, (_, i) => ({
      position: `Item ${i + 1}`,
      itemCode: `NW-LONG-${String(i + 1).padStart(3, "0")}`,
      description:
        i % 5 === 0
          ? "Webbing sling 2 t, 3 m effective length, with sleeves for the sharp edges of the housing"
          : "Bow shackle 2 t, screw pin",
      wllKg: 2000,
      loadKg: 1000 + i * 37,
      utilisation: (1000 + i * 37) / 2000,
      nextDueOn: "2025-10-01",
    })),
    details: {
      ...base.details,
      sequence: Array.from({ length: 40 }, (_, i) => ({
        title: `Step ${i + 1}: ${i % 7 === 3 ? "trial lift a short way off the floor and hold" : "move the load along the planned path"}`,
        holdPoint: i % 7 === 3,
        notes: i % 4 === 0 ? note.repeat(3) : note,
      })),
      hazards: Array.from({ length: 30 }, (_, i) => ({
        hazard: `Hazard ${i + 1}: ${i % 3 === 0 ? "load strikes the building steel or the door frame on the way through" : "trip on cables"}`,
        control: i % 3 === 0 ? note.repeat(2) : "Cables lifted onto hooks along the wall before the lift.",
      })),
    },
  };
}
