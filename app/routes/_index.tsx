import type { Route } from "./+types/_index";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { listJobs } from "~/models/job.server";
import { listOrganisationUsers } from "~/models/user.server";
import { plannerQueue, reviewQueue, riggerQueue, type QueueRow } from "~/models/plan-queue.server";
import { listOrganisationGearDueBy } from "~/models/gear-item.server";
import { DUE_SOON_DAYS } from "~/gear/due";
import { addDays } from "~/utils/dates";
import { getOrganisationToday } from "~/models/organisation.server";
import { PLAN_STATUS_LABELS } from "~/plans/document";
import { ROLE_LABELS } from "~/utils/roles";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Dashboard · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const jobs = await listJobs(user.organisationId);
  const openJobs = jobs
    .filter((j) => j.status === "open")
    .map((j) => ({ id: j.id, workOrder: j.workOrder, title: j.title, site: j.site?.name ?? "", startsOn: j.startsOn }));
  const pendingInvites = user.roles.includes("admin")
    ? (await listOrganisationUsers(user.organisationId))
        .filter((u) => u.active && !u.hasPassword)
        .map((u) => ({ id: u.id, name: u.name, email: u.email }))
    : [];
  const roles = user.roles;
  const today = roles.includes("admin") ? await getOrganisationToday(user.organisationId) : "";
  return {
    user,
    openJobs,
    pendingInvites,
    drafts: roles.includes("planner") ? await plannerQueue(user.organisationId) : [],
    toReview: roles.includes("approver") ? await reviewQueue(user.organisationId) : [],
    lifts: roles.includes("rigger") ? await riggerQueue(user.organisationId, user.id) : { mine: [], unassigned: [] },
    dueGear: roles.includes("admin")
      ? (await listOrganisationGearDueBy(user.organisationId, addDays(today, DUE_SOON_DAYS))).map((g) => ({
          id: g.id,
          itemCode: g.itemCode,
          description: g.description,
          nextDueOn: g.nextDueOn ?? "",
          overdue: (g.nextDueOn ?? "") < today,
        }))
      : [],
  };
}

function PlanList({ rows, empty }: { rows: QueueRow[]; empty: React.ReactNode }) {
  if (rows.length === 0) return <>{empty}</>;
  return (
    <ul className="space-y-2 text-sm">
      {rows.map((r) => (
        <li key={`${r.planId}-${r.revision}`}>
          <a href={`/plans/${r.planId}`} className="font-medium">
            {r.title}
          </a>
          <span className="block text-ink-soft">
            {r.workOrder} · revision {r.revision} · {PLAN_STATUS_LABELS[r.status]}
          </span>
        </li>
      ))}
    </ul>
  );
}

export default function Dashboard({ loaderData }: Route.ComponentProps) {
  const { user, openJobs, pendingInvites, drafts, toReview, lifts, dueGear } = loaderData;
  const roles = user.roles;
  return (
    <>
      <PageHeader
        title={`Good to see you, ${user.name.split(" ")[0]}`}
        lead={`${roles.map((r) => ROLE_LABELS[r]).join(", ")} at ${user.organisationName}`}
      />
      <div className="grid gap-6 md:grid-cols-2">
        {roles.includes("planner") && (
          <Card title="For the planner: plans in hand">
            <PlanList
              rows={drafts}
              empty={<EmptyState title="No drafts">Open a job and plan a lift from one of your components.</EmptyState>}
            />
          </Card>
        )}
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
            <PlanList
              rows={toReview}
              empty={
                <EmptyState title="Nothing waiting for review">
                  Plans submitted by planners wait here for your check and approval.
                </EmptyState>
              }
            />
          </Card>
        )}
        {roles.includes("rigger") && (
          <Card title="For the rigger: lifts assigned to you">
            <PlanList
              rows={lifts.mine}
              empty={
                <EmptyState title="No approved lifts assigned to you">
                  When an appointed person approves a plan and assigns you, it appears here to print and take to the
                  lift.
                </EmptyState>
              }
            />
            {lifts.unassigned.length > 0 && (
              <>
                <p className="mt-3 text-sm font-semibold">Approved, no rigger assigned yet</p>
                <PlanList rows={lifts.unassigned} empty={null} />
              </>
            )}
            {openJobs.length > 0 && (
              <p className="mt-3 text-sm">
                Open jobs: <a href="/jobs">{openJobs.length} in progress</a>.
              </p>
            )}
          </Card>
        )}
        {roles.includes("admin") && (
          <Card title="For the admin: thorough examinations due">
            {dueGear.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing overdue or due within 30 days.</p>
            ) : (
              <ul className="space-y-1 text-sm">
                {dueGear.map((g) => (
                  <li key={g.id}>
                    <a href={`/gear/${g.id}`}>{g.itemCode}</a> {g.description}{" "}
                    <span className={g.overdue ? "font-semibold text-fail" : "text-warn"}>
                      {g.overdue ? `OVERDUE since ${g.nextDueOn}` : `due ${g.nextDueOn}`}
                    </span>
                  </li>
                ))}
              </ul>
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
