import { describe, expect, it } from "vitest";
import { defaultNextDue, dueState, examinationIntervalMonths } from "~/gear/due";
import { GEAR_KINDS } from "~/gear/kinds";

describe("examination intervals", () => {
  it("LOLER 1998 reg 9(3)(a): lifting accessories at least every 6 months", () => {
    for (const kind of [
      "eyebolt",
      "shackle",
      "chain_sling",
      "wire_rope_sling",
      "web_sling",
      "round_sling",
      "master_link",
      "beam",
    ] as const) {
      expect(examinationIntervalMonths(kind), kind).toBe(6);
    }
    expect(defaultNextDue("shackle", "2026-03-15")).toBe("2026-09-15");
  });

  it("LOLER 1998 reg 9(3)(a): other lifting equipment at least every 12 months", () => {
    for (const kind of ["crane", "hoist", "chain_block", "lever_hoist"] as const)
      expect(examinationIntervalMonths(kind), kind).toBe(12);
    expect(defaultNextDue("crane", "2026-03-15")).toBe("2027-03-15");
  });

  it("gives every kind an interval", () => {
    for (const kind of GEAR_KINDS) expect([6, 12]).toContain(examinationIntervalMonths(kind));
  });
});

describe("due state", () => {
  const today = "2026-06-10";
  it.each([
    [null, "never_examined"],
    ["2026-06-09", "overdue"],
    ["2025-01-01", "overdue"],
    ["2026-06-10", "due_soon"],
    ["2026-07-10", "due_soon"],
    ["2026-07-11", "in_date"],
    ["2027-06-10", "in_date"],
  ] as const)("next due %s is %s on 2026-06-10", (nextDue, state) => {
    expect(dueState(nextDue, today)).toBe(state);
  });
});
