import { describe, expect, it } from "vitest";
import * as importPage from "~/routes/gear.import";
import * as exportCsv from "~/routes/gear.export.csv";
import { AuditEvent } from "~/models/audit-event.server";
import { GearItem, listAllGearItems } from "~/models/gear-item.server";
import { CSV_HEADERS } from "~/gear/csv-columns";
import { exportRow, toCsv } from "~/gear/csv";
import { dueState } from "~/gear/due";
import { gearRegisterCsv } from "~/gear/export.server";
import { DEFAULT_TIME_ZONE, todayIn } from "~/utils/dates";
import { StoredFile } from "~/models/stored-file.server";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";
import { adminWithSite, ELF_BYTES, makeGearItem, PNG_BYTES, postMultipart } from "../support/gear";

type Preview = {
  fileId: number;
  rowCount: number;
  validCount: number;
  errorCount: number;
  errors: Array<{ line: number; itemCode: string; messages: string[] }>;
  counts: Record<string, number>;
};
type Result = { intent: string; error?: string; preview?: Preview; done?: Record<string, number> };

async function exportText(user: { id: number }) {
  const res = await callRoute(exportCsv.loader, await getRequest("/gear/export.csv", user));
  expect(res.status).toBe(200);
  expect(res.headers.get("Content-Type")).toBe("text/csv; charset=utf-8");
  expect(res.headers.get("Content-Disposition")).toMatch(
    /^attachment; filename="gear-register-\d{4}-\d{2}-\d{2}\.csv"$/,
  );
  return res.data as string;
}

async function previewFile(user: { id: number }, text: string | Uint8Array, name = "register.csv") {
  const res = await callRoute(
    importPage.action,
    await postMultipart("/gear/import", { intent: "preview" }, { file: { bytes: text, name, type: "text/csv" } }, user),
  );
  return { status: res.status, ...(res.data as Result) };
}

async function confirm(user: { id: number }, fileId: number, mode: "all" | "valid" = "all") {
  const res = await callRoute(
    importPage.action,
    await postForm("/gear/import", { intent: "confirm", fileId: String(fileId), mode }, user),
  );
  return { status: res.status, ...(res.data as Result) };
}

async function registerOfThree() {
  const { admin, site } = await adminWithSite("Fernbrook Brewery, compressor house");
  await makeGearItem(admin, {
    itemCode: "KR-EB-16",
    kind: "eyebolt",
    thread: "M16",
    eyeboltFamily: "collar",
    shackleType: null,
    pinType: null,
    wllValue: 700,
    wllUnit: "kg",
    homeSiteId: site.id,
  });
  await makeGearItem(admin, {
    itemCode: "KR-SH-325",
    description: "=cmd|' /C calc'!A0",
    serial: "+44 1632 960",
    manufacturer: "@Brackley",
    wllValue: 3.25,
  });
  await makeGearItem(admin, {
    itemCode: "KR-CS-8",
    kind: "chain_sling",
    shackleType: null,
    pinType: null,
    chainGrade: 8,
    diameterMm: 8,
    legs: 2,
    lengthM: 2,
    wllValue: 2.8,
    description: "-2 leg, grade 8",
  });
  return { admin, site };
}

const snapshot = async (organisationId: number) =>
  (await GearItem.findAll({ where: { organisationId }, order: [["itemCode", "ASC"]] })).map((i) => {
    const { id, createdAt, ...rest } = i.get({ plain: true });
    return { id, createdAt, ...rest };
  });

describe("CSV export", () => {
  it("neutralises formula-looking cells so a spreadsheet shows them as text", async () => {
    const { admin } = await registerOfThree();
    const text = await exportText(admin);
    expect(text.startsWith("item_code,kind,description,")).toBe(true);
    // A byte order mark first, so spreadsheets read the file as UTF-8.
    const raw = (await exportCsv.loader({
      request: await getRequest("/gear/export.csv", admin),
      params: {},
      context: {},
    } as never)) as Response;
    expect([...new Uint8Array(await raw.arrayBuffer()).slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(text).toContain(`,'=cmd|' /C calc'!A0,`);
    expect(text).toContain("'+44 1632 960");
    expect(text).toContain("'@Brackley");
    expect(text).toContain("'-2 leg, grade 8");
    expect(text).not.toMatch(/[,\n]=cmd/);
    expect(text).toContain("Fernbrook Brewery, compressor house");
  });

  it("streams, a batch at a time, exactly the file built from the whole register at once", async () => {
    const { admin, site } = await registerOfThree();
    const today = todayIn(DEFAULT_TIME_ZONE);
    for (let i = 0; i < 23; i++)
      await makeGearItem(admin, {
        itemCode: `ST-${String((i * 7) % 23).padStart(2, "0")}${i % 3 ? "" : "b"}`,
        description: i % 4 ? `Web sling, "green", ${i} m` : "line one\nline two, with a comma",
        manufacturer: i % 5 ? "Tarnwick Forge" : " padded ",
        massKg: i % 2 ? 1.5 + i : null,
        homeSiteId: i % 3 ? site.id : null,
      });
    // The export as it was built before it streamed: every item read at once, one string.
    const items = await listAllGearItems(admin.organisationId);
    const whole = toCsv([
      CSV_HEADERS,
      ...items.map((item) =>
        exportRow({
          ...item.get({ plain: true }),
          homeSiteName: item.homeSite?.name ?? null,
          dueState: dueState(item.nextDueOn, today),
        }),
      ),
    ]);
    // Decoded keeping the byte order mark, which Response.text() would drop.
    const streamed = async (batch: number) =>
      new TextDecoder("utf-8", { ignoreBOM: true }).decode(
        await new Response(gearRegisterCsv(admin.organisationId, today, batch)).arrayBuffer(),
      );
    for (const batch of [1, 4, 26, 1000]) expect(await streamed(batch), `batch of ${batch}`).toBe(whole);
    expect(await exportText(admin)).toBe(whole.slice(1));
  });

  it("exports only the signed-in user's organisation", async () => {
    await registerOfThree();
    const stranger = await makeUser(["planner"]);
    expect((await exportText(stranger)).trim().split("\r\n")).toHaveLength(1);
  });
});

describe("CSV import", () => {
  it("re-importing the exported file changes nothing: every row unchanged, formula cells restored", async () => {
    const { admin } = await registerOfThree();
    const before = await snapshot(admin.organisationId);
    const preview = await previewFile(admin, await exportText(admin));
    expect(preview.status).toBe(200);
    expect(preview.preview).toMatchObject({
      rowCount: 3,
      validCount: 3,
      errorCount: 0,
      counts: { created: 0, updated: 0, unchanged: 3 },
    });
    const done = await confirm(admin, preview.preview!.fileId);
    expect(done.done).toEqual({ created: 0, updated: 0, unchanged: 3, skipped: 0 });
    expect(await snapshot(admin.organisationId)).toEqual(before);
    expect(
      await AuditEvent.count({ where: { organisationId: admin.organisationId, action: "updated by import" } }),
    ).toBe(0);
  });

  it("previews creates and updates without writing, then applies them on confirm; status columns are not read", async () => {
    const { admin } = await registerOfThree();
    const quarantined = await GearItem.findOne({
      where: { organisationId: admin.organisationId, itemCode: "KR-EB-16" },
    });
    await quarantined!.update({ status: "quarantined", statusReason: "Bent" });
    const lines = (await exportText(admin)).split("\r\n");
    const edited = lines
      .map((l) =>
        l.startsWith("KR-EB-16,")
          ? l.replace(",700,kg,", ",1.2,t,").replace(",M16,", ",M20,").replace("quarantined", "in_service")
          : l,
      )
      .join("\r\n");
    const withNew = `${edited.trimEnd()}\r\nKR-NEW-1,web_sling,New violet sling,,,1,t,,,,,,,1,2,,,,\r\n`;
    const before = await GearItem.count();
    const preview = await previewFile(admin, withNew);
    expect(preview.preview).toMatchObject({ counts: { created: 1, updated: 1, unchanged: 2 }, errorCount: 0 });
    expect(await GearItem.count()).toBe(before);
    const done = await confirm(admin, preview.preview!.fileId);
    expect(done.done).toMatchObject({ created: 1, updated: 1, unchanged: 2 });
    await quarantined!.reload();
    expect(quarantined).toMatchObject({
      thread: "M20",
      wllValue: 1.2,
      wllUnit: "t",
      wllKg: 1200,
      status: "quarantined",
    });
    expect(
      await GearItem.findOne({ where: { organisationId: admin.organisationId, itemCode: "KR-NEW-1" } }),
    ).toMatchObject({ kind: "web_sling", lengthM: 2, legs: 1 });
  });

  it("lists every bad row by line and reason; writes nothing unless told to import only the valid rows", async () => {
    const { admin } = await adminWithSite();
    const text = [
      "item_code,kind,wll,wll_unit,shackle_type,pin_type",
      "OK-1,shackle,1,t,bow,screw",
      "BAD-TYPE,shackle,heavy,t,bow,screw",
      "BAD-NEG,shackle,-2,t,bow,screw",
      "BAD-KIND,sky_hook,1,t,,",
      "OK-2,shackle,2,t,dee,bolt",
      "OK-2,shackle,2,t,dee,bolt",
    ].join("\n");
    const preview = await previewFile(admin, text);
    expect(preview.preview).toMatchObject({ rowCount: 6, validCount: 2, errorCount: 4 });
    expect(preview.preview!.errors.map((e) => [e.line, e.itemCode])).toEqual([
      [3, "BAD-TYPE"],
      [4, "BAD-NEG"],
      [5, "BAD-KIND"],
      [7, "OK-2"],
    ]);
    expect(preview.preview!.errors[1]!.messages).toEqual(["wll: The WLL must be more than zero."]);
    expect(preview.preview!.errors[3]!.messages).toEqual(["item_code: OK-2 is already on line 6 of this file."]);
    const refused = await confirm(admin, preview.preview!.fileId, "all");
    expect(refused.status).toBe(400);
    expect(refused.error).toMatch(/4 row\(s\) have problems, so nothing was imported/);
    expect(await GearItem.count({ where: { organisationId: admin.organisationId } })).toBe(0);
    const partial = await confirm(admin, preview.preview!.fileId, "valid");
    expect(partial.done).toEqual({ created: 2, updated: 0, unchanged: 0, skipped: 4 });
    expect(
      (await GearItem.findAll({ where: { organisationId: admin.organisationId }, order: [["itemCode", "ASC"]] })).map(
        (i) => i.itemCode,
      ),
    ).toEqual(["OK-1", "OK-2"]);
  });

  it("refuses a 5 MB file, a binary file and a non-register text file clearly, storing nothing", async () => {
    const { admin } = await adminWithSite();
    const files = await StoredFile.count();
    const big = "item_code,kind,wll,wll_unit\n" + "X,shackle,1,t\n".repeat(Math.ceil((5 * 1024 * 1024) / 14));
    const cases: Array<[string | Uint8Array, string, number, RegExp]> = [
      [big, "big.csv", 413, /larger than the 2 MB an import takes/],
      [ELF_BYTES, "gear.csv", 400, /Linux program \(ELF\) by its content.*needs a CSV text file/],
      [PNG_BYTES, "gear.csv", 400, /PNG image by its content/],
      ["Dear admin, please add my shackles.", "notes.csv", 400, /must name the columns item_code, kind, wll, wll_unit/],
      ["item_code,kind,wll,wll_unit\n", "empty.csv", 400, /no items/],
    ];
    for (const [bytes, name, status, message] of cases) {
      const res = await previewFile(admin, bytes, name);
      expect(res.status, name).toBe(status);
      expect(res.error, name).toMatch(message);
    }
    const missing = await callRoute(
      importPage.action,
      await postMultipart("/gear/import", { intent: "preview" }, {}, admin),
    );
    expect(missing.status).toBe(400);
    expect(await StoredFile.count()).toBe(files);
  });

  it("a staged file of another organisation, or a file that is not a staged import, cannot be confirmed", async () => {
    const { admin } = await registerOfThree();
    const preview = await previewFile(admin, await exportText(admin));
    const stranger = await makeUser(["admin"]);
    const res = await confirm(stranger, preview.preview!.fileId);
    expect(res.status).toBe(404);
    expect(await GearItem.count({ where: { organisationId: stranger.organisationId } })).toBe(0);
    const bad = await callRoute(
      importPage.action,
      await postForm("/gear/import", { intent: "confirm", fileId: "x" }, admin),
    );
    expect(bad.status).toBe(400);
  });

  it("only admins import", async () => {
    const { admin } = await adminWithSite();
    for (const role of ["planner", "approver", "rigger"] as const) {
      const user = await makeUser([role], { organisationId: admin.organisationId });
      expect((await callRoute(importPage.loader, await getRequest("/gear/import", user))).status, role).toBe(403);
      expect((await previewFile(user, "item_code,kind,wll,wll_unit\nA,shackle,1,t\n")).status, role).toBe(403);
    }
  });

  it("imports 5,000 rows in one go and re-imports them unchanged", async () => {
    const { admin } = await adminWithSite();
    const rows = Array.from(
      { length: 5000 },
      (_, i) => `BULK-${String(i).padStart(4, "0")},shackle,Bow shackle ${i},,SN${i},2,t,bow,screw`,
    );
    const text = ["item_code,kind,description,manufacturer,serial,wll,wll_unit,shackle_type,pin_type", ...rows].join(
      "\n",
    );
    const first = await previewFile(admin, text);
    expect(first.preview).toMatchObject({ rowCount: 5000, counts: { created: 5000 } });
    expect((await confirm(admin, first.preview!.fileId)).done).toMatchObject({ created: 5000 });
    const again = await previewFile(admin, await exportText(admin));
    expect(again.preview).toMatchObject({ errorCount: 0, counts: { created: 0, updated: 0, unchanged: 5000 } });
  }, 60_000);
});
