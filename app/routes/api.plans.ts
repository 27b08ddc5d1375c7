import type { Route } from "./+types/api.plans";
import { listPlans } from "~/models/plan.server";
import { requireUser } from "~/utils/session.server";

/** The organisation's plans: GET /api/plans (optionally ?jobId=). */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const rawJobId = new URL(request.url).searchParams.get("jobId");
  let jobId: number | undefined;
  if (rawJobId !== null) {
    jobId = Number(rawJobId);
    if (!Number.isSafeInteger(jobId) || jobId <= 0)
      return Response.json({ error: "jobId must be a job's number.", issues: [] }, { status: 400 });
  }
  const plans = await listPlans(user.organisationId, { jobId });
  return Response.json(
    plans.map((p) => ({
      id: p.id,
      title: p.title,
      status: p.status,
      revision: p.revision,
      version: p.version,
      jobId: p.jobId,
    })),
  );
}

export async function action({ request }: Route.ActionArgs) {
  await requireUser(request);
  return Response.json(
    { error: "Plans are created from a job's page; this address only lists them." },
    { status: 405, headers: { Allow: "GET" } },
  );
}
