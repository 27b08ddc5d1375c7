import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  addDays,
  addMonths,
  daysUntil,
  formatDate,
  formatDateTime,
  isIsoDate,
  isTimeZone,
  todayIn,
} from "~/utils/dates";

describe("the organisation's today", () => {
  // 23:30 UTC on 2 Dec 2026 is already 3 Dec in Sydney (UTC+11 in summer) and still 2 Dec in London (GMT)
  // and in Chicago (UTC-6): the calendar day depends on the zone, never on the server's own clock.
  const lateEvening = new Date("2026-12-02T23:30:00Z");
  it("is the calendar day in the organisation's zone", () => {
    expect(todayIn("Europe/London", lateEvening)).toBe("2026-12-02");
    expect(todayIn("Australia/Sydney", lateEvening)).toBe("2026-12-03");
    expect(todayIn("America/Chicago", lateEvening)).toBe("2026-12-02");
    expect(todayIn("America/Chicago", new Date("2026-12-03T05:59:00Z"))).toBe("2026-12-02");
    expect(todayIn("America/Chicago", new Date("2026-12-03T06:00:00Z"))).toBe("2026-12-03");
  });
  it("follows British Summer Time: 23:30 UTC on 1 July is already 2 July in London", () => {
    expect(todayIn("Europe/London", new Date("2026-07-01T23:30:00Z"))).toBe("2026-07-02");
  });
  it("knows real zones and refuses made-up ones", () => {
    expect(isTimeZone("Europe/London")).toBe(true);
    expect(isTimeZone("America/Argentina/Buenos_Aires")).toBe(true);
    expect(isTimeZone("Mars/Olympus")).toBe(false);
    expect(isTimeZone("")).toBe(false);
    expect(isTimeZone("Europe/London; DROP")).toBe(false);
  });
});

describe("calendar arithmetic", () => {
  it("adds months the way a due date is set: 31 Aug + 6 months is the last day of February", () => {
    expect(addMonths("2026-08-31", 6)).toBe("2027-02-28");
    expect(addMonths("2027-08-31", 6)).toBe("2028-02-29");
    expect(addMonths("2026-12-03", 12)).toBe("2027-12-03");
  });
  it("adding days and counting them back agree", () => {
    fc.assert(
      fc.property(
        fc.date({ min: new Date("2000-01-01T00:00:00Z"), max: new Date("2090-12-31T00:00:00Z"), noInvalidDate: true }),
        fc.integer({ min: -4000, max: 4000 }),
        (d, n) => {
          const day = d.toISOString().slice(0, 10);
          const later = addDays(day, n);
          expect(isIsoDate(later)).toBe(true);
          expect(daysUntil(later, day)).toBe(n);
        },
      ),
    );
  });
  it("refuses dates that do not exist", () => {
    expect(isIsoDate("2026-02-29")).toBe(false);
    expect(isIsoDate("2028-02-29")).toBe(true);
    expect(isIsoDate("03/12/2026")).toBe(false);
  });
});

describe("dates as people read them", () => {
  it("writes ISO 8601 dates, which no UK or US reader can take for day/month the wrong way round", () => {
    expect(formatDate("2026-12-03")).toBe("2026-12-03");
    expect(formatDate("2026-03-12T23:10:00.000Z")).toBe("2026-03-12");
    expect(formatDate(new Date("2026-03-12T10:00:00Z"))).toBe("2026-03-12");
    expect(formatDate(null)).toBe("");
    expect(formatDate("soon")).toBe("soon");
  });
  it("writes a time in the site's zone with the zone named", () => {
    expect(formatDateTime("2026-07-01T13:05:00Z", "Europe/London")).toBe("2026-07-01 14:05 BST");
    expect(formatDateTime("2026-12-03T13:05:00Z", "Europe/London")).toBe("2026-12-03 13:05 GMT");
    expect(formatDateTime(new Date("2026-12-03T05:05:00Z"), "America/Chicago")).toBe("2026-12-02 23:05 GMT-6");
    expect(formatDateTime("not a time", "Europe/London")).toBe("not a time");
    // The moments the plan page, the sessions list and the outbox show: ISO order in UTC, never day-first or month-first.
    expect(formatDateTime("2026-12-04T16:46:43Z", "UTC")).toBe("2026-12-04 16:46 UTC");
  });
});

describe("calendar arithmetic, month ends and leap years", () => {
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
});
