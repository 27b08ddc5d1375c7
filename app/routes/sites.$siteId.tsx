import { data, redirect } from "react-router";
import type { Route } from "./+types/sites.$siteId";
import { SiteForm } from "~/components/site-form";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { parseForm, requireFormData } from "~/utils/forms";
import { Pager } from "~/components/ui/pager";
import { JOB_LIST_KEYS, listJobsPage } from "~/models/job.server";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { getSite, updateSite } from "~/models/site.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { siteSchema } from "~/sites-and-jobs/site-schema";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.site.name ?? "Site"} · Plumbline` }];

async function requireSite(organisationId: number, rawId: string) {
  const id = Number(rawId);
  const site = Number.isInteger(id) ? await getSite(organisationId, id) : null;
  if (!site) throw data({ message: "There is no such site in your organisation." }, { status: 404 });
  return site;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const site = await requireSite(user.organisationId, params.siteId);
  const url = new URL(request.url);
  const page = await listJobsPage(user.organisationId, readPageRequest(url, JOB_LIST_KEYS), { siteId: site.id });
  return {
    site: {
      id: site.id,
      name: site.name,
      customer: site.customer,
      address: site.address,
      siteContact: site.siteContact,
      notes: site.notes,
    },
    jobs: page.rows.map((j) => ({ id: j.id, workOrder: j.workOrder, title: j.title, status: j.status })),
    pages: pageLinks(url, page),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const site = await requireSite(user.organisationId, params.siteId);
  const form = parseForm(siteSchema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  await updateSite(user.organisationId, site.id, form.data, user.id);
  throw redirect(`/sites/${site.id}`, { headers: { "Set-Cookie": await flashNotice(request, "Site saved.") } });
}

export default function SitePage({ loaderData, actionData }: Route.ComponentProps) {
  const { site, jobs, pages } = loaderData;
  return (
    <>
      <PageHeader title={site.name} lead={site.customer}>
        <a
          href={`/jobs/new?siteId=${site.id}`}
          className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
        >
          Open a job here
        </a>
      </PageHeader>
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="Jobs at this site">
          {jobs.length === 0 && !pages.previous ? (
            <EmptyState title="No jobs yet">Open a job (a work order) to plan its lifts.</EmptyState>
          ) : (
            <ul className="space-y-1 text-sm">
              {jobs.map((j) => (
                <li key={j.id}>
                  <a href={`/jobs/${j.id}`}>
                    {j.workOrder}: {j.title}
                  </a>{" "}
                  <span className="text-ink-soft">({j.status})</span>
                </li>
              ))}
            </ul>
          )}
          <Pager label="Pages of this site's jobs" {...pages} />
        </Card>
        <Card title="Site details">
          <SiteForm values={site} errors={actionData?.errors ?? {}} submitLabel="Save site" />
        </Card>
      </div>
    </>
  );
}
