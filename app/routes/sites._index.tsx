import type { Route } from "./+types/sites._index";
import { EmptyState, PageHeader } from "~/components/ui/form";
import { listSites } from "~/models/site.server";
import { requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Sites · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const sites = await listSites(user.organisationId);
  return { sites: sites.map((s) => ({ id: s.id, name: s.name, customer: s.customer, siteContact: s.siteContact })) };
}

export default function Sites({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Customer sites" lead="Where the work happens. Each job belongs to a site.">
        <a
          href="/sites/new"
          className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
        >
          Add a site
        </a>
      </PageHeader>
      {loaderData.sites.length === 0 ? (
        <EmptyState title="No sites yet">Add the customer's site first; then open a job there.</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded border border-rule bg-card">
          <table>
            <thead>
              <tr>
                <th scope="col">Site</th>
                <th scope="col">Customer</th>
                <th scope="col">Site contact</th>
              </tr>
            </thead>
            <tbody>
              {loaderData.sites.map((s) => (
                <tr key={s.id}>
                  <td>
                    <a href={`/sites/${s.id}`}>{s.name}</a>
                  </td>
                  <td>{s.customer}</td>
                  <td>{s.siteContact || "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
