import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as itemPage from "~/routes/gear.$itemId";
import { env } from "~/utils/env.server";
import { DEFAULT_TIME_ZONE, addDays, addMonths, todayIn } from "~/utils/dates";
import { CaughtMail, listCaughtMail } from "~/models/caught-mail.server";
import { Examination } from "~/models/examination.server";
import { GearItem } from "~/models/gear-item.server";
import { StoredFile } from "~/models/stored-file.server";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";
import { adminWithSite, ELF_BYTES, makeGearItem, MZ_BYTES, PDF_BYTES, PNG_BYTES, postMultipart } from "../support/gear";

const examine = (fields: Record<string, string>) => ({
  intent: "examination",
  examiner: "Ruth Calloway",
  result: "pass",
  ...fields,
});

async function post(itemId: number, request: Request) {
  return callRoute(itemPage.action, request, { itemId: String(itemId) });
}

function uploadedNames() {
  return fs.existsSync(env.uploadDir) ? fs.readdirSync(env.uploadDir) : [];
}

describe("recording thorough examinations", () => {
  it("defaults the next due date to 6 months for a lifting accessory (LOLER 1998 reg 9(3)(a))", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const examinedOn = addDays(todayIn(DEFAULT_TIME_ZONE), -3);
    const res = await post(item.id, await postForm(`/gear/${item.id}`, examine({ examinedOn }), admin));
    expect(res.status).toBe(302);
    await item.reload();
    expect(item).toMatchObject({
      lastExaminedOn: examinedOn,
      nextDueOn: addMonths(examinedOn, 6),
      status: "in_service",
    });
  });

  it("defaults to 12 months for lifting equipment that is not an accessory, such as a crane (LOLER 1998 reg 9(3)(a))", async () => {
    const { admin } = await adminWithSite();
    const crane = await makeGearItem(admin, {
      kind: "crane",
      shackleType: null,
      pinType: null,
      hookHeightM: 5.2,
      wllValue: 5,
    });
    const examinedOn = todayIn(DEFAULT_TIME_ZONE);
    await post(crane.id, await postForm(`/gear/${crane.id}`, examine({ examinedOn }), admin));
    await crane.reload();
    expect(crane.nextDueOn).toBe(addMonths(examinedOn, 12));
  });

  it("keeps a next due date set by an examination scheme, and the item follows its latest examination", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    await post(
      item.id,
      await postForm(`/gear/${item.id}`, examine({ examinedOn: today, nextDueOn: addMonths(today, 3) }), admin),
    );
    // An older report entered late must not move the due date back.
    await post(item.id, await postForm(`/gear/${item.id}`, examine({ examinedOn: addDays(today, -200) }), admin));
    await item.reload();
    expect(item).toMatchObject({ lastExaminedOn: today, nextDueOn: addMonths(today, 3) });
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(2);
  });

  it("refuses an examination without an examiner, dated in the future, failed without defects, or due before it, writing nothing", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    const cases: Array<[Record<string, string>, string]> = [
      [examine({ examinedOn: today, examiner: " " }), "examiner"],
      [examine({ examinedOn: addDays(today, 1) }), "examinedOn"],
      [examine({ examinedOn: "2026-02-30" }), "examinedOn"],
      [examine({ examinedOn: today, result: "fail", defects: "" }), "defects"],
      [examine({ examinedOn: today, result: "maybe" }), "result"],
      [examine({ examinedOn: today, nextDueOn: addDays(today, -1) }), "nextDueOn"],
    ];
    for (const [fields, field] of cases) {
      const res = await post(item.id, await postForm(`/gear/${item.id}`, fields, admin));
      expect(res.status, JSON.stringify(fields)).toBe(400);
      expect((res.data as { intent: string; errors: Record<string, unknown> }).errors[field], field).toBeDefined();
    }
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(0);
  });

  it("a failed examination quarantines the item with the defects as the reason", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const res = await post(
      item.id,
      await postForm(
        `/gear/${item.id}`,
        examine({ examinedOn: todayIn(DEFAULT_TIME_ZONE), result: "fail", defects: "Pin bent, threads galled" }),
        admin,
      ),
    );
    expect(res.status).toBe(302);
    await item.reload();
    expect(item.status).toBe("quarantined");
    expect(item.statusReason).toContain("Pin bent, threads galled");
    expect(item.statusChangedBy).toBe(admin.id);
    const page = await callRoute(itemPage.loader, await getRequest(`/gear/${item.id}`, admin), {
      itemId: String(item.id),
    });
    const history = (page.data as { history: Array<{ action: string; details: Record<string, unknown> }> }).history;
    expect(history.map((h) => h.action)).toEqual(["created", "examination recorded", "status changed"]);
    expect(history[2]!.details).toMatchObject({ from: "in_service", to: "quarantined" });
  });
});

describe("certificates", () => {
  it("stores a PDF certificate under a random name outside public/ and serves it to the organisation only", async () => {
    const { admin, rigger } = await adminWithSite();
    const item = await makeGearItem(admin);
    const res = await post(
      item.id,
      await postMultipart(
        `/gear/${item.id}`,
        examine({ examinedOn: todayIn(DEFAULT_TIME_ZONE) }),
        { certificate: { bytes: PDF_BYTES, name: "Report 118.pdf", type: "application/pdf" } },
        admin,
      ),
    );
    expect(res.status).toBe(302);
    const exam = await Examination.findOne({ where: { gearItemId: item.id } });
    const file = await StoredFile.findByPk(exam!.certificateFileId!);
    expect(file).toMatchObject({
      organisationId: admin.organisationId,
      purpose: "certificate",
      originalName: "Report 118.pdf",
      contentType: "application/pdf",
      sizeBytes: PDF_BYTES.byteLength,
    });
    expect(file!.storageKey).toMatch(/^[a-f0-9]{32}$/);
    expect(path.resolve(env.uploadDir)).not.toContain(`${path.sep}public`);
    expect(fs.readFileSync(path.join(env.uploadDir, file!.storageKey))).toEqual(Buffer.from(PDF_BYTES));
    const page = await callRoute(itemPage.loader, await getRequest(`/gear/${item.id}`, rigger), {
      itemId: String(item.id),
    });
    expect(page.data).toMatchObject({ examinations: [{ certificate: { id: file!.id, name: "Report 118.pdf" } }] });
  });

  it("refuses a PNG named .pdf, an ELF or MZ program, and stores nothing", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const before = { files: await StoredFile.count(), bytes: uploadedNames().length };
    const cases: Array<[Uint8Array, string, RegExp]> = [
      [PNG_BYTES, "certificate.pdf", /is a PNG image by its content.*needs a PDF/],
      [ELF_BYTES, "certificate.pdf", /Linux program \(ELF\)/],
      [MZ_BYTES, "setup.pdf", /Windows program/],
    ];
    for (const [bytes, name, message] of cases) {
      const res = await post(
        item.id,
        await postMultipart(
          `/gear/${item.id}`,
          examine({ examinedOn: todayIn(DEFAULT_TIME_ZONE) }),
          { certificate: { bytes, name, type: "application/pdf" } },
          admin,
        ),
      );
      expect(res.status, name).toBe(400);
      expect((res.data as { errors: { certificate: string[] } }).errors.certificate.join(" ")).toMatch(message);
    }
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(0);
    expect(await StoredFile.count()).toBe(before.files);
    expect(uploadedNames()).toHaveLength(before.bytes);
  });

  it("refuses a certificate over 10 MB with a clear message, not a server error", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const big = new Uint8Array(10 * 1024 * 1024 + 1);
    big.set(PDF_BYTES);
    const res = await post(
      item.id,
      await postMultipart(
        `/gear/${item.id}`,
        examine({ examinedOn: todayIn(DEFAULT_TIME_ZONE) }),
        { certificate: { bytes: big, name: "huge.pdf" } },
        admin,
      ),
    );
    expect([400, 413]).toContain(res.status);
    expect((res.data as { errors: { certificate: string[] } }).errors.certificate[0]).toMatch(
      /larger than the 10 MB limit/,
    );
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(0);
  });
});

describe("status changes", () => {
  it("an admin quarantines and withdraws an item with a reason; each change is in the history", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const noReason = await post(
      item.id,
      await postForm(`/gear/${item.id}`, { intent: "status", status: "quarantined", reason: "" }, admin),
    );
    expect(noReason.status).toBe(400);
    expect(
      await post(
        item.id,
        await postForm(
          `/gear/${item.id}`,
          { intent: "status", status: "quarantined", reason: "Awaiting repair" },
          admin,
        ),
      ),
    ).toMatchObject({ status: 302 });
    expect(
      await post(
        item.id,
        await postForm(`/gear/${item.id}`, { intent: "status", status: "withdrawn", reason: "Beyond repair" }, admin),
      ),
    ).toMatchObject({ status: 302 });
    const same = await post(
      item.id,
      await postForm(`/gear/${item.id}`, { intent: "status", status: "withdrawn", reason: "Again" }, admin),
    );
    expect(same.status).toBe(400);
    await item.reload();
    expect(item).toMatchObject({ status: "withdrawn", statusReason: "Beyond repair", statusChangedBy: admin.id });
    const page = await callRoute(itemPage.loader, await getRequest(`/gear/${item.id}`, admin), {
      itemId: String(item.id),
    });
    const changes = (
      page.data as { history: Array<{ action: string; who: string; details: Record<string, unknown> }> }
    ).history.filter((h) => h.action === "status changed");
    expect(changes.map((c) => [c.details.from, c.details.to, c.details.reason, c.who])).toEqual([
      ["in_service", "quarantined", "Awaiting repair", admin.name],
      ["quarantined", "withdrawn", "Beyond repair", admin.name],
    ]);
  });

  it("an item whose examination failed goes back into service only through a passing examination, never by a status change", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const today = todayIn(DEFAULT_TIME_ZONE);
    await post(
      item.id,
      await postForm(
        `/gear/${item.id}`,
        examine({ examinedOn: addDays(today, -1), result: "fail", defects: "Crack at the crown" }),
        admin,
      ),
    );
    await item.reload();
    expect(item.status).toBe("quarantined");
    const refused = await post(
      item.id,
      await postForm(`/gear/${item.id}`, { intent: "status", status: "in_service", reason: "Looks fine" }, admin),
    );
    expect(refused.status).toBe(400);
    expect((refused.data as { errors: { status: string[] } }).errors.status[0]).toMatch(
      /only through a passed thorough examination/,
    );
    await item.reload();
    expect(item.status).toBe("quarantined");
    const passed = await post(
      item.id,
      await postForm(`/gear/${item.id}`, examine({ examinedOn: today, reportNumber: "R-77" }), admin),
    );
    expect(passed.status).toBe(302);
    await item.reload();
    expect(item.status).toBe("in_service");
    expect(item.statusReason).toMatch(
      /^Passed thorough examination on \d{4}-\d{2}-\d{2} \(report R-77, Ruth Calloway\)/,
    );
    expect(item.statusReason).toContain("Crack at the crown");
  });
});

describe("defect reports", () => {
  it("a rigger's report quarantines the item, records who and when, and e-mails every admin", async () => {
    const { admin, rigger } = await adminWithSite();
    const secondAdmin = await makeUser(["admin", "planner"], { organisationId: admin.organisationId });
    const item = await makeGearItem(admin, { itemCode: "WS-3T", description: "Web sling, yellow" });
    const res = await post(
      item.id,
      await postForm(`/gear/${item.id}`, { intent: "defect", defect: "Cut on the edge near the eye" }, rigger),
    );
    expect(res.status).toBe(302);
    await item.reload();
    expect(item.status).toBe("quarantined");
    expect(item.statusReason).toBe("Defect reported by Rhys Rigger: Cut on the edge near the eye");
    expect(item.statusChangedBy).toBe(rigger.id);
    expect(Date.now() - item.statusChangedAt!.getTime()).toBeLessThan(60_000);
    const [mail] = await listCaughtMail(admin.organisationId);
    expect(mail?.subject).toBe("Defect reported on WS-3T: quarantined");
    expect(mail?.toAddress).toContain(admin.email);
    expect(mail?.toAddress).toContain(secondAdmin.email);
    expect(mail?.toAddress).not.toContain(rigger.email);
    expect(mail?.textBody).toContain("Cut on the edge near the eye");
    expect(mail?.textBody).toContain(`/gear/${item.id}`);
    expect(mail?.htmlBody).toContain("QUARANTINED");
  });

  it("a report on an item already out of service is recorded and mailed but leaves its status", async () => {
    const { admin, rigger } = await adminWithSite();
    const item = await makeGearItem(admin);
    await item.update({ status: "withdrawn", statusReason: "Scrapped" });
    await post(item.id, await postForm(`/gear/${item.id}`, { intent: "defect", defect: "Still on the rack" }, rigger));
    await item.reload();
    expect(item).toMatchObject({ status: "withdrawn", statusReason: "Scrapped" });
    expect((await listCaughtMail(admin.organisationId))[0]?.subject).toBe(`Defect reported on ${item.itemCode}`);
  });

  it("refuses an empty report and changes nothing", async () => {
    const { admin, rigger } = await adminWithSite();
    const item = await makeGearItem(admin);
    const res = await post(item.id, await postForm(`/gear/${item.id}`, { intent: "defect", defect: " " }, rigger));
    expect(res.status).toBe(400);
    await item.reload();
    expect(item.status).toBe("in_service");
    expect(await CaughtMail.count({ where: { organisationId: admin.organisationId } })).toBe(0);
  });

  it("an unknown intent is a clear 400", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin);
    const res = await post(item.id, await postForm(`/gear/${item.id}`, { intent: "delete" }, admin));
    expect(res.status).toBe(400);
    expect(await GearItem.count({ where: { id: item.id } })).toBe(1);
  });
});
