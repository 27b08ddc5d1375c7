import { describe, expect, it } from "vitest";
import { buildLiftRecordDocument, siteTimeText, zonedTimeToUtc } from "~/plans/lift-record";

describe("site local time", () => {
  // UK clocks: GMT (UTC+0) in winter, BST (UTC+1) from the last Sunday of March (The Summer Time Order 2002).
  it("reads a wall-clock time in the site's zone", () => {
    expect(zonedTimeToUtc("2025-01-15T14:05", "Europe/London")!.toISOString()).toBe("2025-01-15T14:05:00.000Z");
    expect(zonedTimeToUtc("2025-06-02T14:05", "Europe/London")!.toISOString()).toBe("2025-06-02T13:05:00.000Z");
    // US Central: CDT, UTC-5, in June (common practice: the zone database, tz "America/Chicago").
    expect(zonedTimeToUtc("2025-06-02T08:30", "America/Chicago")!.toISOString()).toBe("2025-06-02T13:30:00.000Z");
    expect(zonedTimeToUtc("2025-06-02T19:00", "Asia/Kolkata")!.toISOString()).toBe("2025-06-02T13:30:00.000Z");
  });

  it("refuses what is not a time or not a zone", () => {
    expect(zonedTimeToUtc("yesterday", "Europe/London")).toBeNull();
    expect(zonedTimeToUtc("2025-06-02T14:05", "Mars/Olympus")).toBeNull();
  });

  it("shows an instant as the site's clock said it, naming the zone", () => {
    expect(siteTimeText("2025-06-02T13:05:00.000Z", "Europe/London")).toBe("2 June 2025 at 14:05 (Europe/London)");
  });
});

describe("the lift record's document", () => {
  const sealed = {
    details: {
      sequence: [
        { title: "Rig", holdPoint: false, notes: "" },
        { title: "Trial lift and hold", holdPoint: true, notes: "" },
      ],
      hazards: [],
      exclusionZone: "",
      communication: "",
      people: [
        { name: "Dee Marchetti", role: "lift_supervisor" as const },
        { name: "Tomasz Wren", role: "slinger_signaller" as const },
      ],
      floorClearanceM: 0.1,
    },
    schedule: [
      { itemId: 7, itemCode: "EB-7", position: "Leg A eyebolt" },
      { itemId: 9, itemCode: "CS-9", position: "Leg A sling" },
      { itemId: 9, itemCode: "CS-9", position: "Leg B sling" },
    ],
  } as never;
  const now = new Date("2025-06-02T13:30:00Z");
  const form = {
    timeZone: "Europe/London",
    tickedAt: { briefing: new Date("2025-06-02T12:50:00Z") },
    holdPoints: [{ step: 2, releasedBy: "Dee Marchetti", releasedAt: new Date("2025-06-02T13:00:00Z") }],
    gearConfirmed: [7, 9],
    peoplePresent: ["Dee Marchetti"],
  };

  it("records who ticked each check and when, the hold points, the gear by id and who was there", () => {
    const built = buildLiftRecordDocument(sealed, form, "Robin Rigger", now);
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    const d = built.document;
    expect(d.ticks.find((t) => t.id === "briefing")).toMatchObject({
      by: "Robin Rigger",
      at: "2025-06-02T12:50:00.000Z",
    });
    expect(d.ticks.find((t) => t.id === "trial-lift")).toMatchObject({ at: now.toISOString() });
    expect(d.holdPoints).toEqual([
      { step: 2, title: "Trial lift and hold", releasedBy: "Dee Marchetti", at: "2025-06-02T13:00:00.000Z" },
    ]);
    expect(d.gear.map((g) => g.itemCode)).toEqual(["EB-7", "CS-9"]);
    expect(d.people).toEqual([
      { name: "Dee Marchetti", role: "lift_supervisor", present: true },
      { name: "Tomasz Wren", role: "slinger_signaller", present: false },
    ]);
  });

  it("refuses a hold point nobody released, and gear not confirmed on the hook", () => {
    expect(buildLiftRecordDocument(sealed, { ...form, holdPoints: [] }, "Robin Rigger", now)).toMatchObject({
      ok: false,
      problem: { field: "hold-2-by" },
    });
    expect(
      buildLiftRecordDocument(
        sealed,
        { ...form, holdPoints: [{ step: 2, releasedBy: "Dee", releasedAt: new Date("2025-06-03T00:00:00Z") }] },
        "Robin Rigger",
        now,
      ),
    ).toMatchObject({ ok: false, problem: { field: "hold-2-at" } });
    const missing = buildLiftRecordDocument(sealed, { ...form, gearConfirmed: [7] }, "Robin Rigger", now);
    expect(missing).toMatchObject({ ok: false, problem: { field: "gear-9" } });
    if (!missing.ok) expect(missing.problem.message).toMatch(/^Confirm CS-9 \(Leg A sling\) is on the hook by its id/);
  });
});
