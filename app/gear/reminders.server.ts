import { DUE_SOON_DAYS, dueState } from "~/gear/due";
import { addDays, todayIn } from "~/utils/dates";
import { getOrganisationTimeZone } from "~/models/organisation.server";
import { kindLabel } from "~/gear/kinds";
import { escapeHtml } from "~/gear/mail.server";
import { absoluteUrl, sendMail } from "~/utils/mail.server";
import { listGearDueBy, type GearItem } from "~/models/gear-item.server";
import { listUsersWithRole } from "~/models/user.server";

export type ReminderLine = {
  itemCode: string;
  kind: string;
  description: string;
  site: string;
  nextDueOn: string;
  overdue: boolean;
};
export type ReminderSummary = { organisationId: number; overdue: number; dueSoon: number; recipients: string[] };

function lineFor(item: GearItem, today: string): ReminderLine {
  return {
    itemCode: item.itemCode,
    kind: kindLabel(item.kind),
    description: item.description,
    site: item.homeSite?.name ?? "",
    nextDueOn: item.nextDueOn ?? "",
    overdue: dueState(item.nextDueOn, today) === "overdue",
  };
}

/** The reminder's subject, text and HTML for one organisation's items falling due. */
export function reminderMessage(lines: ReminderLine[], today: string) {
  const overdue = lines.filter((l) => l.overdue);
  const dueSoon = lines.filter((l) => !l.overdue);
  const subject = `Gear examinations: ${overdue.length} overdue, ${dueSoon.length} due within ${DUE_SOON_DAYS} days`;
  const textRow = (l: ReminderLine) =>
    `  ${l.itemCode.padEnd(16)} ${l.nextDueOn}  ${l.kind}${l.description ? `, ${l.description}` : ""}${l.site ? ` (${l.site})` : ""}`;
  const section = (title: string, rows: ReminderLine[]) => (rows.length ? [title, ...rows.map(textRow), ""] : []);
  const link = absoluteUrl("/gear?due=overdue");
  const text = [
    `Thorough examinations as of ${today}.`,
    "",
    ...section("OVERDUE (do not use until examined):", overdue),
    ...section(`Due within ${DUE_SOON_DAYS} days:`, dueSoon),
    `The register: ${link}`,
  ].join("\n");
  const htmlRows = (rows: ReminderLine[], label: string) =>
    rows
      .map(
        (l) =>
          `<tr><td>${escapeHtml(l.itemCode)}</td><td>${escapeHtml(l.kind)}${l.description ? `, ${escapeHtml(l.description)}` : ""}</td><td>${escapeHtml(l.site)}</td><td>${l.nextDueOn}</td><td><strong>${label}</strong></td></tr>`,
      )
      .join("");
  const html = `<p>Thorough examinations as of ${today}.</p><table border="1" cellpadding="4" cellspacing="0"><thead><tr><th>Item</th><th>What</th><th>Home site</th><th>Next due</th><th>State</th></tr></thead><tbody>${htmlRows(overdue, "OVERDUE")}${htmlRows(dueSoon, `Due within ${DUE_SOON_DAYS} days`)}</tbody></table><p><a href="${escapeHtml(link)}">Open the register</a></p>`;
  return { subject, text, html, overdue: overdue.length, dueSoon: dueSoon.length };
}

/**
 * E-mails each organisation's admins the items (not withdrawn) that are overdue or due within
 * DUE_SOON_DAYS of the organisation's today (in its own time zone, or `today` when given).
 * Organisations with nothing due, or no active admin, get no mail.
 */
export async function sendExaminationReminders(today?: string, now: Date = new Date()): Promise<ReminderSummary[]> {
  // The latest "today" anywhere on Earth is at most one day past UTC's: read that far, then cut per organisation.
  const latestToday = today ?? addDays(todayIn("UTC", now), 1);
  const items = await listGearDueBy(addDays(latestToday, DUE_SOON_DAYS));
  const byOrganisation = new Map<number, GearItem[]>();
  for (const item of items) {
    const list = byOrganisation.get(item.organisationId) ?? [];
    list.push(item);
    byOrganisation.set(item.organisationId, list);
  }
  const summaries: ReminderSummary[] = [];
  for (const [organisationId, orgItems] of byOrganisation) {
    const orgToday = today ?? todayIn(await getOrganisationTimeZone(organisationId), now);
    const cutoff = addDays(orgToday, DUE_SOON_DAYS);
    const lines = orgItems.filter((i) => (i.nextDueOn ?? "") <= cutoff).map((i) => lineFor(i, orgToday));
    if (!lines.length) continue;
    const admins = await listUsersWithRole(organisationId, "admin");
    const message = reminderMessage(lines, orgToday);
    if (admins.length) {
      await sendMail({
        organisationId,
        to: admins.map((a) => a.email),
        subject: message.subject,
        text: message.text,
        html: message.html,
      });
    }
    summaries.push({
      organisationId,
      overdue: message.overdue,
      dueSoon: message.dueSoon,
      recipients: admins.map((a) => a.email),
    });
  }
  return summaries;
}
