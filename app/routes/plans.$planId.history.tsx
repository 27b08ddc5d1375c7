import { data } from "react-router";
import type { Route } from "./+types/plans.$planId.history";
import { EmptyState, PageHeader } from "~/components/ui/form";
import { getPlanRow } from "~/models/plan.server";
import { listPlanHistory } from "~/plans/workflow-view.server";
import { Pager } from "~/components/ui/pager";
import { AUDIT_LIST_KEYS } from "~/models/audit-event.server";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { requireUser } from "~/utils/session.server";

/** Events read per page (an editing session's saves then fold into one entry). */
const HISTORY_PAGE = 200;

export const meta: Route.MetaFunction = () => [{ title: "History · Plumbline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  // The plan row alone: the page shows its title, never a revision.
  const plan = await getPlanRow(user.organisationId, Number(params.planId));
  if (!plan) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  const url = new URL(request.url);
  const page = readPageRequest(url, AUDIT_LIST_KEYS, HISTORY_PAGE);
  const history = await listPlanHistory(user.organisationId, plan.id, page);
  return {
    plan: { id: plan.id, title: plan.title },
    pages: pageLinks(url, history),
    // Photos taken at the lift are shown with the event that recorded them.
    events: history.rows.map((e) => ({
      ...e,
      photos: Array.isArray(e.details.photos)
        ? e.details.photos.filter((id): id is number => Number.isInteger(id))
        : [],
    })),
  };
}

function describe(details: Record<string, unknown>) {
  return Object.entries(details)
    .filter(([k]) => k !== "fingerprint" && k !== "photos")
    .map(
      ([k, v]) =>
        `${k.replace(/([A-Z])/g, " $1").toLowerCase()}: ${typeof v === "object" ? JSON.stringify(v) : String(v)}`,
    )
    .join(" · ");
}

export default function PlanHistory({ loaderData }: Route.ComponentProps) {
  const { plan, events, pages } = loaderData;
  return (
    <>
      <PageHeader
        title={`History of ${plan.title}`}
        lead="Every state change, acknowledgement, approval, print and record, with who and when. It cannot be edited."
      >
        <a href={`/plans/${plan.id}`} className="px-2 py-2 text-sm">
          Back to the plan
        </a>
      </PageHeader>
      {events.length === 0 ? (
        <EmptyState title="Nothing yet">The plan's history starts when it is created.</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded border border-rule bg-card">
          <table data-testid="history">
            <thead>
              <tr>
                <th scope="col">When (UTC)</th>
                <th scope="col">Who</th>
                <th scope="col">What</th>
                <th scope="col">Details</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e) => (
                <tr key={e.id}>
                  <td className="whitespace-nowrap">{new Date(e.at).toLocaleString("en-GB", { timeZone: "UTC" })}</td>
                  <td>{e.by}</td>
                  <td className="font-semibold">{e.action}</td>
                  <td className="text-ink-soft">
                    {describe(e.details)}
                    {e.photos.length > 0 && (
                      <span className="mt-1 flex flex-wrap gap-2">
                        {e.photos.map((id, i) => (
                          <a key={id} href={`/files/${id}`}>
                            <img
                              src={`/files/${id}`}
                              alt={`Photo ${i + 1} taken at the lift`}
                              className="h-16 w-auto rounded border border-rule"
                            />
                          </a>
                        ))}
                      </span>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Pager label="Pages of the plan's history" {...pages} />
    </>
  );
}
