import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/plans.new";
import { Button, Card, EmptyState, Field, FormError, PageHeader, SelectField } from "~/components/ui/form";
import { parseForm, requiredText, requireFormData } from "~/utils/forms";
import { listComponentChoices } from "~/models/component.server";
import { getJob, listJobsPage } from "~/models/job.server";
import { createPlanFromComponent } from "~/plans/revisions.server";
import { MAX_TITLE } from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";

const schema = z.object({
  jobId: z.coerce.number({ error: "Choose the job." }).int("Choose the job.").positive("Choose the job."),
  componentId: z.coerce
    .number({ error: "Choose the component to lift." })
    .int("Choose the component to lift.")
    .positive("Choose the component to lift."),
  title: requiredText("plan title", MAX_TITLE),
});

export const meta: Route.MetaFunction = () => [{ title: "Plan a lift · Plumbline" }];

/** The open jobs offered (in the jobs list's order); a job opened from its own page is always offered. */
const JOB_CHOICES = 500;

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const rawJobId = Number(new URL(request.url).searchParams.get("jobId"));
  const [open, chosen, components] = await Promise.all([
    listJobsPage(user.organisationId, { cursor: null, towards: "next", limit: JOB_CHOICES }, { status: "open" }),
    Number.isSafeInteger(rawJobId) && rawJobId > 0 ? getJob(user.organisationId, rawJobId) : null,
    listComponentChoices(user.organisationId),
  ]);
  const jobs = open.rows.map((j) => ({ id: j.id, label: `${j.workOrder}: ${j.title}` }));
  // The job the page was opened from is offered even when closed or beyond the first open ones.
  if (chosen && !jobs.some((j) => j.id === chosen.id))
    jobs.unshift({ id: chosen.id, label: `${chosen.workOrder}: ${chosen.title}` });
  return { jobId: chosen?.id, jobs, components };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const form = parseForm(schema, await requireFormData(request));
  if (!form.ok) return data({ errors: form.errors }, { status: 400 });
  const created = await createPlanFromComponent(
    user.organisationId,
    form.data.jobId,
    form.data.componentId,
    form.data.title,
    user.id,
  );
  if (!created.ok)
    return data({ errors: { [created.field]: [created.message] } as Record<string, string[]> }, { status: 400 });
  throw redirect(`/plans/${created.plan.id}`, {
    headers: {
      "Set-Cookie": await flashNotice(
        request,
        `${created.plan.title} is started as a draft. Check the arrangement and the results before anything else.`,
      ),
    },
  });
}

export default function NewPlan({ loaderData, actionData }: Route.ComponentProps) {
  const { jobs, components, jobId } = loaderData;
  const errors: Record<string, string[] | undefined> = actionData?.errors ?? {};
  return (
    <>
      <PageHeader
        title="Plan a lift"
        lead="The plan takes a copy of the component as it is now; later changes to the component reach the plan only when you pull them in."
      />
      {components.length === 0 ? (
        <EmptyState title="No component with lift points yet">
          A plan lifts a component. <a href="/components/new">Describe the component</a> with its mass, CoG and lift
          points first.
        </EmptyState>
      ) : jobs.length === 0 ? (
        <EmptyState title="No open job">
          A plan belongs to a job. <a href="/jobs/new">Open a job</a> first.
        </EmptyState>
      ) : (
        <Card className="max-w-xl">
          <Form method="post" className="space-y-4">
            <FormError message={errors._form?.join(" ")} />
            <SelectField
              label="Job"
              name="jobId"
              defaultValue={jobId ? String(jobId) : ""}
              errors={errors.jobId}
              options={[
                { value: "", label: "Choose a job" },
                ...jobs.map((j) => ({ value: String(j.id), label: j.label })),
              ]}
            />
            <SelectField
              label="Component to lift"
              name="componentId"
              errors={errors.componentId}
              options={[
                { value: "", label: "Choose a component" },
                ...components.map((c) => ({
                  value: String(c.id),
                  label: `${c.name} (${c.liftPoints} lift point${c.liftPoints === 1 ? "" : "s"})`,
                })),
              ]}
            />
            <Field
              label="Title of the lift"
              name="title"
              required
              maxLength={MAX_TITLE}
              errors={errors.title}
              hint="What the lift does, e.g. “Lift the element out of the housing onto the skid”."
            />
            <Button type="submit">Start the plan</Button>
          </Form>
        </Card>
      )}
    </>
  );
}
