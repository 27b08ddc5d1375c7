// The invented demo company's gear register. Dates are relative to the day of seeding, so the
// demo always shows items in date, due within 30 days, one overdue, one quarantined and one withdrawn.
import { examinationIntervalMonths } from "~/gear/due";
import { DEFAULT_TIME_ZONE, addDays, addMonths, todayIn } from "~/utils/dates";
import { BLANK_GEAR_FIELDS, type ExaminationFields, type GearItemInput } from "~/gear/schema";
import { recordExamination } from "~/models/examination.server";
import { changeGearStatus, createGearItem, GearItem, reportGearDefect } from "~/models/gear-item.server";
import { listSites } from "~/models/site.server";
import { findUserByEmail } from "~/models/user.server";
import { DEMO_USERS } from "./0001-demo-scenario";

const BREWERY = "Fernbrook Brewery, compressor house";
const WATER_WORKS = "Castlemere Treatment Works, blower hall";

const EXAMINERS = ["Ruth Calloway", "Ivan Petrakis"];
const EXAMINING_BODY = "Northfold Inspection Services";

const NONE = BLANK_GEAR_FIELDS;

/**
 * When the item was last examined, as days before its next examination falls due (negative:
 * already overdue), or "never".
 */
type Exam = number | "never";
type DemoItem = {
  item: Omit<GearItemInput, keyof typeof NONE> & Partial<GearItemInput>;
  dueInDays: Exam;
  site?: string;
};

const eyebolt = (code: string, thread: string, wllKg: number, serial: string, dueInDays: Exam): DemoItem => ({
  // DIN 580 collar eyebolts, axial WLL per eyebolt (DIN 580 annex table).
  item: {
    itemCode: code,
    kind: "eyebolt",
    description: `Collar eyebolt ${thread}, DIN 580`,
    wllValue: wllKg,
    wllUnit: "kg",
    thread,
    eyeboltFamily: "collar",
    manufacturer: "Tarnwick Forge",
    serial,
  },
  dueInDays,
});

const DEMO_GEAR: DemoItem[] = [
  eyebolt("KR-EB-12-01", "M12", 340, "TF580-12-4471", 96),
  eyebolt("KR-EB-12-02", "M12", 340, "TF580-12-4472", 96),
  eyebolt("KR-EB-12-03", "M12", 340, "TF580-12-4473", 96),
  eyebolt("KR-EB-12-04", "M12", 340, "TF580-12-4474", 96),
  eyebolt("KR-EB-16-01", "M16", 700, "TF580-16-2210", 131),
  eyebolt("KR-EB-16-02", "M16", 700, "TF580-16-2211", 131),
  eyebolt("KR-EB-20-01", "M20", 1200, "TF580-20-0918", 18),
  eyebolt("KR-EB-20-02", "M20", 1200, "TF580-20-0919", 18),
  eyebolt("KR-EB-24-01", "M24", 1800, "TF580-24-0307", 74),
  eyebolt("KR-EB-24-02", "M24", 1800, "TF580-24-0308", 74),
  eyebolt("KR-EB-24-03", "M24", 1800, "TF580-24-0309", 74),
  eyebolt("KR-EB-24-04", "M24", 1800, "TF580-24-0310", 74),
  {
    item: {
      itemCode: "KR-SH-100",
      kind: "shackle",
      description: "Bow shackle 1 t",
      wllValue: 1,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "screw",
      diameterMm: 9.5,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-B1-55120",
    },
    dueInDays: 140,
  },
  {
    item: {
      itemCode: "KR-SH-200",
      kind: "shackle",
      description: "Bow shackle 2 t",
      wllValue: 2,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "screw",
      diameterMm: 13,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-B2-20931",
    },
    dueInDays: 140,
  },
  {
    item: {
      itemCode: "KR-SH-325-01",
      kind: "shackle",
      description: "Bow shackle 3.25 t",
      wllValue: 3.25,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "screw",
      diameterMm: 16,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-B3-11874",
    },
    dueInDays: 27,
  },
  {
    item: {
      itemCode: "KR-SH-325-02",
      kind: "shackle",
      description: "Bow shackle 3.25 t, safety bolt",
      wllValue: 3.25,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "bolt",
      diameterMm: 16,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-B3-11902",
    },
    dueInDays: 112,
  },
  {
    item: {
      itemCode: "KR-SH-475",
      kind: "shackle",
      description: "Bow shackle 4.75 t, safety bolt",
      wllValue: 4.75,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "bolt",
      diameterMm: 19,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-B4-07716",
    },
    dueInDays: 112,
  },
  {
    item: {
      itemCode: "KR-SH-D200",
      kind: "shackle",
      description: "Dee shackle 2 t",
      wllValue: 2,
      wllUnit: "t",
      shackleType: "dee",
      pinType: "screw",
      diameterMm: 13,
      manufacturer: "Brackley Marine Hardware",
      serial: "BMH-D2-30418",
    },
    dueInDays: -9,
  },
  {
    // EN 818-4 grade 8, 8 mm, 2 legs at beta up to 45 deg: 2.8 t (EN 818-4 table).
    item: {
      itemCode: "KR-CS-08-2L",
      kind: "chain_sling",
      description: "Two-leg chain sling, grade 8, 8 mm",
      wllValue: 2.8,
      wllUnit: "t",
      chainGrade: 8,
      diameterMm: 8,
      legs: 2,
      lengthM: 2,
      manufacturer: "Oxley Chain Co.",
      serial: "OC8-2-8841",
    },
    dueInDays: 63,
  },
  {
    // EN 818-4 grade 8, 10 mm, 2 legs at beta up to 45 deg: 4.25 t.
    item: {
      itemCode: "KR-CS-10-2L",
      kind: "chain_sling",
      description: "Two-leg chain sling, grade 8, 10 mm",
      wllValue: 4.25,
      wllUnit: "t",
      chainGrade: 8,
      diameterMm: 10,
      legs: 2,
      lengthM: 2.5,
      manufacturer: "Oxley Chain Co.",
      serial: "OC8-2-10-3320",
    },
    dueInDays: 63,
  },
  {
    item: {
      itemCode: "KR-CS-08-1L",
      kind: "chain_sling",
      description: "Single-leg chain sling, grade 8, 8 mm",
      wllValue: 2,
      wllUnit: "t",
      chainGrade: 8,
      diameterMm: 8,
      legs: 1,
      lengthM: 1.5,
      manufacturer: "Oxley Chain Co.",
      serial: "OC8-1-8-1207",
    },
    dueInDays: 150,
  },
  {
    item: {
      itemCode: "KR-WR-12-1L",
      kind: "wire_rope_sling",
      description: "Wire rope sling, 12 mm, soft eyes",
      wllValue: 1.5,
      wllUnit: "t",
      diameterMm: 12,
      legs: 1,
      lengthM: 2,
      manufacturer: "Oxley Chain Co.",
      serial: "OWR-12-5519",
    },
    dueInDays: 88,
  },
  {
    // EN 1492-1 colour code: violet 1 t, green 2 t, yellow 3 t.
    item: {
      itemCode: "KR-WS-1T-2M",
      kind: "web_sling",
      description: "Web sling, violet, 1 t x 2 m",
      wllValue: 1,
      wllUnit: "t",
      legs: 1,
      lengthM: 2,
      manufacturer: "Pellow Textiles",
      serial: "PT-WS1-7781",
    },
    dueInDays: 45,
  },
  {
    item: {
      itemCode: "KR-WS-2T-3M",
      kind: "web_sling",
      description: "Web sling, green, 2 t x 3 m",
      wllValue: 2,
      wllUnit: "t",
      legs: 1,
      lengthM: 3,
      manufacturer: "Pellow Textiles",
      serial: "PT-WS2-7802",
    },
    dueInDays: 12,
  },
  {
    item: {
      itemCode: "KR-WS-3T-3M",
      kind: "web_sling",
      description: "Web sling, yellow, 3 t x 3 m",
      wllValue: 3,
      wllUnit: "t",
      legs: 1,
      lengthM: 3,
      manufacturer: "Pellow Textiles",
      serial: "PT-WS3-7815",
    },
    dueInDays: 101,
  },
  {
    item: {
      itemCode: "KR-RS-2T-2M",
      kind: "round_sling",
      description: "Round sling, green, 2 t x 2 m",
      wllValue: 2,
      wllUnit: "t",
      legs: 1,
      lengthM: 2,
      manufacturer: "Pellow Textiles",
      serial: "PT-RS2-1190",
    },
    dueInDays: 101,
  },
  {
    item: {
      itemCode: "KR-RS-2T-2M-B",
      kind: "round_sling",
      description: "Round sling, green, 2 t x 2 m",
      wllValue: 2,
      wllUnit: "t",
      legs: 1,
      lengthM: 2,
      manufacturer: "Pellow Textiles",
      serial: "PT-RS2-1191",
    },
    dueInDays: 101,
  },
  {
    item: {
      itemCode: "KR-RS-2T-2M-C",
      kind: "round_sling",
      description: "Round sling, green, 2 t x 2 m",
      wllValue: 2,
      wllUnit: "t",
      legs: 1,
      lengthM: 2,
      manufacturer: "Pellow Textiles",
      serial: "PT-RS2-1192",
    },
    dueInDays: 101,
  },
  {
    item: {
      itemCode: "KR-RS-3T-4M",
      kind: "round_sling",
      description: "Round sling, yellow, 3 t x 4 m (new, awaiting examination)",
      wllValue: 3,
      wllUnit: "t",
      legs: 1,
      lengthM: 4,
      manufacturer: "Pellow Textiles",
      serial: "PT-RS3-1244",
    },
    dueInDays: "never",
  },
  {
    item: {
      itemCode: "KR-ML-32",
      kind: "master_link",
      description: "Master link for two-leg chain slings",
      wllValue: 3.2,
      wllUnit: "t",
      diameterMm: 19,
      manufacturer: "Oxley Chain Co.",
      serial: "OML-32-0442",
    },
    dueInDays: 63,
  },
  {
    item: {
      itemCode: "KR-CB-200",
      kind: "chain_block",
      description: "Chain block 2 t, 3 m lift",
      wllValue: 2,
      wllUnit: "t",
      chainGrade: 8,
      diameterMm: 7,
      lengthM: 3,
      manufacturer: "Hallam Hoist Works",
      serial: "HHW-CB2-60218",
    },
    dueInDays: 22,
  },
  {
    item: {
      itemCode: "KR-LH-160",
      kind: "lever_hoist",
      description: "Lever hoist 1.6 t, 1.5 m lift",
      wllValue: 1.6,
      wllUnit: "t",
      chainGrade: 8,
      diameterMm: 7,
      lengthM: 1.5,
      manufacturer: "Hallam Hoist Works",
      serial: "HHW-LH16-11093",
    },
    dueInDays: 240,
  },
  {
    item: {
      itemCode: "KR-BM-300",
      kind: "beam",
      description: "Spreader beam 3 t, 2 m span",
      wllValue: 3,
      wllUnit: "t",
      lengthM: 2,
      beamMassKg: 85,
      manufacturer: "Kestrel workshop",
      serial: "KRW-SB-003",
    },
    dueInDays: 120,
  },
  {
    item: {
      itemCode: "FB-OHC-1",
      kind: "crane",
      description: "Overhead travelling crane 5 t, compressor house",
      wllValue: 5,
      wllUnit: "t",
      hookHeightM: 5.2,
      manufacturer: "Denholm Cranes",
      serial: "DC-5T-1998-204",
    },
    dueInDays: 200,
    site: BREWERY,
  },
  {
    item: {
      itemCode: "CW-GAN-B1",
      kind: "crane",
      description: "Portal gantry 2 t over blower B1",
      wllValue: 2,
      wllUnit: "t",
      hookHeightM: 3.6,
      manufacturer: "Denholm Cranes",
      serial: "DC-G2-2011-077",
    },
    dueInDays: 160,
    site: WATER_WORKS,
  },
];

/** Each item's own mass, kg (invented, plausible for the size): the crane check adds them to the load. */
const MASSES_KG: Record<string, number> = {
  "KR-EB-12-01": 0.18,
  "KR-EB-12-02": 0.18,
  "KR-EB-16-01": 0.32,
  "KR-EB-16-02": 0.32,
  "KR-EB-20-01": 0.62,
  "KR-EB-20-02": 0.62,
  "KR-EB-24-01": 1.05,
  "KR-EB-24-02": 1.05,
  "KR-SH-100": 0.14,
  "KR-SH-200": 0.36,
  "KR-SH-325-01": 0.76,
  "KR-SH-325-02": 0.76,
  "KR-SH-475": 1.25,
  "KR-SH-D200": 0.31,
  "KR-CS-08-2L": 7.4,
  "KR-CS-10-2L": 11.6,
  "KR-CS-08-1L": 3.6,
  "KR-WR-12-1L": 2.1,
  "KR-WS-1T-2M": 0.4,
  "KR-WS-2T-3M": 0.9,
  "KR-WS-3T-3M": 1.3,
  "KR-RS-2T-2M": 0.6,
  "KR-RS-3T-4M": 1.5,
  "KR-ML-32": 2.7,
  "KR-CB-200": 14.5,
  "KR-LH-160": 7.8,
  "KR-BM-300": 85,
};

export async function up() {
  const admin = await findUserByEmail(DEMO_USERS[0]!.email);
  const rigger = await findUserByEmail(DEMO_USERS.find((u) => u.roles.includes("rigger"))!.email);
  if (!admin || !rigger) throw new Error("Seed the demo scenario (0001) first.");
  const orgId = admin.organisationId;
  if (await GearItem.count({ where: { organisationId: orgId } })) return;
  const sites = await listSites(orgId);
  const siteId = (name: string) => {
    const site = sites.find((s) => s.name === name);
    if (!site) throw new Error(`The demo site "${name}" is missing.`);
    return site.id;
  };
  const today = todayIn(DEFAULT_TIME_ZONE);
  let n = 0;
  for (const demo of DEMO_GEAR) {
    const input: GearItemInput = {
      ...NONE,
      ...demo.item,
      massKg: MASSES_KG[demo.item.itemCode] ?? null,
      homeSiteId: demo.site ? siteId(demo.site) : null,
    };
    const item = await createGearItem(orgId, input, admin.id);
    if (demo.dueInDays === "never") continue;
    const nextDueOn = addDays(today, demo.dueInDays);
    const examinedOn = addMonths(nextDueOn, -examinationIntervalMonths(item.kind));
    const earlier = addMonths(examinedOn, -examinationIntervalMonths(item.kind));
    const examiner = EXAMINERS[n++ % EXAMINERS.length]!;
    // Two examinations each, so the history reads as a register kept over time.
    await recordExamination(
      orgId,
      item.id,
      examination(earlier, examiner, examinedOn, n === 1 ? "initial" : "periodic", `NIS-${1000 + 2 * n}`),
      null,
      admin.id,
    );
    await recordExamination(
      orgId,
      item.id,
      examination(examinedOn, examiner, nextDueOn, "periodic", `NIS-${1001 + 2 * n}`),
      null,
      admin.id,
    );
  }

  const yellowWeb = await GearItem.findOne({ where: { organisationId: orgId, itemCode: "KR-WS-3T-3M" } });
  await reportGearDefect(
    orgId,
    yellowWeb!.id,
    "Cut about 15 mm long on one edge near the eye, stitching frayed; found at the pre-use check.",
    {
      id: rigger.id,
      name: rigger.name,
    },
  );
  const oldEyebolt = await GearItem.findOne({ where: { organisationId: orgId, itemCode: "KR-EB-12-02" } });
  await changeGearStatus(
    orgId,
    oldEyebolt!.id,
    { status: "withdrawn", reason: "Thread worn and collar face dented; cut in half and scrapped." },
    admin.id,
  );
}

/** A passed examination as the demo's invented examining body writes it up. */
function examination(
  examinedOn: string,
  examiner: string,
  nextDueOn: string,
  kind: ExaminationFields["kind"],
  reportNumber: string,
): ExaminationFields {
  return {
    kind,
    examinedOn,
    reportNumber,
    examiner,
    examinerOrganisation: EXAMINING_BODY,
    result: "pass",
    defects: "",
    defectUrgency: "none",
    defectsDueBy: null,
    schemeReference: "",
    nextDueOn,
  };
}
