// Draft lift plans for the invented scenario's jobs, with gear from the demo register where it has
// a fitting item (nothing is allocated when the register is empty).
import { Op } from "sequelize";
import { Component } from "~/models/component.server";
import { GearItem } from "~/models/gear-item.server";
import { Job } from "~/models/job.server";
import { getPlan, Plan } from "~/models/plan.server";
import { createPlanFromComponent, savePlanRevision } from "~/plans/revisions.server";
import { findUserByEmail } from "~/models/user.server";
import type { GearKind } from "~/gear/kinds";
import { type PlanDetails, type RiggingAllocation } from "~/plans/document";
import { defaultDetails } from "~/plans/defaults";

type DemoPlan = {
  workOrder: string;
  componentName: string;
  title: string;
  sling: { kinds: GearKind[]; multiLeg?: boolean };
  masterLink: boolean;
  hazards: PlanDetails["hazards"];
  exclusionZone: string;
};

const PEOPLE: PlanDetails["people"] = [
  { name: "Priya Okonedo", role: "appointed_person" },
  { name: "Tomasz Wren", role: "lift_supervisor" },
  { name: "Dale Hutton", role: "slinger_signaller" },
  { name: "Ewan Castell", role: "crane_operator" },
];

const DEMO_PLANS: DemoPlan[] = [
  {
    workOrder: "KR-24117",
    componentName: "C2 compression element (screw air-end)",
    title: "Lift the C2 element out of the package frame",
    sling: { kinds: ["chain_sling"], multiLeg: true },
    masterLink: true,
    hazards: [
      {
        hazard: "Element swings into the package frame as it clears the dowels",
        control:
          "Lift straight up under the crane with tag lines; plumb the hook over the CoG before taking the weight.",
      },
      {
        hazard: "Oil and coolant spill from opened connections",
        control: "Drain and cap the lines first; drip tray under the lift path.",
      },
    ],
    exclusionZone: "Barrier 2 m around the compressor package and under the travel path to the laydown area.",
  },
  {
    workOrder: "KR-24121",
    componentName: "B1 gearbox top cover",
    title: "Lift the B1 gearbox top cover off level",
    sling: { kinds: ["web_sling", "round_sling"] },
    masterLink: false,
    hazards: [
      {
        hazard: "Cover binds on the bearing dowels and snatches free",
        control: "Jack the cover off evenly first; lift slowly and stop at the first sign of binding.",
      },
      {
        hazard: "Open floor hatch beside the blower",
        control: "Keep the hatch barriered and closed for the whole lift (site rule).",
      },
    ],
    exclusionZone: "Blower B1 plinth and 1.5 m around it; hatch closed and barriered.",
  },
  {
    workOrder: "KR-24121",
    componentName: "B1 blower gearbox",
    title: "Lift the B1 gearbox off its baseplate onto the skid",
    sling: { kinds: ["web_sling", "round_sling"] },
    masterLink: false,
    hazards: [
      {
        hazard: "Four-leg sling: one diagonal may carry the whole load",
        control: "Each leg rated as if two legs carry (see the checks); equalise leg lengths at the trial lift.",
      },
      {
        hazard: "Gearbox lands off the skid's locating blocks",
        control: "Second person guides with a push stick; land and check before releasing the rigging.",
      },
    ],
    exclusionZone: "Blower hall bay 2 between the gantry legs; nobody under the gantry beam.",
  },
  {
    workOrder: "KR-24130",
    componentName: "P4 drive motor, 75 kW",
    title: "Lift the P4 drive motor on the lifting beam",
    sling: { kinds: ["web_sling", "round_sling"] },
    masterLink: false,
    hazards: [
      {
        hazard: "Slings crush the terminal box",
        control: "Use the beam so the drops hang vertically clear of the terminal box.",
      },
      {
        hazard: "Motor topples on vertical drops if its CoG is above the eyebolts",
        control: "Eyebolts on the motor's top face are above the CoG; check level at the trial lift.",
      },
    ],
    exclusionZone: "Pump P4 bay, 2 m around the motor and along the path to the workshop trolley.",
  },
];

async function findItems(organisationId: number, kinds: GearKind[], extra: Record<string, unknown> = {}) {
  return GearItem.findAll({
    // The demo allocates only items in service with an examination on record.
    where: { organisationId, kind: { [Op.in]: kinds }, status: "in_service", nextDueOn: { [Op.ne]: null }, ...extra },
    order: [
      ["wllKg", "ASC"],
      ["itemCode", "ASC"],
    ],
  });
}

export async function up() {
  const planner = await findUserByEmail("planner@example.com");
  if (!planner) return;
  const organisationId = planner.organisationId;
  if (await Plan.count({ where: { organisationId } })) return;
  let used = new Set<number>();
  const take = (items: GearItem[], fits: (i: GearItem) => boolean = () => true) => {
    const item = items.find((i) => !used.has(i.id) && fits(i));
    if (item) used.add(item.id);
    return item;
  };
  for (const demo of DEMO_PLANS) {
    const job = await Job.findOne({ where: { organisationId, workOrder: demo.workOrder } });
    const component = await Component.findOne({ where: { organisationId, name: demo.componentName } });
    if (!job || !component) continue;
    // Each plan is its own lift, so the same item may appear in several plans but only once in one.
    used = new Set<number>();
    const created = await createPlanFromComponent(organisationId, job.id, component.id, demo.title, planner.id);
    if (!created.ok) throw new Error(`Demo plan ${demo.title}: ${created.message}`);
    const found = (await getPlan(organisationId, created.plan.id))!;
    const snapshot = found.revision.snapshot;
    let arrangement = found.revision.arrangement;
    const beamItem =
      demo.workOrder === "KR-24130"
        ? take(await findItems(organisationId, ["beam"]), (b) => b.itemCode === "KR-LB-100")
        : undefined;
    if (demo.workOrder === "KR-24130") {
      // The beam's length, lugs, mass and WLL come from the register item allocated below.
      const beam = { dropLengthM: 0.6 };
      const top = Math.max(...snapshot.liftPoints.map((p) => p.position.z)) + beam.dropLengthM;
      arrangement = { ...arrangement, kind: "beam", mode: "level", hookHeightM: Number((top + 0.8).toFixed(3)), beam };
    }
    // Gear from the register: eyebolts by thread, a shackle and a sling per leg, the crane at the job's site.
    const eyebolts = await findItems(organisationId, ["eyebolt"]);
    const shackles = await findItems(organisationId, ["shackle"], { shackleType: "bow" });
    const slings = await findItems(organisationId, demo.sling.kinds);
    const rigging: RiggingAllocation = { legs: {}, ...(beamItem ? { beamItemId: beamItem.id } : {}) };
    // Size each leg's shackle and sling for its design tension with contingency from the first solve (a beam drop for the whole load).
    const factor = 1 + snapshot.contingencyPct / 100;
    const first = found.revision.results;
    const needKg = (label: string) => {
      if (arrangement.kind === "beam" || first.status !== 200) return snapshot.massKg * factor;
      return (first.body.rating.legs.find((l) => l.liftPointId === label)?.designTensionKg ?? snapshot.massKg) * factor;
    };
    const multi = demo.sling.multiLeg
      ? take(slings, (s) => (s.legs ?? 1) >= arrangement.liftPointLabels.length)
      : undefined;
    for (const label of arrangement.liftPointLabels) {
      const thread = snapshot.liftPoints.find((p) => p.label === label)?.thread ?? "";
      const eyebolt = take(eyebolts, (e) => (e.thread ?? "").toUpperCase() === thread.toUpperCase());
      const shackle = take(shackles, (i) => i.wllKg >= needKg(label));
      const sling = multi ?? take(slings, (i) => (i.legs ?? 1) === 1 && i.wllKg >= needKg(label));
      rigging.legs[label] = {
        hitch: "straight",
        ...(eyebolt ? { eyeboltItemId: eyebolt.id } : {}),
        ...(shackle ? { shackleItemId: shackle.id } : {}),
        ...(sling ? { slingItemId: sling.id } : {}),
      };
    }
    if (demo.masterLink) {
      const link = take(await findItems(organisationId, ["master_link"]));
      if (link) rigging.masterLinkItemId = link.id;
    } else {
      // The load path still needs its top: here the crane hook takes the beam's top rigging directly.
      rigging.hookTakesLegs = true;
    }
    const cranes = await findItems(organisationId, ["crane"]);
    const crane = cranes.find((c) => c.homeSiteId === job.siteId) ?? cranes[0];
    if (crane) rigging.craneItemId = crane.id;
    const details: PlanDetails = {
      ...defaultDetails(),
      hazards: demo.hazards,
      exclusionZone: demo.exclusionZone,
      communication:
        "Hand signals to BS 7121 from the slinger/signaller in sight of the operator; radio on the site channel as back-up.",
      people: PEOPLE,
      floorClearanceM: 0.15,
    };
    const saved = await savePlanRevision(
      organisationId,
      created.plan.id,
      1,
      { title: demo.title, arrangement, rigging, details },
      planner.id,
    );
    if (saved.status !== "saved") throw new Error(`Demo plan ${demo.title} did not save: ${JSON.stringify(saved)}`);
  }
}
