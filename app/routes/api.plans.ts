import type { Route } from "./+types/api.plans";
import { listPlansPage, PLAN_LIST_KEYS } from "~/models/plan.server";
import { readPageRequest } from "~/utils/keyset.server";
import { requireUser } from "~/utils/session.server";

/**
 * The organisation's plans, newest first, a page at a time: GET /api/plans (optionally ?jobId=, ?limit= up to 200,
 * ?after= the `next` cursor of the page before). `{ plans, next }`: `next` is null on the last page.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const rawJobId = new URL(request.url).searchParams.get("jobId");
  let jobId: number | undefined;
  if (rawJobId !== null) {
    jobId = Number(rawJobId);
    if (!Number.isSafeInteger(jobId) || jobId <= 0)
      return Response.json({ error: "jobId must be a job's number.", issues: [] }, { status: 400 });
  }
  const url = new URL(request.url);
  const rawLimit = url.searchParams.get("limit");
  const limit = rawLimit === null ? 100 : Number(rawLimit);
  if (!Number.isSafeInteger(limit) || limit < 1 || limit > 200)
    return Response.json({ error: "limit must be a whole number from 1 to 200.", issues: [] }, { status: 400 });
  const rawAfter = url.searchParams.get("after");
  const pageRequest = readPageRequest(url, PLAN_LIST_KEYS, limit);
  if (rawAfter !== null && pageRequest.cursor === null)
    return Response.json({ error: "after must be the next cursor of an earlier page.", issues: [] }, { status: 400 });
  // Only forwards: a client follows `next` from the first page.
  const page = await listPlansPage(user.organisationId, { ...pageRequest, towards: "next" }, { jobId });
  return Response.json({
    plans: page.rows.map((p) => ({
      id: p.id,
      title: p.title,
      status: p.status,
      revision: p.revision,
      version: p.version,
      jobId: p.jobId,
    })),
    next: page.next,
  });
}

export async function action({ request }: Route.ActionArgs) {
  await requireUser(request);
  return Response.json(
    { error: "Plans are created from a job's page; this address only lists them." },
    { status: 405, headers: { Allow: "GET" } },
  );
}
