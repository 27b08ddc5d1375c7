import { describe, expect, it } from "vitest";
import { judgedAsMade } from "~/plans/made-offline";
import type { LiveGearState, LiveProblem } from "~/plans/live-state";

const problem = (kind: LiveProblem["kind"], since: string | null): LiveProblem => ({
  itemId: 1,
  itemCode: "CH-01",
  position: "Leg A",
  kind,
  since,
  message: `CH-01 (Leg A) ${kind}.`,
  detail: "",
});
const state = (problems: LiveProblem[]): LiveGearState => ({
  fit: problems.length === 0,
  checkedAt: "2026-03-02T12:00:00.000Z",
  liftDate: "2026-03-02",
  problems,
});
const madeAt = new Date("2026-03-02T09:30:00Z");

describe("work made without signal is judged at the time it was made", () => {
  it("a quarantine after the record was made does not stand against it, and is reported", () => {
    const judged = judgedAsMade(state([problem("quarantined", "2026-03-02T10:15:00.000Z")]), madeAt);
    expect(judged.asMade.fit).toBe(true);
    expect(judged.arisenSince.map((p) => p.kind)).toEqual(["quarantined"]);
  });

  it("a quarantine before the record was made stands against it", () => {
    const judged = judgedAsMade(state([problem("quarantined", "2026-03-02T09:29:59.000Z")]), madeAt);
    expect(judged.asMade.fit).toBe(false);
    expect(judged.arisenSince).toEqual([]);
  });

  it("a problem with no known start, a missing item and an overdue examination always stand", () => {
    const judged = judgedAsMade(
      state([problem("withdrawn", null), problem("missing", null), problem("overdue", "2026-03-03")]),
      madeAt,
    );
    expect(judged.asMade.problems.map((p) => p.kind)).toEqual(["withdrawn", "missing", "overdue"]);
    expect(judged.arisenSince).toEqual([]);
  });
});
