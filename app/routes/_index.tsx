import type { Route } from "./+types/_index";
import { Card, EmptyState, PageHeader } from "~/components/ui/form";
import { countOpenJobs, listJobsPage } from "~/models/job.server";
import { listPendingInvitations } from "~/models/user.server";
import { plannerQueue, reviewQueue, riggerQueue, type QueueRow } from "~/models/plan-queue.server";
import { gearAttentionSummary } from "~/models/gear-item-reads.server";
import { ATTENTION_GROUP_TITLES, ATTENTION_GROUPS } from "~/gear/attention";
import { DUE_SOON_DAYS } from "~/gear/due";
import { addDays } from "~/utils/dates";
import { getOrganisationToday } from "~/models/organisation.server";
import { PLAN_STATUS_LABELS } from "~/plans/document";
import { ROLE_LABELS } from "~/utils/roles";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Dashboard · Plumbline" }];

/** The open jobs the dashboard lists; the jobs page has the rest. */
const DASHBOARD_JOBS = 12;

/** The admin's view of the register: the same named groups the reminder mail carries, a few items each. */
async function gearAttention(organisationId: number, today: string) {
  const groups = await gearAttentionSummary(organisationId, today, addDays(today, DUE_SOON_DAYS), ATTENTION_GROUPS, 8);
  return groups.map(({ group, count, items }) => ({ group, title: ATTENTION_GROUP_TITLES[group], count, items }));
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const roles = user.roles;
  const showsJobs = roles.includes("planner") || roles.includes("rigger");
  const isAdmin = roles.includes("admin");
  // Independent reads, started together: each waits on the database while the others' rows are read.
  const [openJobs, pendingInvites, today, drafts, toReview, lifts] = await Promise.all([
    showsJobs
      ? listJobsPage(
          user.organisationId,
          { cursor: null, towards: "next", limit: DASHBOARD_JOBS },
          { status: "open" },
        ).then((page) =>
          page.rows.map((j) => ({
            id: j.id,
            workOrder: j.workOrder,
            title: j.title,
            site: j.site,
            startsOn: j.startsOn,
          })),
        )
      : [],
    isAdmin ? listPendingInvitations(user.organisationId, 20) : [],
    isAdmin ? getOrganisationToday(user.organisationId) : "",
    roles.includes("planner") ? plannerQueue(user.organisationId) : [],
    roles.includes("approver") ? reviewQueue(user.organisationId) : [],
    roles.includes("rigger") ? riggerQueue(user.organisationId, user.id) : { mine: [], unassigned: [] },
  ]);
  const [openJobCount, gearAttentionNow] = await Promise.all([
    openJobs.length < DASHBOARD_JOBS ? openJobs.length : countOpenJobs(user.organisationId),
    isAdmin ? gearAttention(user.organisationId, today) : null,
  ]);
  return {
    user: { name: user.name, roles, organisationName: user.organisationName },
    openJobs,
    openJobCount,
    pendingInvites,
    drafts,
    toReview,
    lifts,
    gearAttention: gearAttentionNow,
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
  const { user, openJobs, openJobCount, pendingInvites, drafts, toReview, lifts, gearAttention } = loaderData;
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
            {openJobCount > openJobs.length && (
              <p className="mt-3 text-sm">
                <a href="/jobs">All {openJobCount} open jobs</a>
              </p>
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
                Open jobs: <a href="/jobs">{openJobCount} in progress</a>.
              </p>
            )}
          </Card>
        )}
        {roles.includes("admin") && (
          <Card title="For the admin: gear needing attention">
            {gearAttention === null || gearAttention.every((g) => g.count === 0) ? (
              <p className="text-sm text-ink-soft">
                Nothing overdue, quarantined, never examined or due within {DUE_SOON_DAYS} days.
              </p>
            ) : (
              <div className="space-y-3 text-sm">
                {gearAttention
                  .filter((g) => g.count > 0)
                  .map((g) => (
                    <section key={g.group} aria-label={g.title}>
                      <h3 className={`text-sm font-semibold ${g.group === "due_soon" ? "text-warn" : "text-fail"}`}>
                        {g.title}: {g.count}
                      </h3>
                      <ul className="mt-1 space-y-1">
                        {g.items.map((item) => (
                          <li key={item.id}>
                            <a href={`/gear/${item.id}`}>{item.itemCode}</a> {item.description}{" "}
                            {item.nextDueOn && <span className="text-ink-soft">due {item.nextDueOn}</span>}
                          </li>
                        ))}
                      </ul>
                      {g.count > g.items.length && (
                        <p className="text-ink-soft">and {g.count - g.items.length} more in the register</p>
                      )}
                    </section>
                  ))}
              </div>
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
