import { data } from "react-router";
import { formatDateTime } from "~/utils/dates";
import type { Route } from "./+types/admin.outbox.$mailId";
import { PageHeader } from "~/components/ui/form";
import { isMailCaught } from "~/utils/mail.server";
import { getCaughtMail } from "~/models/caught-mail.server";
import { requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Message · Plumbline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const id = Number(params.mailId);
  const message = isMailCaught() && Number.isInteger(id) ? await getCaughtMail(admin.organisationId, id) : null;
  if (!message) throw data({ message: "There is no such message in the outbox." }, { status: 404 });
  return {
    from: message.fromAddress,
    to: message.toAddress,
    subject: message.subject,
    text: message.textBody,
    receivedAt: message.receivedAt.toISOString(),
  };
}

/** Plain text with its URLs made into links (the text is never inserted as HTML). */
function LinkedText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s]+)/g);
  return (
    <>
      {parts.map((part, i) =>
        /^https?:\/\//.test(part) ? (
          <a key={i} href={part} className="break-all">
            {part}
          </a>
        ) : (
          <span key={i}>{part}</span>
        ),
      )}
    </>
  );
}

export default function OutboxMessage({ loaderData }: Route.ComponentProps) {
  const m = loaderData;
  return (
    <>
      <PageHeader title={m.subject}>
        <a href="/admin/outbox" className="px-2 py-2 text-sm">
          Outbox
        </a>
      </PageHeader>
      <article className="rounded border border-rule bg-card p-4">
        <dl className="grid grid-cols-[6rem_1fr] gap-1 text-sm">
          <dt className="text-ink-soft">From</dt>
          <dd>{m.from}</dd>
          <dt className="text-ink-soft">To</dt>
          <dd>{m.to}</dd>
          <dt className="text-ink-soft">Received</dt>
          <dd>{formatDateTime(m.receivedAt, "UTC")}</dd>
        </dl>
        <pre className="mt-4 whitespace-pre-wrap font-sans text-base" data-testid="mail-body">
          <LinkedText text={m.text} />
        </pre>
      </article>
    </>
  );
}
