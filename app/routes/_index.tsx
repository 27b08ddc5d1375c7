import type { Route } from "./+types/_index";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { listJobs } from "~/models/job.server";
import { listOrganisationUsers } from "~/models/user.server";
import { ROLE_LABELS } from "~/roles";
import { requireUser } from "~/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Dashboard · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const jobs = await listJobs(user.organisationId);
  const openJobs = jobs
    .filter((j) => j.status === "open")
    .map((j) => ({ id: j.id, workOrder: j.workOrder, title: j.title, site: j.site?.name ?? "", startsOn: j.startsOn }));
  const pendingInvites = user.roles.includes("admin")
    ? (await listOrganisationUsers(user.organisationId)).filter((u) => u.active && !u.hasPassword).map((u) => ({ id: u.id, name: u.name, email: u.email }))
    : [];
  return { user, openJobs, pendingInvites };
}

export default function Dashboard({ loaderData }: Route.ComponentProps) {
  const { user, openJobs, pendingInvites } = loaderData;
  const roles = user.roles;
  return (
    <>
      <PageHeader title={`Good to see you, ${user.name.split(" ")[0]}`} lead={`${roles.map((r) => ROLE_LABELS[r]).join(", ")} at ${user.organisationName}`} />
      <div className="grid gap-6 md:grid-cols-2">
        {roles.includes("planner") && (
          <Card title="For the planner: open jobs">
            {openJobs.length === 0 ? (
              <EmptyState title="No open jobs">
                <a href="/jobs/new">Open a job</a> for a customer site to start planning its lifts.
              </EmptyState>
            ) : (
              <ul className="space-y-2 text-sm">
                {openJobs.map((j) => (
                  <li key={j.id}>
                    <a href={`/jobs/${j.id}`} className="font-medium">
                      {j.workOrder}: {j.title}
                    </a>
                    <span className="block text-ink-soft">
                      {j.site}
                      {j.startsOn ? ` · starts ${j.startsOn}` : ""}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Card>
        )}
        {roles.includes("approver") && (
          <Card title="For the appointed person: plans to review">
            <EmptyState title="Nothing waiting for review">
              Plans submitted by planners wait here for your check and approval.
            </EmptyState>
          </Card>
        )}
        {roles.includes("rigger") && (
          <Card title="For the rigger: lifts assigned to you">
            <EmptyState title="No approved lifts assigned to you">
              When an appointed person approves a plan and assigns you, it appears here to print and take to the lift.
            </EmptyState>
            {openJobs.length > 0 && (
              <p className="mt-3 text-sm">
                Open jobs: <a href="/jobs">{openJobs.length} in progress</a>.
              </p>
            )}
          </Card>
        )}
        {roles.includes("admin") && (
          <Card title="For the admin: people">
            {pendingInvites.length === 0 ? (
              <p className="text-sm text-ink-soft">
                Everyone invited has set a password. <a href="/admin/users/new">Add a user</a> when someone joins.
              </p>
            ) : (
              <>
                <p className="text-sm">Invited but not yet signed in:</p>
                <ul className="mt-2 space-y-1 text-sm">
                  {pendingInvites.map((u) => (
                    <li key={u.id}>
                      <a href={`/admin/users/${u.id}`}>{u.name}</a> <span className="text-ink-soft">{u.email}</span>
                    </li>
                  ))}
                </ul>
              </>
            )}
          </Card>
        )}
      </div>
    </>
  );
}
