// The gear's life as an inspector keeps it: in service -> quarantined (defect or failed examination) -> back in
// service only through a passed thorough examination; withdrawn is final. Examination records carry what the
// examiner's report carries, and the next due date stays within the statutory interval unless a written scheme
// is named (LOLER 1998 reg 9(3)(a) and Schedule 1; ASME B30.9 / B30.26 periodic inspection).
import { describe, expect, it } from "vitest";
import * as itemPage from "~/routes/gear.$itemId";
import { defaultNextDue, examinationIntervalMonths, intervalsOf } from "~/gear/due";
import { ruleSetRow } from "~/statics/rule-sets";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { Examination } from "~/models/examination.server";
import { GearItem } from "~/models/gear-item.server";
import { addDays, addMonths, DEFAULT_TIME_ZONE, todayIn } from "~/utils/dates";
import { callRoute, postForm } from "../support/factories";
import { adminWithSite, makeGearItem } from "../support/gear";

const examine = (fields: Record<string, string>) => ({
  intent: "examination",
  kind: "periodic",
  examiner: "Ruth Calloway",
  examinerOrganisation: "Test Inspection Ltd",
  result: "pass",
  ...fields,
});

async function post(itemId: number, request: Request) {
  return callRoute(itemPage.action, request, { itemId: String(itemId) });
}

function errorsOf(res: { data: unknown }) {
  return (res.data as { errors: Record<string, string[]> }).errors;
}

describe("statutory intervals", () => {
  it("LOLER 1998 reg 9(3)(a): 6 months for an accessory, 12 for lifting equipment; ASME B30: at least yearly", () => {
    const uk = intervalsOf(ruleSetRow(REFERENCE_TABLES, "uk-eu"));
    const us = intervalsOf(ruleSetRow(REFERENCE_TABLES, "us"));
    expect(examinationIntervalMonths("shackle", uk)).toBe(6);
    expect(examinationIntervalMonths("chain_sling", uk)).toBe(6);
    expect(examinationIntervalMonths("crane", uk)).toBe(12);
    expect(examinationIntervalMonths("shackle", us)).toBe(12);
    expect(defaultNextDue("shackle", "2026-08-31", uk)).toBe("2027-02-28");
  });

  it("refuses a next due date past the interval, and accepts it only with a written scheme named", async () => {
    const { admin } = await adminWithSite();
    const shackle = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    const fiveYears = addMonths(today, 60);
    const refused = await post(
      shackle.id,
      await postForm(`/gear/${shackle.id}`, examine({ examinedOn: today, nextDueOn: fiveYears }), admin),
    );
    expect(refused.status).toBe(400);
    expect(errorsOf(refused).nextDueOn![0]).toContain("at least every 6 months");
    expect(errorsOf(refused).nextDueOn![0]).toContain(addMonths(today, 6));
    expect(await Examination.count({ where: { gearItemId: shackle.id } })).toBe(0);

    const onTheLimit = await post(
      shackle.id,
      await postForm(`/gear/${shackle.id}`, examine({ examinedOn: today, nextDueOn: addMonths(today, 6) }), admin),
    );
    expect(onTheLimit.status).toBe(302);

    const schemeUnnamed = await post(
      shackle.id,
      await postForm(
        `/gear/${shackle.id}`,
        examine({ kind: "scheme", examinedOn: today, nextDueOn: fiveYears }),
        admin,
      ),
    );
    expect(schemeUnnamed.status).toBe(400);
    expect(errorsOf(schemeUnnamed).schemeReference![0]).toMatch(/Name the written examination scheme/);

    const withScheme = await post(
      shackle.id,
      await postForm(
        `/gear/${shackle.id}`,
        examine({
          kind: "scheme",
          examinedOn: today,
          nextDueOn: addMonths(today, 9),
          schemeReference: "Scheme TIL-ES-4, rev 2",
        }),
        admin,
      ),
    );
    expect(withScheme.status).toBe(302);
    const latest = await Examination.findOne({ where: { gearItemId: shackle.id }, order: [["id", "DESC"]] });
    expect(latest).toMatchObject({ kind: "scheme", schemeReference: "Scheme TIL-ES-4, rev 2" });
  });
});

describe("examination records as the examiner writes them", () => {
  it("keeps the kind, report number, examiner's organisation and the defects' urgency", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    const res = await post(
      item.id,
      await postForm(
        `/gear/${item.id}`,
        examine({
          kind: "exceptional",
          examinedOn: today,
          reportNumber: "TIL-2291",
          defects: "Pin thread lightly corroded",
          defectUrgency: "by_date",
          defectsDueBy: addDays(today, 14),
        }),
        admin,
      ),
    );
    expect(res.status).toBe(302);
    const exam = await Examination.findOne({ where: { gearItemId: item.id } });
    expect(exam).toMatchObject({
      kind: "exceptional",
      reportNumber: "TIL-2291",
      examinerOrganisation: "Test Inspection Ltd",
      defectUrgency: "by_date",
      defectsDueBy: addDays(today, 14),
    });
  });

  it("refuses a pass that records a defect of immediate danger, and writes nothing", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const res = await post(
      item.id,
      await postForm(
        `/gear/${item.id}`,
        examine({
          examinedOn: todayIn(DEFAULT_TIME_ZONE),
          defects: "Bow opened 8 %",
          defectUrgency: "immediate",
        }),
        admin,
      ),
    );
    expect(res.status).toBe(400);
    expect(errorsOf(res).result![0]).toMatch(/immediate danger means the item fails/);
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(0);
    await item.reload();
    expect(item.status).toBe("in_service");
  });
});

describe("the item's life", () => {
  it("a defect report quarantines; only a passed examination after it returns the item to service", async () => {
    const { admin, rigger } = await adminWithSite();
    const item = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    await post(item.id, await postForm(`/gear/${item.id}`, { intent: "defect", defect: "Pin bent" }, rigger));
    await item.reload();
    expect(item.status).toBe("quarantined");

    // An examination dated before the quarantine was written before the defect: it cannot clear it.
    await post(item.id, await postForm(`/gear/${item.id}`, examine({ examinedOn: addDays(today, -10) }), admin));
    await item.reload();
    expect(item.status).toBe("quarantined");

    await post(item.id, await postForm(`/gear/${item.id}`, examine({ examinedOn: today }), admin));
    await item.reload();
    expect(item.status).toBe("in_service");
    expect(item.statusReason).toContain("Pin bent");
  });

  it("withdrawn is final: no status change or examination brings the item back", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const withdraw = await post(
      item.id,
      await postForm(`/gear/${item.id}`, { intent: "status", status: "withdrawn", reason: "Scrapped" }, admin),
    );
    expect(withdraw.status).toBe(302);
    for (const status of ["in_service", "quarantined"]) {
      const res = await post(
        item.id,
        await postForm(`/gear/${item.id}`, { intent: "status", status, reason: "Found it again" }, admin),
      );
      expect(res.status).toBe(400);
      expect(errorsOf(res).status![0]).toMatch(/Withdrawn is final/);
    }
    await post(item.id, await postForm(`/gear/${item.id}`, examine({ examinedOn: todayIn(DEFAULT_TIME_ZONE) }), admin));
    await item.reload();
    expect(item.status).toBe("withdrawn");
    expect(await GearItem.count({ where: { id: item.id } })).toBe(1);
  });
});
