import { describe, expect, it } from "vitest";
import * as register from "~/routes/gear._index";
import * as newItem from "~/routes/gear.new";
import * as itemPage from "~/routes/gear.$itemId";
import * as editItem from "~/routes/gear.$itemId.edit";
import { AuditEvent } from "~/models/audit-event.server";
import { Examination } from "~/models/examination.server";
import { GearItem } from "~/models/gear-item.server";
import { DEFAULT_TIME_ZONE, addDays, todayIn } from "~/utils/dates";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";
import { adminWithSite, makeGearItem, SHACKLE_FIELDS } from "../support/gear";

type RegisterData = {
  rows: Array<{ itemCode: string; dueState: string; siteName: string | null }>;
  pages: { previous: string | null; next: string | null };
  canEdit: boolean;
  due: { overdue: number; dueSoon: number };
};

async function registerAs(user: { id: number }, query = "") {
  const res = await callRoute(register.loader, await getRequest(`/gear${query}`, user));
  return res.data as RegisterData;
}

describe("adding and editing gear", () => {
  it("an admin adds a shackle; the WLL is kept as marked and in kg, and the item page shows it", async () => {
    const { admin, site } = await adminWithSite();
    const res = await callRoute(
      newItem.action,
      await postForm("/gear/new", { ...SHACKLE_FIELDS, homeSiteId: String(site.id) }, admin),
    );
    expect(res.status).toBe(302);
    const itemId = res.headers.get("Location")!.split("/").pop()!;
    const item = await GearItem.findByPk(Number(itemId));
    expect(item).toMatchObject({
      itemCode: "T-SH-1",
      wllValue: 2,
      wllUnit: "t",
      wllKg: 2000,
      shackleType: "bow",
      pinType: "screw",
      diameterMm: 13,
      homeSiteId: site.id,
      status: "in_service",
    });
    const page = await callRoute(itemPage.loader, await getRequest(`/gear/${itemId}`, admin), { itemId });
    expect(page.data).toMatchObject({
      canAdmin: true,
      item: { itemCode: "T-SH-1", homeSite: { name: site.name }, dueState: "never_examined" },
      examinations: [],
    });
    expect((page.data as { history: Array<{ action: string }> }).history.map((h) => h.action)).toEqual(["created"]);
  });

  it("converts a WLL marked in lb or US tons to kg with the exact factors (1 lb = 0.45359237 kg, international yard and pound agreement 1959)", async () => {
    const { admin } = await adminWithSite();
    await callRoute(
      newItem.action,
      await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: "US-1", wllValue: "2", wllUnit: "shortTon" }, admin),
    );
    await callRoute(
      newItem.action,
      await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: "US-2", wllValue: "1000", wllUnit: "lb" }, admin),
    );
    const items = await GearItem.findAll({
      where: { organisationId: admin.organisationId },
      order: [["itemCode", "ASC"]],
    });
    expect(items[0]!.wllKg).toBeCloseTo(1814.36948, 5);
    expect(items[1]!.wllKg).toBeCloseTo(453.59237, 5);
  });

  it("refuses bad input field by field and writes nothing", async () => {
    const { admin } = await adminWithSite();
    await callRoute(newItem.action, await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: "TAKEN" }, admin));
    const before = await GearItem.count();
    const cases: Array<[Record<string, string>, string]> = [
      [{ ...SHACKLE_FIELDS, wllValue: "-1" }, "wllValue"],
      [{ ...SHACKLE_FIELDS, wllValue: "two" }, "wllValue"],
      [{ ...SHACKLE_FIELDS, wllUnit: "stone" }, "wllUnit"],
      [{ ...SHACKLE_FIELDS, kind: "hook" }, "kind"],
      [{ ...SHACKLE_FIELDS, itemCode: "TAKEN" }, "itemCode"],
      [{ ...SHACKLE_FIELDS, itemCode: "  " }, "itemCode"],
      [{ ...SHACKLE_FIELDS, shackleType: "" }, "shackleType"],
      [{ ...SHACKLE_FIELDS, thread: "M16" }, "thread"],
      [{ ...SHACKLE_FIELDS, homeSiteId: "999999" }, "homeSiteId"],
      [
        {
          ...SHACKLE_FIELDS,
          kind: "eyebolt",
          thread: "",
          eyeboltFamily: "collar",
          shackleType: "",
          pinType: "",
          diameterMm: "",
        },
        "thread",
      ],
    ];
    for (const [fields, field] of cases) {
      const res = await callRoute(newItem.action, await postForm("/gear/new", fields, admin));
      expect(res.status, JSON.stringify(fields)).toBe(400);
      expect((res.data as { errors: Record<string, unknown> }).errors[field], field).toBeDefined();
    }
    expect(await GearItem.count()).toBe(before);
  });

  it("an admin edits an item; the change is in its history and the status is untouched", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin, { itemCode: "E-1" });
    const res = await callRoute(
      editItem.action,
      await postForm(
        `/gear/${item.id}/edit`,
        { ...SHACKLE_FIELDS, itemCode: "E-1", wllValue: "3.25", status: "withdrawn" },
        admin,
      ),
      { itemId: String(item.id) },
    );
    expect(res.status).toBe(302);
    await item.reload();
    expect(item.wllKg).toBe(3250);
    expect(item.status).toBe("in_service");
    const audit = await AuditEvent.findOne({ where: { entity: "gear_item", entityId: item.id, action: "updated" } });
    expect(JSON.parse(audit!.details!).fields).toEqual(
      expect.arrayContaining(["wllValue", "description", "diameterMm"]),
    );
  });
});

describe("who may do what", () => {
  it("planners, appointed persons and riggers read the register but cannot add or edit", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin, { itemCode: "R-1" });
    for (const role of ["planner", "approver", "rigger"] as const) {
      const user = await makeUser([role], { organisationId: admin.organisationId });
      const list = await registerAs(user);
      expect(list.canEdit, role).toBe(false);
      expect(list.rows.map((r) => r.itemCode)).toEqual(["R-1"]);
      const page = await callRoute(itemPage.loader, await getRequest(`/gear/${item.id}`, user), {
        itemId: String(item.id),
      });
      expect(page.data).toMatchObject({ canAdmin: false });
      expect((await callRoute(newItem.loader, await getRequest("/gear/new", user))).status, role).toBe(403);
      expect(
        (await callRoute(newItem.action, await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: "NO" }, user)))
          .status,
        role,
      ).toBe(403);
      const edit = await callRoute(
        editItem.action,
        await postForm(`/gear/${item.id}/edit`, { ...SHACKLE_FIELDS, itemCode: "R-1", wllValue: "9" }, user),
        { itemId: String(item.id) },
      );
      expect(edit.status, role).toBe(403);
      const exam = await callRoute(
        itemPage.action,
        await postForm(
          `/gear/${item.id}`,
          { intent: "examination", examinedOn: todayIn(DEFAULT_TIME_ZONE), examiner: "X", result: "pass" },
          user,
        ),
        { itemId: String(item.id) },
      );
      expect(exam.status, role).toBe(403);
      const status = await callRoute(
        itemPage.action,
        await postForm(`/gear/${item.id}`, { intent: "status", status: "withdrawn", reason: "no" }, user),
        { itemId: String(item.id) },
      );
      expect(status.status, role).toBe(403);
    }
    await item.reload();
    expect(item).toMatchObject({ wllValue: 2, status: "in_service" });
    expect(await Examination.count({ where: { gearItemId: item.id } })).toBe(0);
  });

  it("an anonymous visitor is sent to sign in", async () => {
    const res = await callRoute(register.loader, await getRequest("/gear"));
    expect(res.status).toBe(302);
    expect(res.headers.get("Location")).toMatch(/^\/login\?redirectTo=%2Fgear/);
  });

  it("another organisation's item is not found, to read, edit, examine, re-status or report", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin, { itemCode: "MINE" });
    const stranger = await makeUser(["admin", "rigger"]);
    const itemId = String(item.id);
    expect((await callRoute(itemPage.loader, await getRequest(`/gear/${itemId}`, stranger), { itemId })).status).toBe(
      404,
    );
    expect(
      (await callRoute(editItem.loader, await getRequest(`/gear/${itemId}/edit`, stranger), { itemId })).status,
    ).toBe(404);
    const posts: Array<Record<string, string>> = [
      { ...SHACKLE_FIELDS, itemCode: "HIJACK" },
      { intent: "examination", examinedOn: todayIn(DEFAULT_TIME_ZONE), examiner: "X", result: "fail", defects: "none" },
      { intent: "status", status: "withdrawn", reason: "theirs" },
      { intent: "defect", defect: "sabotage" },
    ];
    expect(
      (await callRoute(editItem.action, await postForm(`/gear/${itemId}/edit`, posts[0]!, stranger), { itemId }))
        .status,
    ).toBe(404);
    for (const fields of posts.slice(1))
      expect(
        (await callRoute(itemPage.action, await postForm(`/gear/${itemId}`, fields, stranger), { itemId })).status,
      ).toBe(404);
    expect(
      (await callRoute(itemPage.loader, await getRequest("/gear/not-a-number", stranger), { itemId: "not-a-number" }))
        .status,
    ).toBe(404);
    await item.reload();
    expect(item).toMatchObject({ itemCode: "MINE", status: "in_service", nextDueOn: null });
    expect((await registerAs(stranger)).rows).toEqual([]);
  });
});

describe("the register's filters, search, sort and pages", () => {
  async function registerOfSix() {
    const { admin, site } = await adminWithSite("Fernbrook");
    const today = todayIn(DEFAULT_TIME_ZONE);
    const make = async (itemCode: string, input: Parameters<typeof makeGearItem>[1], nextDueOn: string | null) => {
      const item = await makeGearItem(admin, { itemCode, ...input });
      if (nextDueOn) await item.update({ nextDueOn, lastExaminedOn: addDays(nextDueOn, -180) });
      return item;
    };
    await make("A-OVERDUE", { description: "Old dee shackle" }, addDays(today, -1));
    await make("B-SOON", {}, addDays(today, 30));
    await make("C-TODAY", {}, today);
    await make("D-LATER", { homeSiteId: site.id }, addDays(today, 31));
    await make(
      "E-NEVER",
      { kind: "crane", shackleType: null, pinType: null, hookHeightM: 5.2, wllValue: 5, homeSiteId: site.id },
      null,
    );
    const gone = await make("F-GONE", { serial: "ZX-99" }, addDays(today, -40));
    await gone.update({ status: "withdrawn" });
    return { admin, site };
  }

  it("marks each item's due state from its next due date and today, and counts what needs attention", async () => {
    const { admin } = await registerOfSix();
    const list = await registerAs(admin);
    expect(Object.fromEntries(list.rows.map((r) => [r.itemCode, r.dueState]))).toEqual({
      "A-OVERDUE": "overdue",
      "B-SOON": "due_soon",
      "C-TODAY": "due_soon",
      "D-LATER": "in_date",
      "E-NEVER": "never_examined",
      "F-GONE": "overdue",
    });
    // Withdrawn items are out of use, so they are not counted as falling due.
    expect(list.due).toEqual({ overdue: 1, dueSoon: 2 });
  });

  it("filters by due state, kind, status, site and text", async () => {
    const { admin, site } = await registerOfSix();
    const codes = async (q: string) => (await registerAs(admin, q)).rows.map((r) => r.itemCode);
    expect(await codes("?due=overdue")).toEqual(["A-OVERDUE", "F-GONE"]);
    expect(await codes("?due=due_soon")).toEqual(["B-SOON", "C-TODAY"]);
    expect(await codes("?due=in_date")).toEqual(["D-LATER"]);
    expect(await codes("?due=never_examined")).toEqual(["E-NEVER"]);
    expect(await codes("?kind=crane")).toEqual(["E-NEVER"]);
    expect(await codes("?status=withdrawn")).toEqual(["F-GONE"]);
    expect(await codes(`?site=${site.id}`)).toEqual(["D-LATER", "E-NEVER"]);
    expect(await codes("?site=none&status=in_service&due=due_soon")).toEqual(["B-SOON", "C-TODAY"]);
    expect(await codes("?q=dee")).toEqual(["A-OVERDUE"]);
    expect(await codes("?q=zx-9")).toEqual(["F-GONE"]);
    expect(await codes("?q=100%25")).toEqual([]);
    expect(await codes("?kind=hook&status=broken&due=soonish&site=x&sort=evil&after=%%%")).toHaveLength(6);
  });

  it("sorts by a column either way and pages through, keeping the filter", async () => {
    const { admin } = await registerOfSix();
    const byDue = (await registerAs(admin, "?sort=nextDueOn&dir=desc&due=due_soon")).rows.map((r) => r.itemCode);
    expect(byDue).toEqual(["B-SOON", "C-TODAY"]);
    const bySite = (await registerAs(admin, "?sort=site&dir=desc")).rows.map((r) => r.siteName);
    expect(bySite.slice(0, 2)).toEqual(["Fernbrook", "Fernbrook"]);
    for (let i = 0; i < 55; i++) await makeGearItem(admin, { itemCode: `P-${String(i).padStart(3, "0")}` });
    const page1 = await registerAs(admin, "?q=P-");
    expect(page1.rows).toHaveLength(50);
    expect(page1.pages.previous).toBeNull();
    expect(page1.pages.next).toMatch(/^\/gear\?q=P-&after=/);
    const page2 = await registerAs(admin, page1.pages.next!.slice("/gear".length));
    expect(page2.rows.map((r) => r.itemCode)).toEqual(["P-050", "P-051", "P-052", "P-053", "P-054"]);
    expect(page2.pages.next).toBeNull();
    const back = await registerAs(admin, page2.pages.previous!.slice("/gear".length));
    expect(back.rows.map((r) => r.itemCode)).toEqual(page1.rows.map((r) => r.itemCode));
    // Sorted by a column that repeats (and is empty for some items), the pages still hold every item once.
    const seen: string[] = [];
    let query: string | null = "?sort=nextDueOn&dir=desc";
    while (query) {
      const page = await registerAs(admin, query);
      seen.push(...page.rows.map((r) => r.itemCode));
      query = page.pages.next?.slice("/gear".length) ?? null;
    }
    expect(seen).toHaveLength(61);
    expect(new Set(seen).size).toBe(61);
    expect(seen.slice(0, 2)).toEqual(["D-LATER", "B-SOON"]);
    // Going up, the items never examined come first (the page edge falls among them), then the dates; the
    // Previous links walk the same pages back.
    const pagesUp: string[][] = [];
    let last: Awaited<ReturnType<typeof registerAs>> | null = null;
    for (let up: string | null = "?sort=nextDueOn"; up; up = last.pages.next?.slice("/gear".length) ?? null) {
      last = await registerAs(admin, up);
      pagesUp.push(last.rows.map((r) => r.itemCode));
    }
    expect(pagesUp.flat()).toEqual([...seen].reverse());
    const pagesBack: string[][] = [pagesUp.at(-1)!];
    for (let down = last!.pages.previous; down;) {
      const page = await registerAs(admin, down.slice("/gear".length));
      pagesBack.unshift(page.rows.map((r) => r.itemCode));
      down = page.pages.previous;
    }
    expect(pagesBack).toEqual(pagesUp);
    // A link past the last item (the items gone since) starts the list again.
    const beyondCursor = Buffer.from(JSON.stringify(["P-999"])).toString("base64url");
    const beyond = await callRoute(register.loader, await getRequest(`/gear?q=P-&after=${beyondCursor}`, admin));
    expect(beyond.status).toBe(302);
    expect(beyond.headers.get("Location")).toBe("/gear?q=P-");
  });
});

describe("the register's text search index", () => {
  it("finds the same items as reading every row, and follows each edit and delete", async () => {
    const { admin } = await adminWithSite("Harrowgate");
    const other = await makeUser(["admin"]);
    await makeGearItem(other, { itemCode: "OTHER-DEE", description: "Dee shackle of another firm" });
    const items = [
      await makeGearItem(admin, { itemCode: "S-001", description: "Dee shackle, galvanised", serial: "KW-4471" }),
      await makeGearItem(admin, { itemCode: "S-002", description: "Bow shackle", manufacturer: "Ãlvik Smede" }),
      await makeGearItem(admin, { itemCode: "S-003", description: 'Bow "heavy" shackle', serial: "kw-9912" }),
      await makeGearItem(admin, { itemCode: "DEE-04", description: "Spare", manufacturer: "Tarnwick Forge" }),
    ];
    const codes = async (q: string) =>
      (await registerAs(admin, `?q=${encodeURIComponent(q)}`)).rows.map((r) => r.itemCode).sort();
    // What the column scan gives: the text anywhere in one of the four columns, letter case aside.
    const scan = (q: string) =>
      GearItem.findAll({ where: { organisationId: admin.organisationId } }).then((all) =>
        all
          .filter((g) =>
            [g.itemCode, g.description, g.manufacturer, g.serial].some((v) =>
              v.toLowerCase().includes(q.toLowerCase()),
            ),
          )
          .map((g) => g.itemCode)
          .sort(),
      );
    for (const q of ["dee", "DEE", "kw-", "KW-4471", "shackle", "ãlvik", '"heavy"', 'bow "', "zzz", "e", "s-"])
      expect(await codes(q), q).toEqual(await scan(q));
    expect(await codes("dee")).toEqual(["DEE-04", "S-001"]);

    await items[1]!.update({ description: "Dee shackle, new" });
    expect(await codes("dee")).toEqual(["DEE-04", "S-001", "S-002"]);
    await items[0]!.update({ serial: "QQ-1" });
    expect(await codes("kw-")).toEqual(["S-003"]);
    await items[3]!.destroy();
    expect(await codes("dee")).toEqual(["S-001", "S-002"]);
    expect((await registerAs(admin, "?q=dee")).rows).toHaveLength(2);
  });
});
