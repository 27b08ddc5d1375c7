import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import nodemailer, { type Transporter } from "nodemailer";
import { SMTPServer } from "smtp-server";
import { env } from "~/utils/env.server";
import { storeCaughtMail } from "~/models/caught-mail.server";

const ORGANISATION_HEADER = "x-plumbline-organisation";

type MailState = { transport: Transporter; catcherPort: number | null };

declare global {
  var __plumblineMail: Promise<MailState> | undefined;
}

/**
 * Outside production, with no SMTP_URL, mail goes to a real SMTP server started in this process
 * (smtp-server + mailparser) that keeps each message in the caught_mail table for /admin/outbox
 * and the tests. Every process that sends mail has its own catcher on a loopback port.
 */
async function startCatcher(port: number): Promise<number> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    banner: "Plumbline mail catcher",
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const orgHeader = parsed.headers.get(ORGANISATION_HEADER);
          const organisationId = typeof orgHeader === "string" && /^\d+$/.test(orgHeader) ? Number(orgHeader) : null;
          const addressText = (a: typeof parsed.to) =>
            !a ? "" : Array.isArray(a) ? a.map((x) => x.text).join(", ") : a.text;
          await storeCaughtMail({
            organisationId,
            fromAddress: addressText(parsed.from),
            toAddress: addressText(parsed.to),
            subject: parsed.subject ?? "(no subject)",
            textBody: parsed.text ?? "",
            htmlBody: typeof parsed.html === "string" ? parsed.html : null,
            receivedAt: new Date(),
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve());
  });
  server.server.unref();
  return (server.server.address() as AddressInfo).port;
}

async function createMailState(): Promise<MailState> {
  if (env.smtpUrl) return { transport: nodemailer.createTransport(env.smtpUrl), catcherPort: null };
  if (env.isProduction) throw new Error("SMTP_URL is required in production.");
  const catcherPort = await startCatcher(env.mailCatcherPort);
  const transport = nodemailer.createTransport({
    host: "127.0.0.1",
    port: catcherPort,
    secure: false,
    ignoreTLS: true,
  });
  return { transport, catcherPort };
}

function mailState(): Promise<MailState> {
  globalThis.__plumblineMail ??= createMailState().catch((error: unknown) => {
    globalThis.__plumblineMail = undefined;
    throw error;
  });
  return globalThis.__plumblineMail;
}

/** Whether mail is kept by the local catcher (so admins may read it at /admin/outbox). */
export function isMailCaught() {
  return !env.smtpUrl && !env.isProduction;
}

export type OutgoingMail = {
  organisationId: number;
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
};

/** Sends one message; resolves once the SMTP server has accepted it. */
export async function sendMail(mail: OutgoingMail) {
  const { transport } = await mailState();
  await transport.sendMail({
    from: env.mailFrom,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    headers: { "X-Plumbline-Organisation": String(mail.organisationId) },
  });
}

/**
 * The absolute URL for `path` for a link in a message, always on PUBLIC_URL's origin (or, without it, the address
 * the server listens on), so a forged Host header cannot send a reset link elsewhere. Only in development, with no
 * PUBLIC_URL, does the request's own origin serve (Vite may move to another port).
 */
export function absoluteUrl(path: string, request?: Request) {
  const fromRequest = request && env.appEnv === "development" && !env.publicUrlIsSet;
  return new URL(path, fromRequest ? new URL(request.url).origin : env.publicUrl).toString();
}
