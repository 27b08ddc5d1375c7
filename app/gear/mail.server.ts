import { absoluteUrl, sendMail } from "~/utils/mail.server";
import { listUsersWithRole } from "~/models/user.server";

function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/**
 * Tells the organisation's admins that someone reported a defect on an item. Returns how many
 * admins were written to (0 when the organisation has none active).
 */
export async function sendDefectReportMail(
  organisationId: number,
  item: { id: number; itemCode: string; description: string },
  report: { defect: string; reporterName: string; quarantined: boolean },
  request?: Request,
) {
  const admins = await listUsersWithRole(organisationId, "admin");
  if (!admins.length) return 0;
  const link = absoluteUrl(`/gear/${item.id}`, request);
  const state = report.quarantined
    ? "The item is now QUARANTINED: it must not be used until an admin returns it to service."
    : "The item was already out of service; its status is unchanged.";
  const text = [
    `${report.reporterName} reported a defect on ${item.itemCode}${item.description ? ` (${item.description})` : ""}:`,
    "",
    report.defect,
    "",
    state,
    "",
    `Open the item: ${link}`,
  ].join("\n");
  const html = `<p>${escapeHtml(report.reporterName)} reported a defect on <strong>${escapeHtml(item.itemCode)}</strong>${
    item.description ? ` (${escapeHtml(item.description)})` : ""
  }:</p><blockquote>${escapeHtml(report.defect)}</blockquote><p><strong>${escapeHtml(state)}</strong></p><p><a href="${escapeHtml(link)}">Open the item</a></p>`;
  await sendMail({
    organisationId,
    to: admins.map((a) => a.email),
    subject: `Defect reported on ${item.itemCode}${report.quarantined ? ": quarantined" : ""}`,
    text,
    html,
  });
  return admins.length;
}

export { escapeHtml };
