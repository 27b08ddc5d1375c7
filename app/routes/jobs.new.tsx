import { data, redirect } from "react-router";
import type { Route } from "./+types/jobs.new";
import { JobForm } from "~/components/job-form";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { parseJobForm } from "~/sites-and-jobs/job-form.server";
import { createJob } from "~/models/job.server";
import { listSites } from "~/models/site.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Open a job · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const sites = await listSites(user.organisationId);
  const siteId = Number(new URL(request.url).searchParams.get("siteId")) || undefined;
  return { sites: sites.map((s) => ({ id: s.id, name: s.name, customer: s.customer })), siteId };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const form = await parseJobForm(user.organisationId, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const job = await createJob(user.organisationId, form.data, user.id);
  throw redirect(`/jobs/${job.id}`, {
    headers: { "Set-Cookie": await flashNotice(request, `Job ${job.workOrder} is open.`) },
  });
}

export default function NewJob({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader
        title="Open a job"
        lead="A job is a work order at a customer site; its lifts are planned inside it."
      />
      {loaderData.sites.length === 0 ? (
        <EmptyState title="Add a site first">
          A job belongs to a customer site. <a href="/sites/new">Add a site</a>.
        </EmptyState>
      ) : (
        <Card className="max-w-xl">
          <JobForm
            sites={loaderData.sites}
            values={{ siteId: loaderData.siteId }}
            errors={actionData?.errors ?? {}}
            submitLabel="Open job"
          />
        </Card>
      )}
    </>
  );
}
