// Grows a demo database to the size the load benchmark runs against: `extra` plans copied from the
// demo plans' current revisions (drafts, returned, in review, approved) and `gear` register items
// with one examination each. Rows are checked with the gear form's own schema and written in bulk.
// Run: DATABASE_PATH=... PLUMBLINE_ENV=demo tsx tests/bench/load-seed.ts 10000 5000 (after db/cli.ts setup)
import { randomBytes } from "node:crypto";
import { sequelize } from "~/utils/db.server";
import { examinationIntervalMonths } from "~/gear/due";
import { DEFAULT_TIME_ZONE, addDays, addMonths, todayIn } from "~/utils/dates";
import { gearItemSchema } from "~/gear/schema";
import type { GearKind } from "~/gear/kinds";
import { Examination } from "~/models/examination.server";
import { GearItem } from "~/models/gear-item.server";
import { Plan, PlanRevision } from "~/models/plan.server";
import { findUserByEmail } from "~/models/user.server";
import { massToKg } from "~/statics/units";

const CHUNK = 500;

type Spec = Record<string, string>;
const GEAR_SHAPES: Array<{
  kind: GearKind;
  wll: () => [string, string];
  spec: (i: number) => Spec;
  describe: (i: number) => string;
}> = [
  {
    kind: "eyebolt",
    wll: () => ["700", "kg"],
    spec: (i) => ({ thread: ["M12", "M16", "M20", "M24"][i % 4]!, eyeboltFamily: "collar" }),
    describe: () => "Collar eyebolt, DIN 580",
  },
  {
    kind: "shackle",
    wll: () => ["3.25", "t"],
    spec: (i) => ({ shackleType: i % 3 ? "bow" : "dee", pinType: i % 2 ? "screw" : "bolt", diameterMm: "16" }),
    describe: () => "Bow shackle 3.25 t",
  },
  {
    kind: "chain_sling",
    wll: () => ["2.8", "t"],
    spec: (i) => ({ chainGrade: "8", diameterMm: "8", legs: String(1 + (i % 4)), lengthM: "2" }),
    describe: () => "Chain sling, grade 8, 8 mm",
  },
  {
    kind: "web_sling",
    wll: () => ["2000", "kg"],
    spec: (i) => ({ legs: "1", lengthM: String(1 + (i % 6)) }),
    describe: () => "Web sling, green, 2 t",
  },
  {
    kind: "round_sling",
    wll: () => ["3000", "kg"],
    spec: (i) => ({ legs: "1", lengthM: String(1 + (i % 5)) }),
    describe: () => "Round sling, yellow, 3 t",
  },
  {
    kind: "master_link",
    wll: () => ["6.7", "t"],
    spec: () => ({ diameterMm: "22" }),
    describe: () => "Master link, grade 8",
  },
  {
    kind: "crane",
    wll: () => ["5", "t"],
    spec: () => ({ hookHeightM: "6.5" }),
    describe: () => "Overhead travelling crane 5 t",
  },
];

async function inChunks<T>(rows: T[], write: (chunk: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += CHUNK) await write(rows.slice(i, i + CHUNK));
}

async function seedGear(organisationId: number, adminId: number, count: number) {
  const today = todayIn(DEFAULT_TIME_ZONE);
  const items = Array.from({ length: count }, (_, i) => {
    const shape = GEAR_SHAPES[i % GEAR_SHAPES.length]!;
    const [wllValue, wllUnit] = shape.wll();
    const fields = gearItemSchema.parse({
      itemCode: `LD-${String(i + 1).padStart(5, "0")}`,
      kind: shape.kind,
      description: shape.describe(i),
      manufacturer: "Tarnwick Forge",
      serial: `TF-${100000 + i}`,
      wllValue,
      wllUnit,
      ...shape.spec(i),
    });
    // Examined some time in the last interval, so due dates spread from overdue to a year out.
    const months = examinationIntervalMonths(shape.kind);
    const examinedOn = addDays(today, -((i * 37) % (months * 30 + 20)));
    const nextDueOn = addMonths(examinedOn, months);
    const status = i % 50 === 7 ? "quarantined" : i % 50 === 13 ? "withdrawn" : "in_service";
    return {
      ...fields,
      organisationId,
      homeSiteId: null,
      wllKg: massToKg(fields.wllValue, fields.wllUnit),
      status,
      lastExaminedOn: examinedOn,
      nextDueOn,
    } as const;
  });
  await inChunks(items, (chunk) =>
    sequelize.transaction((transaction) =>
      GearItem.bulkCreate(
        chunk.map((c) => ({ ...c })),
        { transaction },
      ),
    ),
  );
  const created = await GearItem.findAll({
    where: { organisationId },
    attributes: ["id", "itemCode", "lastExaminedOn", "nextDueOn"],
  });
  const exams = created
    .filter((g) => g.itemCode.startsWith("LD-"))
    .map((g) => ({
      organisationId,
      gearItemId: g.id,
      examinedOn: g.lastExaminedOn!,
      examiner: "Ruth Calloway, Northfold Inspection Services",
      result: "pass" as const,
      defects: "",
      nextDueOn: g.nextDueOn!,
      certificateFileId: null,
      recordedBy: adminId,
    }));
  await inChunks(exams, (chunk) =>
    sequelize.transaction((transaction) => Examination.bulkCreate(chunk, { transaction })),
  );
}

async function seedPlans(organisationId: number, count: number) {
  const demo = await Plan.findAll({
    where: { organisationId },
    include: [{ model: PlanRevision, as: "currentRevision" }],
    order: [["id", "ASC"]],
  });
  const byStatus = (status: string) => demo.find((p) => p.currentRevision?.status === status);
  const draft = byStatus("draft") ?? demo[0]!;
  const templates = [
    { plan: draft, status: "draft" },
    { plan: draft, status: "draft" },
    { plan: draft, status: "draft" },
    { plan: draft, status: "returned" },
    { plan: byStatus("in_review") ?? draft, status: "in_review" },
    { plan: byStatus("approved") ?? draft, status: "approved" },
  ];
  const plans = Array.from({ length: count }, (_, i) => {
    const { plan } = templates[i % templates.length]!;
    return {
      organisationId,
      jobId: plan.jobId,
      title: `${plan.title} (load copy ${i + 1})`,
      createdBy: plan.createdBy,
      currentRevisionId: null,
    };
  });
  const firstNew = ((await Plan.max<number, Plan>("id")) ?? 0) + 1;
  await inChunks(plans, (chunk) => sequelize.transaction((transaction) => Plan.bulkCreate(chunk, { transaction })));
  const revisions = plans.map((_, i) => {
    const { plan, status } = templates[i % templates.length]!;
    const { id: _id, createdAt: _c, updatedAt: _u, ...revision } = plan.currentRevision!.get({ plain: true });
    const approved = status === "approved";
    return {
      ...revision,
      planId: firstNew + i,
      revision: 1,
      status,
      version: 1 + (i % 7),
      approvalComment:
        status === "returned" ? "Check the sling angles against the new hook height." : revision.approvalComment,
      fingerprint: approved ? randomBytes(32).toString("hex") : null,
      verifyToken: approved ? randomBytes(32).toString("hex") : null,
      supersededByRevision: null,
    };
  });
  await inChunks(revisions, (chunk) =>
    sequelize.transaction((transaction) => PlanRevision.bulkCreate(chunk as never, { transaction })),
  );
  await sequelize.query(
    "UPDATE plans SET current_revision_id = (SELECT r.id FROM plan_revisions r WHERE r.plan_id = plans.id AND r.revision = 1) WHERE current_revision_id IS NULL",
  );
  return { firstPlanId: firstNew, lastPlanId: firstNew + count - 1 };
}

const [plansArg, gearArg] = process.argv.slice(2);
const planCount = Number(plansArg ?? 10_000);
const gearCount = Number(gearArg ?? 5_000);
const admin = await findUserByEmail("admin@example.com");
if (!admin) throw new Error("Seed the demo scenario first (db/cli.ts setup).");
const started = performance.now();
await seedGear(admin.organisationId, admin.id, gearCount);
const range = await seedPlans(admin.organisationId, planCount);
const totals = {
  plans: await Plan.count({ where: { organisationId: admin.organisationId } }),
  gearItems: await GearItem.count({ where: { organisationId: admin.organisationId } }),
};
await sequelize.close();
// The benchmark reads this line for the plan ids it may ask for and checks the totals.
console.log(JSON.stringify({ ...range, ...totals, seconds: (performance.now() - started) / 1000 }));
