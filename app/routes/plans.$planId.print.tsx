import { data, isRouteErrorResponse } from "react-router";
import type { Route } from "./+types/plans.$planId.print";
import { PageHeader } from "~/components/ui/form";
import { buildPrintablePlan } from "~/plans/printable.server";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [{ title: "Print the plan · Plumbline" }];

/** The page behind printing: the PDF link when the plan prints, else the reason (409) with a way back. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const planId = Number(params.planId);
  const outcome = await buildPrintablePlan(user, planId, request);
  if (!outcome.ok) throw data({ message: outcome.message, planId: outcome.planId }, { status: outcome.status });
  const p = outcome.printable;
  return {
    plan: { id: planId, title: p.title, revision: p.revision, status: p.status },
    live: p.live ?? null,
  };
}

export default function PrintPlan({ loaderData }: Route.ComponentProps) {
  const { plan, live } = loaderData;
  return (
    <>
      <PageHeader
        title={`Print ${plan.title}`}
        lead={`Revision ${plan.revision}, ${plan.status === "completed" ? "completed: the record of the lift" : "the current approved revision"}.`}
      >
        <a href={`/plans/${plan.id}`} className="px-2 py-2 text-sm">
          Back to the plan
        </a>
      </PageHeader>
      {live && !live.fit && (
        <p role="alert" className="mb-4 rounded border-2 border-fail bg-fail-soft px-3 py-2 font-semibold text-fail">
          NOT FIT TO LIFT: the print says so on every page. {live.problems.map((p) => p.message).join(" ")}
        </p>
      )}
      <p>
        <a
          href={`/plans/${plan.id}/print.pdf`}
          className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
        >
          Open the PDF
        </a>
      </p>
    </>
  );
}

export function ErrorBoundary({ error, params }: Route.ErrorBoundaryProps) {
  const message =
    isRouteErrorResponse(error) && typeof error.data === "object" && error.data && "message" in error.data
      ? String(error.data.message)
      : "The plan could not be printed. Try again; if it keeps happening, tell your admin.";
  const notFound = isRouteErrorResponse(error) && error.status === 404;
  return (
    <section className="mx-auto max-w-xl py-12" role="alert" data-testid="not-printable">
      <h1>{notFound ? "Not found" : "This plan cannot be printed"}</h1>
      <p className="mt-3">{message}</p>
      <p className="mt-6">
        {notFound ? <a href="/">Back to the dashboard</a> : <a href={`/plans/${params.planId}`}>Back to the plan</a>}
      </p>
    </section>
  );
}
