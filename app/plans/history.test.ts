import { describe, expect, it } from "vitest";
import { collapseEditingSessions, type HistoryEvent } from "~/plans/history";

let id = 0;
const at = (minutes: number) => new Date(Date.UTC(2025, 4, 12, 8, 0) + minutes * 60_000).toISOString();
const saved = (minutes: number, changed: string[], userId = 1, revision = 1): HistoryEvent => ({
  id: ++id,
  at: at(minutes),
  userId,
  by: userId === 1 ? "Pat Planner" : "Sam Both",
  action: "saved",
  details: { revision, version: id, resultStatus: 200, changed },
});
const other = (minutes: number, action: string): HistoryEvent => ({
  id: ++id,
  at: at(minutes),
  userId: 1,
  by: "Pat Planner",
  action,
  details: { revision: 1 },
});

describe("the plan's history, one entry per editing session", () => {
  it("folds consecutive autosaves into one entry with how many and what they changed", () => {
    const events = [
      other(0, "created"),
      saved(1, ["arrangement"]),
      saved(2, ["gear"]),
      saved(20, ["arrangement", "hazards"]),
    ];
    const shown = collapseEditingSessions(events);
    expect(shown.map((e) => e.action)).toEqual(["created", "saved"]);
    expect(shown[1]).toMatchObject({
      id: events[1]!.id,
      at: at(1),
      details: { revision: 1, saves: 3, until: at(20), changed: "the arrangement, the gear allocation, the hazards" },
    });
  });

  it("starts a new session after half an hour's pause, another person's save, another revision or any other event", () => {
    const shown = collapseEditingSessions([
      saved(0, ["gear"]),
      saved(31, ["gear"]),
      saved(32, ["people"], 2),
      saved(33, ["people"], 2, 2),
      other(34, "submitted for review"),
      saved(35, []),
    ]);
    expect(shown.map((e) => [e.action, e.details.saves ?? 1, e.details.changed])).toEqual([
      ["saved", 1, "the gear allocation"],
      ["saved", 1, "the gear allocation"],
      ["saved", 1, "the people"],
      ["saved", 1, "the people"],
      ["submitted for review", 1, undefined],
      ["saved", 1, "nothing (saved as it was)"],
    ]);
  });

  it("keeps every event that is not a save as it is, in order", () => {
    const events = [other(0, "created"), other(1, "submitted for review"), other(2, "approved")];
    expect(collapseEditingSessions(events)).toEqual(events);
  });
});
