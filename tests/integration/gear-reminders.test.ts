import { afterEach, describe, expect, it } from "vitest";
import { addDays } from "~/utils/dates";
import { CaughtMail, listCaughtMail } from "~/models/caught-mail.server";
import { sendExaminationReminders } from "~/gear/reminders.server";
import { JobRun } from "~/models/job-run.server";
import { Organisation } from "~/models/organisation.server";
import { makeUser } from "../support/factories";
import { adminWithSite, makeGearItem } from "../support/gear";

const TODAY = "2031-05-10";

/** An organisation with an admin and one item never examined, so it needs a reminder on any day. */
async function organisationToRemind(name: string) {
  const { admin } = await adminWithSite(name);
  await makeGearItem(admin, { itemCode: `${name.slice(0, 3).toUpperCase()}-NEVER` });
  return admin;
}

const realMail = globalThis.__plumblineMail;
afterEach(() => {
  globalThis.__plumblineMail = realMail;
});

describe("examination reminders", () => {
  it("e-mails each organisation's admins every item needing attention in named groups, and nothing else", async () => {
    const { admin, rigger, site } = await adminWithSite("Fernbrook Brewery");
    const due = async (itemCode: string, nextDueOn: string | null, extra: Parameters<typeof makeGearItem>[1] = {}) => {
      const item = await makeGearItem(admin, { itemCode, ...extra });
      await item.update({ nextDueOn });
      return item;
    };
    await due("R-OVERDUE", addDays(TODAY, -3), { description: "Dee shackle 2 t", homeSiteId: site.id });
    await due("R-SOON", addDays(TODAY, 30));
    await due("R-LATER", addDays(TODAY, 31));
    await due("R-NEVER", null);
    const withdrawn = await due("R-WITHDRAWN", addDays(TODAY, -100));
    await withdrawn.update({ status: "withdrawn" });
    const quarantined = await due("R-QUARANTINED", addDays(TODAY, 120));
    await quarantined.update({ status: "quarantined", statusReason: "Pin bent" });

    const quiet = await makeUser(["admin"]);
    await makeGearItem(quiet, { itemCode: "Q-1" }).then((i) => i.update({ nextDueOn: addDays(TODAY, 200) }));

    const summaries = await sendExaminationReminders(TODAY);
    const mine = summaries.find((s) => s.organisationId === admin.organisationId);
    expect(mine).toEqual({
      organisationId: admin.organisationId,
      counts: { overdue: 1, quarantined: 1, never_examined: 1, due_soon: 1 },
      recipients: [admin.email],
      outcome: "sent",
    });
    expect(summaries.find((s) => s.organisationId === quiet.organisationId)).toBeUndefined();

    const [mail, ...more] = await listCaughtMail(admin.organisationId);
    expect(more).toEqual([]);
    expect(mail!.subject).toBe("Gear examinations: 1 overdue, 1 quarantined, 1 never examined, 1 due within 30 days");
    expect(mail!.toAddress).toContain(admin.email);
    expect(mail!.toAddress).not.toContain(rigger.email);
    expect(mail!.textBody).toContain("OVERDUE (do not use until examined):");
    expect(mail!.textBody).toMatch(/R-OVERDUE\s+2031-05-07\s+Shackle, Dee shackle 2 t \(Fernbrook Brewery\)/);
    expect(mail!.textBody).toMatch(/Due within 30 days:\n\s+R-SOON\s+2031-06-09/);
    expect(mail!.textBody).toMatch(/QUARANTINED, awaiting thorough examination:\n\s+R-QUARANTINED\s+2031-09-07/);
    expect(mail!.textBody).toMatch(/NEVER EXAMINED \(do not use until examined\):\n\s+R-NEVER\s+never examined/);
    for (const absent of ["R-LATER", "R-WITHDRAWN"]) expect(mail!.textBody).not.toContain(absent);
    expect(mail!.htmlBody).toContain("<td>R-OVERDUE</td>");
    expect(mail!.htmlBody).toContain("<h3>OVERDUE (do not use until examined)</h3>");
    expect(await CaughtMail.count({ where: { organisationId: quiet.organisationId } })).toBe(0);
  });

  it("escapes item text in the HTML table", async () => {
    const { admin } = await adminWithSite();
    await makeGearItem(admin, { itemCode: "H-1", description: "<script>x</script>" }).then((i) =>
      i.update({ nextDueOn: TODAY }),
    );
    await sendExaminationReminders(TODAY);
    const [mail] = await listCaughtMail(admin.organisationId);
    expect(mail!.htmlBody).toContain("&lt;script&gt;x&lt;/script&gt;");
    expect(mail!.htmlBody).not.toContain("<script>");
  });

  it("mails each organisation once when two runs start at the same time", async () => {
    const day = "2031-06-02";
    const first = await organisationToRemind("Ashgrove Mill");
    const second = await organisationToRemind("Brinkley Quarry");
    const runs = await Promise.all([sendExaminationReminders(day), sendExaminationReminders(day)]);
    for (const admin of [first, second]) {
      expect(await listCaughtMail(admin.organisationId)).toHaveLength(1);
      const outcomes = runs.map((run) => run.find((s) => s.organisationId === admin.organisationId)?.outcome).sort();
      expect(outcomes).toEqual(["already-sent", "sent"]);
    }
    expect(await JobRun.count({ where: { organisationId: first.organisationId } })).toBe(1);
  });

  it("mails again once the organisation's day has passed, each organisation by its own time zone", async () => {
    const london = await organisationToRemind("Cobbett Yard");
    const auckland = await organisationToRemind("Dunmore Wharf");
    await Organisation.update({ timeZone: "Pacific/Auckland" }, { where: { id: auckland.organisationId } });
    const mailCount = async () => [
      (await listCaughtMail(london.organisationId)).length,
      (await listCaughtMail(auckland.organisationId)).length,
    ];
    // 11:00 UTC on 10 May is 12:00 that day in London (BST) and 23:00 in Auckland (NZST, UTC+12).
    await sendExaminationReminders(undefined, new Date("2031-05-10T11:00:00Z"));
    expect(await mailCount()).toEqual([1, 1]);
    await sendExaminationReminders(undefined, new Date("2031-05-10T11:30:00Z"));
    expect(await mailCount()).toEqual([1, 1]);
    // 13:00 UTC is still 10 May in London but already 01:00 on 11 May in Auckland.
    await sendExaminationReminders(undefined, new Date("2031-05-10T13:00:00Z"));
    expect(await mailCount()).toEqual([1, 2]);
    await sendExaminationReminders(undefined, new Date("2031-05-11T08:00:00Z"));
    expect(await mailCount()).toEqual([2, 2]);
    const [latest] = await listCaughtMail(auckland.organisationId);
    expect(latest!.textBody).toContain("Thorough examinations as of 2031-05-11.");
  });

  it("gives the day back when the mail cannot be sent, so a later run sends it", async () => {
    const day = "2031-06-20";
    const admin = await organisationToRemind("Elmstead Forge");
    globalThis.__plumblineMail = Promise.resolve({
      transport: { sendMail: () => Promise.reject(new Error("mail server refused the connection")) },
      catcherPort: null,
    } as unknown as NonNullable<typeof globalThis.__plumblineMail>);
    await expect(sendExaminationReminders(day)).rejects.toThrow("mail server refused the connection");
    expect(await JobRun.count({ where: { organisationId: admin.organisationId } })).toBe(0);
    globalThis.__plumblineMail = realMail;
    const summaries = await sendExaminationReminders(day);
    expect(summaries.find((s) => s.organisationId === admin.organisationId)?.outcome).toBe("sent");
    expect(await listCaughtMail(admin.organisationId)).toHaveLength(1);
  });
});
