import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import * as planDetails from "~/routes/plans.$planId.details";
import * as planPage from "~/routes/plans.$planId";
import * as submit from "~/routes/plans.$planId.submit";
import { getPlan, PlanRevision } from "~/models/plan.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, postForm, TEST_PASSWORD } from "../support/factories";
import { jsonRequest } from "../support/plans";
import { readyPlan } from "../support/workflow";

const details = (version: number) => ({
  version: String(version),
  "step-0-title": "Rig",
  "step-0-notes": "",
  exclusionZone: "Barrier",
  communication: "Radio",
  floorClearance: "150",
});

describe("an approved revision is frozen through every route", () => {
  it("the JSON API, the details form, the component pull and a second submission all refuse with 409 and change nothing", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const before = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    const found = (await getPlan(org, plan.id))!;
    const params = { planId: String(plan.id) };

    const put = await callRoute(
      planApi.action,
      await jsonRequest(
        `/api/plans/${plan.id}`,
        {
          version: before.version,
          title: "Changed",
          arrangement: found.revision.arrangement,
          rigging: found.revision.rigging,
          details: found.revision.details,
        },
        planner,
      ),
      params,
    );
    expect(put.status).toBe(409);
    expect(put.data).toMatchObject({ code: "frozen" });

    const form = await callRoute(
      planDetails.action,
      await postForm(`/plans/${plan.id}/details`, details(before.version), planner),
      params,
    );
    expect(form.status).toBe(409);

    const pull = await callRoute(
      planPage.action,
      await postForm(`/plans/${plan.id}`, { intent: "pull-component", version: String(before.version) }, planner),
      params,
    );
    expect(pull.status).toBe(409);

    const again = await callRoute(submit.action, await postForm(`/plans/${plan.id}/submit`, {}, planner), params);
    expect(again.status).toBe(409);

    const after = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(after.version).toBe(before.version);
    expect(after.status).toBe("approved");
    expect(after.details).toBe(before.details);
    expect((await getPlan(org, plan.id))!.plan.title).toBe(plan.title);
  });
});
