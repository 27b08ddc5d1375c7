import type { Route } from "./+types/api.plans.$planId";
import { getPlan } from "~/models/plan.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { planJson } from "~/plans/api.server";
import { describeIssue, planPutSchema, zodIssues } from "~/plans/document";
import { requireUser, requireUserWithRole } from "~/utils/session.server";

/** Bodies larger than this are refused before parsing (a plan document is a few kilobytes). */
const MAX_BODY_BYTES = 256 * 1024;

function badRequest(error: string, issues: unknown[] = []) {
  return Response.json({ error, issues }, { status: 400 });
}

function notFound() {
  return Response.json({ error: "There is no such plan in your organisation." }, { status: 404 });
}

/** GET /api/plans/:planId: the current revision's document, snapshot and server-computed results. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const found = await getPlan(user.organisationId, Number(params.planId));
  if (!found) return notFound();
  return Response.json(await planJson(user.organisationId, found));
}

/** PUT /api/plans/:planId: saves the draft's arrangement, rigging, details and title; results are recomputed here. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "PUT") {
    await requireUser(request);
    return Response.json({ error: "Use PUT to save a plan." }, { status: 405, headers: { Allow: "GET, PUT" } });
  }
  const user = await requireUserWithRole(request, "planner", "admin");
  const planId = Number(params.planId);
  const found = await getPlan(user.organisationId, planId);
  if (!found) return notFound();
  if (Number(request.headers.get("Content-Length") ?? "0") > MAX_BODY_BYTES)
    return badRequest("The body is too large for a plan (256 KB at most).");
  const text = await request.text();
  if (text.length > MAX_BODY_BYTES) return badRequest("The body is too large for a plan (256 KB at most).");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return badRequest("The body is not valid JSON. Send { version, title, arrangement, rigging, details } as JSON.");
  }
  const parsed = planPutSchema.safeParse(body);
  if (!parsed.success) {
    const issues = zodIssues(parsed.error);
    return badRequest(`The plan is not valid: ${describeIssue(issues[0]!)}`, issues);
  }
  const { version, load, ...document } = parsed.data;
  const saved = await savePlanRevision(user.organisationId, planId, version, document, user.id, load);
  switch (saved.status) {
    case "not-found":
      return notFound();
    case "stale":
      return Response.json(
        {
          error:
            "Someone else saved this plan after you loaded it. Your changes are not saved: reload to see theirs, then make yours again.",
          code: "stale",
          version: saved.version,
        },
        { status: 409 },
      );
    case "frozen":
      return Response.json(
        {
          error: `This revision is ${saved.planStatus.replace("_", " ")} and can no longer be edited.`,
          code: "frozen",
        },
        { status: 409 },
      );
    case "invalid":
      return badRequest(saved.error, saved.issues);
    case "saved": {
      const fresh = await getPlan(user.organisationId, planId);
      if (!fresh) return notFound();
      return Response.json(await planJson(user.organisationId, fresh));
    }
  }
}
