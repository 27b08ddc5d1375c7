import { data } from "react-router";
import type { Route } from "./+types/admin.outbox";
import { EmptyState, PageHeader } from "~/components/ui/form";
import { isMailCaught } from "~/utils/mail.server";
import { listCaughtMail } from "~/models/caught-mail.server";
import { requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Outbox · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requireUserWithRole(request, "admin");
  if (!isMailCaught())
    throw data({ message: "Mail goes to your real mail server here; there is no local outbox." }, { status: 404 });
  const messages = await listCaughtMail(admin.organisationId);
  return {
    messages: messages.map((m) => ({
      id: m.id,
      to: m.toAddress,
      subject: m.subject,
      receivedAt: m.receivedAt.toISOString(),
    })),
  };
}

export default function Outbox({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader
        title="Outbox"
        lead="Outside production, Plumbline's mail is caught here by a local SMTP catcher instead of being delivered. Newest first."
      >
        <a href="/admin" className="px-2 py-2 text-sm">
          Users
        </a>
      </PageHeader>
      {loaderData.messages.length === 0 ? (
        <EmptyState title="No mail yet">
          Adding a user or asking for a password reset sends a message that lands here.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded border border-rule bg-card">
          <table>
            <thead>
              <tr>
                <th scope="col">Received</th>
                <th scope="col">To</th>
                <th scope="col">Subject</th>
              </tr>
            </thead>
            <tbody>
              {loaderData.messages.map((m) => (
                <tr key={m.id}>
                  <td className="whitespace-nowrap">
                    {new Date(m.receivedAt).toLocaleString("en-GB", { timeZone: "UTC" })} UTC
                  </td>
                  <td>{m.to}</td>
                  <td>
                    <a href={`/admin/outbox/${m.id}`}>{m.subject}</a>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
