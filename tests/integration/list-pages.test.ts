// Lists read a page at a time: following Next from the first page, then Previous from the last, visits every row
// exactly once in the list's order, whatever the sort keys hold (ties, missing dates, quotes, names in any case).
import { describe, expect, it } from "vitest";
import * as jobsIndex from "~/routes/jobs._index";
import * as jobPage from "~/routes/jobs.$jobId";
import * as planList from "~/routes/api.plans";
import * as adminHome from "~/routes/admin._index";
import * as componentsIndex from "~/routes/components._index";
import * as history from "~/routes/plans.$planId.history";
import { AuditEvent } from "~/models/audit-event.server";
import { Component } from "~/models/component.server";
import { Job, listJobs } from "~/models/job.server";
import { Plan } from "~/models/plan.server";
import { createSite } from "~/models/site.server";
import * as dashboard from "~/routes/_index";
import { ATTENTION_GROUPS, groupForAttention } from "~/gear/attention";
import { DUE_SOON_DAYS } from "~/gear/due";
import { listGearNeedingAttention } from "~/models/gear-item.server";
import { addDays, DEFAULT_TIME_ZONE, todayIn } from "~/utils/dates";
import { makeGearItem } from "../support/gear";
import { decodeCursor, encodeCursor, PAGE_SIZE } from "~/utils/keyset.server";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { makePlan } from "../support/plans";

type Links = { previous: string | null; next: string | null };

/** Every row of a paged list: Next from the first page to the last, then Previous back to the first. */
async function walk<T>(first: string, read: (href: string) => Promise<{ rows: T[]; pages: Links }>) {
  const forwards: T[][] = [];
  let href: string | null = first;
  let last = first;
  while (href) {
    const page = await read(href);
    forwards.push(page.rows);
    last = href;
    href = page.pages.next;
    expect(forwards.length).toBeLessThan(100);
  }
  const backwards: T[][] = [];
  href = last;
  while (href) {
    const page = await read(href);
    backwards.unshift(page.rows);
    href = page.pages.previous;
    expect(backwards.length).toBeLessThan(100);
  }
  return { forwards, backwards };
}

describe("lists read a page at a time", () => {
  it("a cursor the list did not make is ignored: the first page is shown", () => {
    const keys = [{ sql: "id", direction: "ASC" as const }];
    expect(decodeCursor(encodeCursor([12]), keys)).toEqual([12]);
    expect(decodeCursor(encodeCursor([12, 13]), keys)).toBeNull();
    expect(decodeCursor(encodeCursor([{ a: 1 } as never]), keys)).toBeNull();
    expect(decodeCursor("not base64!", keys)).toBeNull();
    expect(decodeCursor(Buffer.from("[1").toString("base64url"), keys)).toBeNull();
    expect(decodeCursor(null, keys)).toBeNull();
  });

  it("jobs: every job once, open first, by start date (none first) and work order, forwards and back", async () => {
    const planner = await makeUser(["planner"]);
    const site = await createSite(
      planner.organisationId,
      { name: "Quayside O'Neill", customer: "Test", address: "", siteContact: "", notes: "" },
      planner.id,
    );
    const dates = [null, "2027-01-04", "2027-01-04", "2026-12-31", "2027-03-01"];
    await Job.bulkCreate(
      Array.from({ length: 2 * PAGE_SIZE + 17 }, (_, i) => ({
        organisationId: planner.organisationId,
        siteId: site.id,
        workOrder: `${i % 3 ? "wo" : "WO"}-${String((i * 37) % 1000).padStart(3, "0")}'${i}`,
        title: `Job ${i}`,
        status: i % 4 === 0 ? ("closed" as const) : ("open" as const),
        startsOn: dates[i % dates.length]!,
      })),
    );
    const expected = (await listJobs(planner.organisationId)).map((j) => j.id);
    const read = async (href: string) => {
      const res = await callRoute(jobsIndex.loader, await getRequest(href, planner));
      return res.data as { rows: Array<{ id: number }>; pages: Links } & { jobs: Array<{ id: number }> };
    };
    const { forwards, backwards } = await walk("/jobs", async (href) => {
      const data = await read(href);
      return { rows: data.jobs.map((j) => j.id), pages: data.pages };
    });
    expect(forwards.map((p) => p.length)).toEqual([PAGE_SIZE, PAGE_SIZE, 17]);
    expect(forwards.flat()).toEqual(expected);
    expect(backwards).toEqual(forwards);
    // The first page has no Previous link, the last no Next.
    expect((await read("/jobs")).pages.previous).toBeNull();
  });

  it("a job's plans and /api/plans: newest first, each plan once; the API's cursor is in its JSON", async () => {
    const planner = await makeUser(["planner"]);
    const { plan, job } = await makePlan(planner);
    await Plan.bulkCreate(
      Array.from({ length: PAGE_SIZE + 3 }, (_, i) => ({
        organisationId: planner.organisationId,
        jobId: job.id,
        title: `Copy ${i}`,
        createdBy: planner.id,
        currentRevisionId: null,
      })),
    );
    const expected = (await Plan.findAll({ where: { jobId: job.id }, order: [["id", "DESC"]] })).map((p) => p.id);
    expect(expected).toContain(plan.id);
    const { forwards, backwards } = await walk(`/jobs/${job.id}`, async (href) => {
      const res = await callRoute(jobPage.loader, await getRequest(href, planner), { jobId: String(job.id) });
      const data = res.data as { plans: Array<{ id: number }>; pages: Links };
      return { rows: data.plans.map((p) => p.id), pages: data.pages };
    });
    expect(forwards.flat()).toEqual(expected);
    expect(backwards).toEqual(forwards);

    const seen: number[] = [];
    let next: string | null = null;
    do {
      const url: string = `/api/plans?limit=20${next ? `&after=${next}` : ""}`;
      const res = await callRoute(planList.loader, await getRequest(url, planner));
      const body = res.data as { plans: Array<{ id: number }>; next: string | null };
      expect(body.plans.length).toBeLessThanOrEqual(20);
      seen.push(...body.plans.map((p) => p.id));
      next = body.next;
    } while (next);
    expect(seen).toEqual(expected);
    for (const bad of ["limit=0", "limit=201", "limit=x", "after=%21%21"])
      expect((await callRoute(planList.loader, await getRequest(`/api/plans?${bad}`, planner))).status).toBe(400);
  });

  it("users, components and a plan's history page the same way", async () => {
    const admin = await makeUser(["admin", "planner"], { name: "Zoe Admin" });
    for (let i = 0; i < PAGE_SIZE + 4; i++)
      await makeUser(i % 2 ? ["rigger"] : ["planner", "approver"], {
        organisationId: admin.organisationId,
        name: i % 5 ? `Person ${String(i % 20).padStart(2, "0")}` : "Same Name",
        password: null,
      });
    const users = await walk("/admin", async (href) => {
      const data = (await callRoute(adminHome.loader, await getRequest(href, admin))).data as {
        users: Array<{ id: number; name: string; roles: string[] }>;
        pages: Links;
      };
      return { rows: data.users, pages: data.pages };
    });
    const names = users.forwards.flat().map((u) => u.name);
    expect(names).toHaveLength(PAGE_SIZE + 5);
    expect(new Set(users.forwards.flat().map((u) => u.id)).size).toBe(PAGE_SIZE + 5);
    expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
    expect(users.backwards).toEqual(users.forwards);
    expect(users.forwards.flat().find((u) => u.id === admin.id)?.roles).toEqual(["admin", "planner"]);

    await Component.bulkCreate(
      Array.from({ length: PAGE_SIZE + 1 }, (_, i) => ({
        organisationId: admin.organisationId,
        name: `Part ${String(i % 30).padStart(2, "0")}`,
        description: "",
        massKg: 100 + i,
        massSource: "weighed",
        massNote: "",
        contingencyPct: 0,
        lengthM: 1,
        widthM: 1,
        heightM: 1,
        cogXM: 0,
        cogYM: 0,
        cogZM: 0,
        cogSource: "calculated",
        cogNote: "",
        outlineElevation: "[]",
        outlinePlan: "[]",
      })) as never,
    );
    const components = await walk("/components", async (href) => {
      const data = (await callRoute(componentsIndex.loader, await getRequest(href, admin))).data as {
        components: Array<{ id: number; name: string }>;
        pages: Links;
      };
      return { rows: data.components.map((c) => `${c.name}#${c.id}`), pages: data.pages };
    });
    expect(components.forwards.flat()).toHaveLength(PAGE_SIZE + 1);
    expect(components.backwards).toEqual(components.forwards);

    const { plan } = await makePlan(admin);
    await AuditEvent.bulkCreate(
      Array.from({ length: 450 }, (_, i) => ({
        organisationId: admin.organisationId,
        userId: admin.id,
        entity: "plan",
        entityId: plan.id,
        action: i % 2 ? "printed" : "viewed",
        details: null,
      })),
    );
    const events = await walk(`/plans/${plan.id}/history`, async (href) => {
      const data = (await callRoute(history.loader, await getRequest(href, admin), { planId: String(plan.id) }))
        .data as { events: Array<{ id: number }>; pages: Links };
      return { rows: data.events.map((e) => e.id), pages: data.pages };
    });
    const all = (
      await AuditEvent.findAll({ where: { entity: "plan", entityId: plan.id }, order: [["id", "ASC"]] })
    ).map((e) => e.id);
    expect(events.forwards.flat()).toEqual(all);
    expect(events.forwards.length).toBe(Math.ceil(all.length / 200));
    expect(events.backwards).toEqual(events.forwards);
  });

  it("the admin's dashboard counts each attention group and shows its first eight, as grouping every item would", async () => {
    const admin = await makeUser(["admin"]);
    const today = todayIn(DEFAULT_TIME_ZONE);
    for (let i = 0; i < 60; i++) {
      const item = await makeGearItem(admin, { itemCode: `AT-${String((i * 13) % 60).padStart(2, "0")}` });
      const due = i % 6 === 0 ? null : addDays(today, ((i * 11) % 70) - 30);
      await item.update({
        nextDueOn: due,
        lastExaminedOn: due ? addDays(due, -180) : null,
        status: i % 9 === 4 ? "quarantined" : i % 13 === 5 ? "withdrawn" : "in_service",
      });
    }
    const res = await callRoute(dashboard.loader, await getRequest("/", admin));
    const shown = (res.data as { gearAttention: Array<{ group: string; count: number; items: Array<{ id: number }> }> })
      .gearAttention;
    const grouped = groupForAttention(
      await listGearNeedingAttention(addDays(today, DUE_SOON_DAYS), admin.organisationId),
      today,
    );
    expect(shown.map((g) => g.group)).toEqual([...ATTENTION_GROUPS]);
    for (const g of shown) {
      const all = grouped[g.group as keyof typeof grouped];
      expect(g.count, g.group).toBe(all.length);
      expect(
        g.items.map((i) => i.id),
        g.group,
      ).toEqual(all.slice(0, 8).map((i) => i.id));
    }
    expect(shown.every((g) => g.count > 0)).toBe(true);
  });
});
