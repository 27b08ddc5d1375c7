import { describe, expect, it } from "vitest";
import {
  addDays,
  addMonths,
  daysUntil,
  defaultNextDue,
  dueState,
  examinationIntervalMonths,
  isIsoDate,
  todayIso,
} from "~/gear/due";
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

describe("calendar arithmetic", () => {
  it("clamps the day to the end of a shorter month, leap years included", () => {
    expect(addMonths("2025-08-31", 6)).toBe("2026-02-28");
    expect(addMonths("2027-08-31", 6)).toBe("2028-02-29");
    expect(addMonths("2026-01-31", 1)).toBe("2026-02-28");
    expect(addMonths("2026-12-15", 12)).toBe("2027-12-15");
    expect(addMonths("2026-03-31", -1)).toBe("2026-02-28");
  });

  it("adds days across month and year ends", () => {
    expect(addDays("2026-12-20", 30)).toBe("2027-01-19");
    expect(addDays("2026-03-01", -1)).toBe("2026-02-28");
    expect(daysUntil("2027-01-19", "2026-12-20")).toBe(30);
  });

  it("knows a real date from a look-alike", () => {
    expect(isIsoDate("2026-02-28")).toBe(true);
    expect(isIsoDate("2026-02-30")).toBe(false);
    expect(isIsoDate("28/02/2026")).toBe(false);
    expect(() => addDays("nonsense", 1)).toThrow();
  });

  it("reads today's local calendar day", () => {
    expect(todayIso(new Date(2026, 0, 5, 23, 59))).toBe("2026-01-05");
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
