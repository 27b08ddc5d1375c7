// The daily reminder to each organisation's admins: every item needing attention, in named groups
// (overdue, quarantined awaiting examination, never examined, due within 30 days), with a link to the
// register at the public address. Each organisation's reminder goes out at most once on its day, however many
// servers run the job (a job_runs claim per organisation and day).
import { ATTENTION_GROUP_TITLES, ATTENTION_GROUPS, groupForAttention, type AttentionGroup } from "~/gear/attention";
import { DUE_SOON_DAYS } from "~/gear/due";
import { kindLabel } from "~/gear/kinds";
import { escapeHtml } from "~/gear/mail.server";
import { claimJobRun, releaseJobRun } from "~/models/job-run.server";
import { getOrganisationTimeZone } from "~/models/organisation.server";
import { listGearNeedingAttention, type GearItem } from "~/models/gear-item.server";
import { listUsersWithRole } from "~/models/user.server";
import { addDays, todayIn } from "~/utils/dates";
import { absoluteUrl, sendMail } from "~/utils/mail.server";

export type ReminderLine = {
  itemCode: string;
  kind: string;
  description: string;
  site: string;
  nextDueOn: string;
};
/** sent: mailed now; already-sent: another run mailed this organisation on this day; no-admin: no one to mail. */
export type ReminderOutcome = "sent" | "already-sent" | "no-admin";
export type ReminderSummary = {
  organisationId: number;
  counts: Record<AttentionGroup, number>;
  recipients: string[];
  outcome: ReminderOutcome;
};

function lineFor(item: GearItem): ReminderLine {
  return {
    itemCode: item.itemCode,
    kind: kindLabel(item.kind),
    description: item.description,
    site: item.homeSite?.name ?? "",
    nextDueOn: item.nextDueOn ?? "never examined",
  };
}

const SUBJECT_WORDS: Record<AttentionGroup, string> = {
  overdue: "overdue",
  quarantined: "quarantined",
  never_examined: "never examined",
  due_soon: `due within ${DUE_SOON_DAYS} days`,
};

/** The reminder's subject, text and HTML for one organisation's items, grouped. */
export function reminderMessage(groups: Record<AttentionGroup, ReminderLine[]>, today: string) {
  const present = ATTENTION_GROUPS.filter((g) => groups[g].length > 0);
  const subject = `Gear examinations: ${present.map((g) => `${groups[g].length} ${SUBJECT_WORDS[g]}`).join(", ")}`;
  const textRow = (l: ReminderLine) =>
    `  ${l.itemCode.padEnd(16)} ${l.nextDueOn}  ${l.kind}${l.description ? `, ${l.description}` : ""}${l.site ? ` (${l.site})` : ""}`;
  const link = absoluteUrl("/gear?due=overdue");
  const text = [
    `Thorough examinations as of ${today}.`,
    "",
    ...present.flatMap((g) => [`${ATTENTION_GROUP_TITLES[g]}:`, ...groups[g].map(textRow), ""]),
    `The register: ${link}`,
  ].join("\n");
  const htmlRows = (group: AttentionGroup) =>
    groups[group]
      .map(
        (l) =>
          `<tr><td>${escapeHtml(l.itemCode)}</td><td>${escapeHtml(l.kind)}${l.description ? `, ${escapeHtml(l.description)}` : ""}</td><td>${escapeHtml(l.site)}</td><td>${escapeHtml(l.nextDueOn)}</td></tr>`,
      )
      .join("");
  const sections = present
    .map(
      (g) =>
        `<h3>${escapeHtml(ATTENTION_GROUP_TITLES[g])}</h3><table border="1" cellpadding="4" cellspacing="0"><thead><tr><th>Item</th><th>What</th><th>Home site</th><th>Next due</th></tr></thead><tbody>${htmlRows(g)}</tbody></table>`,
    )
    .join("");
  const html = `<p>Thorough examinations as of ${today}.</p>${sections}<p><a href="${escapeHtml(link)}">Open the register</a></p>`;
  return { subject, text, html };
}

/**
 * E-mails each organisation's admins every item (not withdrawn) that needs attention on the
 * organisation's today (in its own time zone, or `today` when given). Organisations with nothing to
 * report, or no active admin, get no mail. An organisation already mailed on its day, by this run or by another
 * started at the same time on any server, is not mailed again; a mail that fails gives its day back for a later run.
 */
export async function sendExaminationReminders(today?: string, now: Date = new Date()): Promise<ReminderSummary[]> {
  // The latest "today" anywhere on Earth is at most one day past UTC's: read that far, then cut per organisation.
  const latestToday = today ?? addDays(todayIn("UTC", now), 1);
  const items = await listGearNeedingAttention(addDays(latestToday, DUE_SOON_DAYS));
  const byOrganisation = new Map<number, GearItem[]>();
  for (const item of items)
    byOrganisation.set(item.organisationId, [...(byOrganisation.get(item.organisationId) ?? []), item]);
  const summaries: ReminderSummary[] = [];
  for (const [organisationId, orgItems] of byOrganisation) {
    const orgToday = today ?? todayIn(await getOrganisationTimeZone(organisationId), now);
    const grouped = groupForAttention(orgItems, orgToday);
    if (ATTENTION_GROUPS.every((g) => grouped[g].length === 0)) continue;
    const lines = Object.fromEntries(ATTENTION_GROUPS.map((g) => [g, grouped[g].map(lineFor)])) as Record<
      AttentionGroup,
      ReminderLine[]
    >;
    const admins = await listUsersWithRole(organisationId, "admin");
    const outcome = admins.length ? await mailOnce(organisationId, orgToday, admins, lines, now) : "no-admin";
    summaries.push({
      organisationId,
      counts: Object.fromEntries(ATTENTION_GROUPS.map((g) => [g, grouped[g].length])) as Record<AttentionGroup, number>,
      recipients: admins.map((a) => a.email),
      outcome,
    });
  }
  return summaries;
}

/** Claims the organisation's day, then mails; without the claim (another run has it) sends nothing. */
async function mailOnce(
  organisationId: number,
  orgToday: string,
  admins: Array<{ email: string }>,
  lines: Record<AttentionGroup, ReminderLine[]>,
  now: Date,
): Promise<ReminderOutcome> {
  const claim = await claimJobRun("examination-reminders", organisationId, orgToday, now);
  if (claim === null) return "already-sent";
  const message = reminderMessage(lines, orgToday);
  try {
    await sendMail({
      organisationId,
      to: admins.map((a) => a.email),
      subject: message.subject,
      text: message.text,
      html: message.html,
    });
  } catch (error) {
    await releaseJobRun(claim);
    throw error;
  }
  return "sent";
}
