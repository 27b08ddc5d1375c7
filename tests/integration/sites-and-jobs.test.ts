import { describe, expect, it } from "vitest";
import * as newSite from "~/routes/sites.new";
import * as sitePage from "~/routes/sites.$siteId";
import * as newJob from "~/routes/jobs.new";
import * as jobPage from "~/routes/jobs.$jobId";
import * as editJob from "~/routes/jobs.$jobId.edit";
import * as jobsIndex from "~/routes/jobs._index";
import { Job } from "~/models/job.server";
import { Site } from "~/models/site.server";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";

const siteFields = {
  name: "Test works, pump house",
  customer: "Test Water",
  address: "1 Test Road",
  siteContact: "",
  notes: "",
};

async function plannerWithSite() {
  const planner = await makeUser(["planner"]);
  const res = await callRoute(newSite.action, await postForm("/sites/new", siteFields, planner));
  const siteId = Number(res.headers.get("Location")!.split("/").pop());
  return { planner, siteId };
}

describe("sites and jobs", () => {
  it("a planner adds a site and opens a job there", async () => {
    const { planner, siteId } = await plannerWithSite();
    const res = await callRoute(
      newJob.action,
      await postForm(
        "/jobs/new",
        {
          siteId: String(siteId),
          workOrder: "WO-1",
          title: "Gearbox swap",
          description: "",
          status: "open",
          startsOn: "2027-02-01",
        },
        planner,
      ),
    );
    expect(res.status).toBe(302);
    const jobId = res.headers.get("Location")!.split("/").pop()!;
    const page = await callRoute(jobPage.loader, await getRequest(`/jobs/${jobId}`, planner), { jobId });
    expect(page.data).toMatchObject({
      job: { workOrder: "WO-1", startsOn: "2027-02-01", site: { name: siteFields.name } },
      canEdit: true,
    });
  });

  it("refuses a job without a title, with a bad date, a taken work order or another organisation's site, writing nothing", async () => {
    const { planner, siteId } = await plannerWithSite();
    const other = await plannerWithSite();
    await callRoute(
      newJob.action,
      await postForm("/jobs/new", { siteId: String(siteId), workOrder: "WO-9", title: "First" }, planner),
    );
    const before = await Job.count();
    const cases: Array<[Record<string, string>, string]> = [
      [{ siteId: String(siteId), workOrder: "WO-2", title: "  " }, "title"],
      [{ siteId: String(siteId), workOrder: "WO-3", title: "T", startsOn: "31/01/2027" }, "startsOn"],
      // 30 February is shaped like a date; PostgreSQL refuses it, so the form must first.
      [{ siteId: String(siteId), workOrder: "WO-3", title: "T", startsOn: "2024-02-30" }, "startsOn"],
      [{ siteId: String(siteId), workOrder: "WO-9", title: "Again" }, "workOrder"],
      [{ siteId: String(other.siteId), workOrder: "WO-4", title: "Theirs" }, "siteId"],
      [{ siteId: "abc", workOrder: "WO-5", title: "T" }, "siteId"],
    ];
    for (const [fields, field] of cases) {
      const res = await callRoute(newJob.action, await postForm("/jobs/new", fields, planner));
      expect(res.status, JSON.stringify(fields)).toBe(400);
      expect((res.data as { errors: Record<string, unknown> }).errors[field], field).toBeDefined();
    }
    expect(await Job.count()).toBe(before);
  });

  it("a rigger reads jobs but cannot open or edit them", async () => {
    const { planner, siteId } = await plannerWithSite();
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    await callRoute(
      newJob.action,
      await postForm("/jobs/new", { siteId: String(siteId), workOrder: "WO-7", title: "Motor" }, planner),
    );
    const list = await callRoute(jobsIndex.loader, await getRequest("/jobs", rigger));
    expect(list.data).toMatchObject({ canEdit: false, jobs: [{ workOrder: "WO-7" }] });
    const create = await callRoute(
      newJob.action,
      await postForm("/jobs/new", { siteId: String(siteId), workOrder: "WO-8", title: "No" }, rigger),
    );
    expect(create.status).toBe(403);
    const site = await callRoute(sitePage.loader, await getRequest(`/sites/${siteId}`, rigger), {
      siteId: String(siteId),
    });
    expect(site.status).toBe(403);
  });

  it("another organisation's job and site are not found", async () => {
    const { planner, siteId } = await plannerWithSite();
    const res = await callRoute(
      newJob.action,
      await postForm("/jobs/new", { siteId: String(siteId), workOrder: "WO-1", title: "Mine" }, planner),
    );
    const jobId = res.headers.get("Location")!.split("/").pop()!;
    const stranger = await makeUser(["planner", "admin"]);
    expect((await callRoute(jobPage.loader, await getRequest(`/jobs/${jobId}`, stranger), { jobId })).status).toBe(404);
    const edit = await callRoute(
      editJob.action,
      await postForm(`/jobs/${jobId}/edit`, { siteId: String(siteId), workOrder: "X", title: "Hijack" }, stranger),
      { jobId },
    );
    expect(edit.status).toBe(404);
    expect((await Job.findByPk(Number(jobId)))?.title).toBe("Mine");
    expect(
      (await callRoute(sitePage.loader, await getRequest(`/sites/${siteId}`, stranger), { siteId: String(siteId) }))
        .status,
    ).toBe(404);
    expect(await Site.count({ where: { organisationId: stranger.organisationId } })).toBe(0);
  });
});
