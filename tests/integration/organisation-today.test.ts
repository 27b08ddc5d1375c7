// One "today" for an organisation: its own time zone, set by an admin, decides due dates, the register,
// the checks, approval and reminders, whatever the server's clock zone.
import { describe, expect, it } from "vitest";
import * as settingsRoute from "~/routes/admin.settings";
import { getOrganisation, getOrganisationToday } from "~/models/organisation.server";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";

describe("the organisation's time zone", () => {
  it("an admin sets it, and today follows it", async () => {
    const admin = await makeUser(["admin"]);
    const page = await callRoute(settingsRoute.loader, await getRequest("/admin/settings", admin));
    expect(page.status).toBe(200);
    expect((page.data as { timeZone: string }).timeZone).toBe("Europe/London");

    const saved = await callRoute(
      settingsRoute.action,
      await postForm("/admin/settings", { name: "Zone test Ltd", timeZone: "Australia/Sydney" }, admin),
    );
    expect(saved.status).toBe(302);
    expect((await getOrganisation(admin.organisationId))?.timeZone).toBe("Australia/Sydney");
    // 23:30 UTC on 2 Dec 2026 is 10:30 on 3 Dec in Sydney (UTC+11 in its summer).
    expect(await getOrganisationToday(admin.organisationId, new Date("2026-12-02T23:30:00Z"))).toBe("2026-12-03");
  });

  it("refuses a zone that does not exist and changes nothing", async () => {
    const admin = await makeUser(["admin"]);
    for (const timeZone of ["Mars/Olympus", "GMT+25", "Europe/London\u0000"]) {
      const res = await callRoute(
        settingsRoute.action,
        await postForm("/admin/settings", { name: "Should not save", timeZone }, admin),
      );
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.data)).toContain("time zone");
    }
    const organisation = await getOrganisation(admin.organisationId);
    expect(organisation?.name).not.toBe("Should not save");
    expect(organisation?.timeZone).toBe("Europe/London");
  });

  it("is not for planners", async () => {
    const planner = await makeUser(["planner"]);
    const res = await callRoute(
      settingsRoute.action,
      await postForm("/admin/settings", { name: "X", timeZone: "UTC" }, planner),
    );
    expect(res.status).toBe(403);
  });
});
