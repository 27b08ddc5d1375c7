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

/** Tells an account's owner that sign-ins to it keep failing (the limits slow whoever it is down). */
export async function sendFailedSignInNotice(user: Recipient, failures: number) {
  await sendMail({
    organisationId: user.organisationId,
    to: `${user.name} <${user.email}>`,
    subject: "Failed sign-ins to your Plumbline account",
    text: [
      `Hello ${user.name},`,
      "",
      `${failures} attempts to sign in to your Plumbline account with a wrong password were made in the last 15 minutes.`,
      "Plumbline now makes each further try wait, so guessing is slow; your own browser is not held up.",
      "",
      "If this was you, there is nothing to do. If not, your password has held, but consider changing it in",
      "Settings, where you can also see and end every session signed in as you:",
      absoluteUrl("/settings"),
    ].join("\n"),
  });
}
