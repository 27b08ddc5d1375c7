// The demo scenario seeds on any day. Its gear falls due a set number of days after the day of seeding, and each
// examination's next-due date must pass the register's own rule (at most the interval after the examination), so
// counting back from a month's end must never give a date the rule refuses. Seeding on 4 December once failed:
// 31 December less six months is 30 June, and 30 June plus six months is 30 December, a day short.
import { afterAll, describe, expect, it, vi } from "vitest";
import { createDemoSeeder } from "../../db/seeders";
import { demoExaminationDates } from "../../db/seeders/0002-demo-gear";
import { DEMO_GEAR } from "../../db/seeders/demo-gear-items";
import { defaultNextDue } from "~/gear/due";
import { GearItem } from "~/models/gear-item.server";
import { addDays, daysUntil } from "~/utils/dates";
import { sequelize } from "~/utils/db.server";

describe("the demo's examination dates", () => {
  it("pass the interval rule and fall due at most three days early, for every day of seeding over six years", () => {
    for (let day = "2025-01-01"; day < "2031-01-01"; day = addDays(day, 1)) {
      for (const months of [6, 12]) {
        const target = addDays(day, 27);
        const dates = demoExaminationDates(target, months);
        // The rule recordExamination applies (gear/examinations.server.ts), through the register's own function.
        expect(
          dates.earlierDue <= defaultNextDue("shackle", dates.earlier, { accessory: months, equipment: months }),
        ).toBe(true);
        expect(
          dates.nextDueOn <= defaultNextDue("shackle", dates.examinedOn, { accessory: months, equipment: months }),
        ).toBe(true);
        expect(dates.nextDueOn > dates.examinedOn).toBe(true);
        expect(daysUntil(target, dates.nextDueOn)).toBeGreaterThanOrEqual(0);
        expect(daysUntil(target, dates.nextDueOn)).toBeLessThanOrEqual(3);
        expect(dates.earlierDue <= dates.examinedOn).toBe(true);
      }
    }
  });
});

describe("seeding the whole demo on a month-end-sensitive day", () => {
  afterAll(() => {
    vi.useRealTimers();
  });

  it("succeeds on 4 December 2026 and every item falls due as the scenario says, within three days", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-12-04T09:00:00Z"));
    await createDemoSeeder(sequelize).up();
    const items = await GearItem.findAll();
    for (const demo of DEMO_GEAR) {
      const item = items.find((i) => i.itemCode === demo.item.itemCode)!;
      expect(item, demo.item.itemCode).toBeDefined();
      if (demo.dueInDays === "never") {
        expect(item.nextDueOn, demo.item.itemCode).toBeNull();
        continue;
      }
      const early = daysUntil(addDays("2026-12-04", demo.dueInDays), item.nextDueOn!);
      expect(early, demo.item.itemCode).toBeGreaterThanOrEqual(0);
      expect(early, demo.item.itemCode).toBeLessThanOrEqual(3);
    }
  });
});
