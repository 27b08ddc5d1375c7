// The plan's history shows an editing session's autosaves as one entry with what they changed.
import { describe, expect, it } from "vitest";
import * as history from "~/routes/plans.$planId.history";
import { getPlan } from "~/models/plan.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { callRoute, getRequest } from "../support/factories";
import { readyPlan } from "../support/workflow";

describe("the plan's history", () => {
  it("folds the autosaves of one editing session into one entry naming what changed", async () => {
    const { planner, plan } = await readyPlan();
    const org = planner.organisationId;
    const save = async (edit: (doc: Awaited<ReturnType<typeof getPlan>>) => Record<string, unknown>) => {
      const found = (await getPlan(org, plan.id))!;
      const doc = {
        title: found.plan.title,
        arrangement: found.revision.arrangement,
        rigging: found.revision.rigging,
        details: found.revision.details,
        ...edit(found),
      };
      expect((await savePlanRevision(org, plan.id, found.revision.version, doc as never, planner.id)).status).toBe(
        "saved",
      );
    };
    await save((f) => ({
      arrangement: { ...f!.revision.arrangement, hookHeightM: f!.revision.arrangement.hookHeightM + 0.05 },
    }));
    await save((f) => ({
      details: { ...f!.revision.details, hazards: [{ hazard: "Pinch points", control: "Hands clear" }] },
    }));
    await save(() => ({ title: "Lift the element out, carefully" }));
    const res = await callRoute(history.loader, await getRequest(`/plans/${plan.id}/history`, planner), {
      planId: String(plan.id),
    });
    const events = (res.data as { events: Array<{ action: string; details: Record<string, unknown> }> }).events;
    // readyPlan's own save of the gear and these three are one session of the planner's.
    expect(events.map((e) => e.action)).toEqual(["created", "saved"]);
    expect(events[1]!.details).toMatchObject({
      revision: 1,
      saves: 4,
      changed: "the title, the arrangement, the gear allocation, the hazards",
    });
  });
});
