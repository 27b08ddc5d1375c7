import { describe, expect, it } from "vitest";
import { approvalRefusals, type ReadinessInput } from "~/plans/approval-readiness";
import type { PlanResults } from "~/plans/document";
import type { CheckResult } from "~/statics/checks";

const check = (over: Partial<CheckResult>): CheckResult =>
  ({
    id: "x",
    kind: "shackle",
    item: "Shackle A",
    itemCode: "SH-1",
    status: "pass",
    verdict: "pass",
    message: "ok",
    ...over,
  }) as CheckResult;

const results = (checks: CheckResult[]): PlanResults =>
  ({ kind: "bridle", computedOn: "2026-12-03", status: 200, body: { checks } }) as unknown as PlanResults;

const base: ReadinessInput = {
  permission: { allowed: true },
  results: results([check({})]),
  hasAllocatedGear: true,
  loadPathGaps: [],
  gearProblems: [],
  acknowledgedCheckIds: new Set(),
};

describe("the reasons an approval would be refused", () => {
  it("none for a permitted, complete, passing plan with fit gear", () => {
    expect(approvalRefusals(base)).toEqual([]);
  });

  it("each reason in reading order: who, results, gear allocated, load path, gear now, failing checks, new warnings", () => {
    const reasons = approvalRefusals({
      ...base,
      permission: { allowed: false, reason: "You submitted it, so you are an author of this revision." },
      hasAllocatedGear: false,
      loadPathGaps: ["Leg B has no sling."],
      gearProblems: [
        {
          itemId: 1,
          itemCode: "EB-1",
          position: "Leg A eyebolt",
          kind: "quarantined",
          since: null,
          message: "EB-1 (Leg A eyebolt) has been quarantined since 2026-12-01.",
          detail: "",
        },
      ],
      results: results([
        check({
          id: "inspection-EB-1",
          kind: "inspection",
          itemCode: "EB-1",
          status: "fail",
          message: "EB-1 is quarantined.",
        }),
        check({ id: "shackle-A", status: "fail", message: "Shackle A is over its WLL." }),
        check({ id: "angle-A", kind: "leg-angle", item: "Leg A angle", status: "warn", message: "steep" }),
        check({ id: "angle-B", kind: "leg-angle", item: "Leg B angle", status: "warn", message: "steep" }),
      ]),
      acknowledgedCheckIds: new Set(["angle-B"]),
    });
    expect(reasons.map((r) => r.kind)).toEqual(["permission", "no-gear", "load-path", "gear", "check", "warning"]);
    expect(reasons.find((r) => r.kind === "check")!.message).toBe("Check fails: Shackle A is over its WLL.");
    expect(reasons.find((r) => r.kind === "warning")!.message).toContain("Leg A angle.");
    expect(reasons.find((r) => r.kind === "warning")!.message).not.toContain("Leg B angle");
  });

  it("a failing examination check of an item the register does not name is still a reason", () => {
    const reasons = approvalRefusals({
      ...base,
      results: results([
        check({
          id: "inspection-CH-2",
          kind: "inspection",
          itemCode: "CH-2",
          status: "fail",
          message: "CH-2 is overdue.",
        }),
      ]),
    });
    expect(reasons).toEqual([{ kind: "check", message: "Check fails: CH-2 is overdue." }]);
  });

  it("results that cannot be worked out are a reason, with the solver's sentence", () => {
    const failed = {
      kind: "bridle",
      computedOn: "2026-12-03",
      status: 422,
      body: { error: "The legs cannot reach.", code: "X" },
    } as PlanResults;
    expect(approvalRefusals({ ...base, results: failed })).toEqual([
      { kind: "results", message: "The lift cannot be worked out now: The legs cannot reach." },
    ]);
  });
});
