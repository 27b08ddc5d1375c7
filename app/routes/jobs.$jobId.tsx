import { data } from "react-router";
import type { Route } from "./+types/jobs.$jobId";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { getJob } from "~/models/job.server";
import { Pager } from "~/components/ui/pager";
import { listPlansPage, PLAN_LIST_KEYS } from "~/models/plan.server";
import { PLAN_STATUS_LABELS } from "~/plans/document";
import { hasAnyRole } from "~/utils/roles";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.job.workOrder ?? "Job"} · Plumbline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const id = Number(params.jobId);
  const job = Number.isInteger(id) ? await getJob(user.organisationId, id) : null;
  if (!job) throw data({ message: "There is no such job in your organisation." }, { status: 404 });
  const url = new URL(request.url);
  const page = await listPlansPage(user.organisationId, readPageRequest(url, PLAN_LIST_KEYS), { jobId: job.id });
  return {
    plans: page.rows.map((p) => ({ id: p.id, title: p.title, status: p.status, revision: p.revision })),
    pages: pageLinks(url, page),
    canEdit: hasAnyRole(user, "planner", "admin"),
    job: {
      id: job.id,
      workOrder: job.workOrder,
      title: job.title,
      description: job.description,
      status: job.status,
      startsOn: job.startsOn,
      site: {
        id: job.siteId,
        name: job.site?.name ?? "",
        customer: job.site?.customer ?? "",
        address: job.site?.address ?? "",
        siteContact: job.site?.siteContact ?? "",
      },
    },
  };
}

export default function JobPage({ loaderData }: Route.ComponentProps) {
  const { job, canEdit, plans, pages } = loaderData;
  return (
    <>
      <PageHeader title={`${job.workOrder}: ${job.title}`} lead={`${job.site.name} · ${job.site.customer}`}>
        {canEdit && (
          <a
            href={`/jobs/${job.id}/edit`}
            className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
          >
            Edit job
          </a>
        )}
      </PageHeader>
      <div className="grid gap-6 md:grid-cols-3">
        <Card title="Lifts" className="md:col-span-2">
          {plans.length === 0 && !pages.previous ? (
            <EmptyState title="No lift plans yet">
              {canEdit ? (
                <a href={`/plans/new?jobId=${job.id}`}>Plan a lift</a>
              ) : (
                "Lift plans for this job will be listed here."
              )}
            </EmptyState>
          ) : (
            <>
              <ul className="divide-y divide-rule text-sm">
                {plans.map((p) => (
                  <li key={p.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                    <a href={`/plans/${p.id}`} className="font-medium">
                      {p.title}
                    </a>
                    <span className="text-ink-soft">
                      Revision {p.revision} · {PLAN_STATUS_LABELS[p.status]}
                    </span>
                  </li>
                ))}
              </ul>
              <Pager label="Pages of lift plans" {...pages} />
              {canEdit && (
                <a
                  href={`/plans/new?jobId=${job.id}`}
                  className="mt-3 inline-block rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
                >
                  Plan a lift
                </a>
              )}
            </>
          )}
        </Card>
        <Card title="Job">
          <dl className="space-y-2 text-sm">
            <div>
              <dt className="text-ink-soft">Status</dt>
              <dd>{job.status === "open" ? "Open" : "Closed"}</dd>
            </div>
            <div>
              <dt className="text-ink-soft">Starts on</dt>
              <dd>{job.startsOn ?? "not set"}</dd>
            </div>
            <div>
              <dt className="text-ink-soft">Site address</dt>
              <dd className="whitespace-pre-line">{job.site.address || "—"}</dd>
            </div>
            <div>
              <dt className="text-ink-soft">Site contact</dt>
              <dd>{job.site.siteContact || "—"}</dd>
            </div>
            {job.description && (
              <div>
                <dt className="text-ink-soft">Description</dt>
                <dd className="whitespace-pre-line">{job.description}</dd>
              </div>
            )}
          </dl>
        </Card>
      </div>
    </>
  );
}
