import { describe, expect, it } from "vitest";
import { attentionGroup, groupForAttention } from "~/gear/attention";

// LOLER 1998 reg 9(4) and reg 10: an item is not used after its examination falls due or while a defect
// found makes it dangerous; an inspector's register names each such item. The 30-day warning is common practice.
describe("which items need attention", () => {
  const today = "2026-12-03";
  it("puts each item in one named group, and withdrawn items in none", () => {
    expect(attentionGroup({ status: "in_service", nextDueOn: "2026-12-02" }, today)).toBe("overdue");
    expect(attentionGroup({ status: "in_service", nextDueOn: "2026-12-03" }, today)).toBe("due_soon");
    expect(attentionGroup({ status: "in_service", nextDueOn: "2027-01-02" }, today)).toBe("due_soon");
    expect(attentionGroup({ status: "in_service", nextDueOn: "2027-01-03" }, today)).toBeNull();
    expect(attentionGroup({ status: "in_service", nextDueOn: null }, today)).toBe("never_examined");
    expect(attentionGroup({ status: "quarantined", nextDueOn: "2027-06-01" }, today)).toBe("quarantined");
    expect(attentionGroup({ status: "quarantined", nextDueOn: "2020-01-01" }, today)).toBe("quarantined");
    expect(attentionGroup({ status: "withdrawn", nextDueOn: "2020-01-01" }, today)).toBeNull();
    expect(attentionGroup({ status: "withdrawn", nextDueOn: null }, today)).toBeNull();
  });
  it("groups a list without losing or repeating an item", () => {
    const items = [
      { id: 1, status: "in_service" as const, nextDueOn: "2026-11-01" },
      { id: 2, status: "quarantined" as const, nextDueOn: null },
      { id: 3, status: "in_service" as const, nextDueOn: null },
      { id: 4, status: "in_service" as const, nextDueOn: "2026-12-20" },
      { id: 5, status: "withdrawn" as const, nextDueOn: null },
      { id: 6, status: "in_service" as const, nextDueOn: "2027-05-01" },
    ];
    const groups = groupForAttention(items, today);
    expect(Object.fromEntries(Object.entries(groups).map(([g, list]) => [g, list.map((i) => i.id)]))).toEqual({
      overdue: [1],
      quarantined: [2],
      never_examined: [3],
      due_soon: [4],
    });
  });
});
