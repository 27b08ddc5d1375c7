import { absoluteUrl, sendMail } from "~/utils/mail.server";
import { issuePasswordToken } from "~/models/password-token.server";

type Recipient = { id: number; organisationId: number; email: string; name: string };

/** E-mails a new user a single-use link (72 h) to choose their password. */
export async function sendInvitation(user: Recipient, invitedBy: string, organisationName: string, request?: Request) {
  const token = await issuePasswordToken(user.id, "invite");
  const link = absoluteUrl(`/set-password/${token}`, request);
  await sendMail({
    organisationId: user.organisationId,
    to: `${user.name} <${user.email}>`,
    subject: `You have been added to Plumbline for ${organisationName}`,
    text: [
      `Hello ${user.name},`,
      "",
      `${invitedBy} has added you to Plumbline, the lift planning system of ${organisationName}.`,
      "Choose your password here (the link works once and expires in 72 hours):",
      link,
      "",
      "If you did not expect this, ignore this message.",
    ].join("\n"),
  });
}

/** E-mails a single-use link (72 h) to reset a forgotten password. */
export async function sendPasswordReset(user: Recipient, request?: Request) {
  const token = await issuePasswordToken(user.id, "reset");
  const link = absoluteUrl(`/set-password/${token}`, request);
  await sendMail({
    organisationId: user.organisationId,
    to: `${user.name} <${user.email}>`,
    subject: "Reset your Plumbline password",
    text: [
      `Hello ${user.name},`,
      "",
      "Someone asked to reset the password of your Plumbline account.",
      "Choose a new password here (the link works once and expires in 72 hours):",
      link,
      "",
      "If it was not you, ignore this message: your password stays as it is.",
    ].join("\n"),
  });
}
