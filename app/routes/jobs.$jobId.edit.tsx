import { data, redirect } from "react-router";
import type { Route } from "./+types/jobs.$jobId.edit";
import { JobForm } from "~/components/job-form";
import { Card, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { parseJobForm } from "~/sites-and-jobs/job-form.server";
import { getJob, updateJob } from "~/models/job.server";
import { listSites } from "~/models/site.server";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Edit job · Plumbline" }];

async function requireJob(organisationId: number, rawId: string) {
  const id = Number(rawId);
  const job = Number.isInteger(id) ? await getJob(organisationId, id) : null;
  if (!job) throw data({ message: "There is no such job in your organisation." }, { status: 404 });
  return job;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const job = await requireJob(user.organisationId, params.jobId);
  const sites = await listSites(user.organisationId);
  return {
    sites: sites.map((s) => ({ id: s.id, name: s.name, customer: s.customer })),
    job: {
      id: job.id,
      siteId: job.siteId,
      workOrder: job.workOrder,
      title: job.title,
      description: job.description,
      status: job.status,
      startsOn: job.startsOn,
    },
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const job = await requireJob(user.organisationId, params.jobId);
  const form = await parseJobForm(user.organisationId, await requireFormData(request), job.id);
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  await updateJob(user.organisationId, job.id, form.data, user.id);
  throw redirect(`/jobs/${job.id}`, { headers: { "Set-Cookie": await flashNotice(request, "Job saved.") } });
}

export default function EditJob({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title={`Edit ${loaderData.job.workOrder}`}>
        <a href={`/jobs/${loaderData.job.id}`} className="px-2 py-2 text-sm">
          Back to the job
        </a>
      </PageHeader>
      <Card className="max-w-xl">
        <JobForm
          sites={loaderData.sites}
          values={loaderData.job}
          errors={actionData?.errors ?? {}}
          submitLabel="Save job"
        />
      </Card>
    </>
  );
}
