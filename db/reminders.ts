// `npm run reminders`: e-mails each organisation's admins the gear needing attention: overdue,
// quarantined awaiting examination, never examined, or due for thorough examination within 30 days. Meant for a daily or weekly scheduler (cron, systemd timer).
import { sequelize } from "~/utils/db.server";
import { sendExaminationReminders } from "~/gear/reminders.server";

async function main() {
  const summaries = await sendExaminationReminders();
  if (!summaries.length) console.log("No gear needs attention: no reminders sent.");
  for (const s of summaries) {
    const to = s.recipients.length
      ? `sent to ${s.recipients.join(", ")}`
      : "NOT sent: the organisation has no active admin";
    const counts = Object.entries(s.counts)
      .map(([group, n]) => `${n} ${group.replace("_", " ")}`)
      .join(", ");
    console.log(`Organisation ${s.organisationId}: ${counts}; ${to}.`);
  }
  await sequelize.close();
}

main()
  .then(() => process.exit(0))
  .catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
