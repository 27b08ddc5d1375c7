import type { Route } from "./+types/jobs._index";
import { EmptyState, PageHeader } from "~/components/ui/form";
import { Pager } from "~/components/ui/pager";
import { JOB_LIST_KEYS, listJobsPage } from "~/models/job.server";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { hasAnyRole } from "~/utils/roles";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Jobs · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const url = new URL(request.url);
  const page = await listJobsPage(user.organisationId, readPageRequest(url, JOB_LIST_KEYS));
  return {
    canEdit: hasAnyRole(user, "planner", "admin"),
    jobs: page.rows,
    pages: pageLinks(url, page),
  };
}

export default function Jobs({ loaderData }: Route.ComponentProps) {
  const { jobs, canEdit, pages } = loaderData;
  return (
    <>
      <PageHeader title="Jobs" lead="Work orders at customer sites; each holds the lifts planned for it.">
        {canEdit && (
          <a
            href="/jobs/new"
            className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
          >
            Open a job
          </a>
        )}
      </PageHeader>
      {jobs.length === 0 && !pages.previous ? (
        <EmptyState title="No jobs yet">
          {canEdit
            ? "Open a job for a customer site to start planning its lifts."
            : "Planners open jobs; they will appear here."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded border border-rule bg-card">
          <table>
            <thead>
              <tr>
                <th scope="col">Work order</th>
                <th scope="col">Job</th>
                <th scope="col">Site</th>
                <th scope="col">Starts</th>
                <th scope="col">Status</th>
              </tr>
            </thead>
            <tbody>
              {jobs.map((j) => (
                <tr key={j.id}>
                  <td className="whitespace-nowrap">
                    <a href={`/jobs/${j.id}`}>{j.workOrder}</a>
                  </td>
                  <td>{j.title}</td>
                  <td>
                    {j.site} <span className="text-ink-soft">· {j.customer}</span>
                  </td>
                  <td className="whitespace-nowrap">{j.startsOn ?? "—"}</td>
                  <td>{j.status === "open" ? "Open" : "Closed"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Pager label="Pages of jobs" {...pages} />
    </>
  );
}
