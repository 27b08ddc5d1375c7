import type { Route } from "./+types/admin._index";
import { PageHeader } from "~/components/ui/form";
import { isMailCaught } from "~/utils/mail.server";
import { Pager } from "~/components/ui/pager";
import { listUsersPage, USER_LIST_KEYS } from "~/models/user.server";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { ROLE_LABELS } from "~/utils/roles";
import { requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Admin · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requireUserWithRole(request, "admin");
  const url = new URL(request.url);
  const page = await listUsersPage(admin.organisationId, readPageRequest(url, USER_LIST_KEYS));
  return {
    users: page.rows,
    pages: pageLinks(url, page),
    mailCaught: isMailCaught(),
    organisationName: admin.organisationName,
  };
}

export default function AdminHome({ loaderData }: Route.ComponentProps) {
  const { users, pages, mailCaught, organisationName } = loaderData;
  return (
    <>
      <PageHeader
        title="Users and settings"
        lead={`The people of ${organisationName} who use Plumbline, and what each may do.`}
      >
        <a
          href="/admin/users/new"
          className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
        >
          Add a user
        </a>
        <a
          href="/admin/settings"
          className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
        >
          Organisation settings
        </a>
        {mailCaught && (
          <a
            href="/admin/outbox"
            className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
          >
            Outbox (caught mail)
          </a>
        )}
      </PageHeader>
      <div className="overflow-x-auto rounded border border-rule bg-card">
        <table>
          <caption className="sr-only">Users of {organisationName}</caption>
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">E-mail</th>
              <th scope="col">Roles</th>
              <th scope="col">Status</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.id} className={u.active ? "" : "text-ink-soft"}>
                <td>
                  <a href={`/admin/users/${u.id}`}>{u.name}</a>
                </td>
                <td>{u.email}</td>
                <td>{u.roles.map((r) => ROLE_LABELS[r]).join(", ") || "none"}</td>
                <td>{!u.active ? "Deactivated" : u.hasPassword ? "Active" : "Invited, no password yet"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Pager label="Pages of users" {...pages} />
    </>
  );
}
