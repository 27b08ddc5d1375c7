// The invented demo company's gear register. Dates are relative to the day of seeding, so the
// demo always shows items in date, due within 30 days, one overdue, one quarantined and one withdrawn.
import { examinationIntervalMonths } from "~/gear/due";
import { DEFAULT_TIME_ZONE, addDays, addMonths, todayIn } from "~/utils/dates";
import { type ExaminationFields, type GearItemInput } from "~/gear/schema";
import { recordExamination } from "~/gear/examinations.server";
import { changeGearStatus, reportGearDefect } from "~/gear/lifecycle.server";
import { createGearItem, GearItem } from "~/models/gear-item.server";
import { listSites } from "~/models/site.server";
import { findUserByEmail } from "~/models/user.server";
import { DEMO_USERS } from "./0001-demo-scenario";

import { DEMO_GEAR, EXAMINERS, EXAMINING_BODY, MASSES_KG, NONE } from "./demo-gear-items";

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
    const dates = demoExaminationDates(addDays(today, demo.dueInDays), examinationIntervalMonths(item.kind));
    const examiner = EXAMINERS[n++ % EXAMINERS.length]!;
    // Two examinations each, so the history reads as a register kept over time.
    const records = [
      examination(dates.earlier, examiner, dates.earlierDue, n === 1 ? "initial" : "periodic", `NIS-${1000 + 2 * n}`),
      examination(dates.examinedOn, examiner, dates.nextDueOn, "periodic", `NIS-${1001 + 2 * n}`),
    ];
    for (const record of records) {
      const result = await recordExamination(orgId, item.id, record, null, admin.id);
      if (!result?.ok)
        throw new Error(
          `demo gear: examination of ${demo.item.itemCode} refused: ${result?.message ?? "no such item"}`,
        );
    }
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

/**
 * The two examinations of a demo item that falls due about on `target` (YYYY-MM-DD), at `months` intervals.
 * Each next-due date is its examination plus the interval, never later, so the register's rule accepts it on
 * any day of seeding: counting back from a month's end and forward again can land a day or three early
 * (31 Dec less six months is 30 Jun, and 30 Jun plus six months is 30 Dec), never late.
 */
export function demoExaminationDates(target: string, months: number) {
  const examinedOn = addMonths(target, -months);
  const earlier = addMonths(examinedOn, -months);
  return {
    earlier,
    earlierDue: addMonths(earlier, months),
    examinedOn,
    nextDueOn: addMonths(examinedOn, months),
  };
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
