import type { Route } from "./+types/api.solve";
import { getOrganisationRuleSet, getOrganisationToday } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { requireUser } from "~/utils/session.server";
import { handleSolve } from "~/statics/api";

/** Bodies larger than this are refused before parsing (a solve body is a few hundred bytes). */
const MAX_BODY_BYTES = 64 * 1024;

function badRequest(error: string) {
  return Response.json({ error, issues: [] }, { status: 400 });
}

export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  return Response.json(
    { error: "POST a JSON body to /api/solve; see the contributor guide for its shape." },
    { status: 405, headers: { Allow: "POST" } },
  );
}

/** Solves a hanging load (and checks its rigging when described). Stateless: nothing is stored. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  if (request.method !== "POST")
    return Response.json({ error: "Only POST is allowed here." }, { status: 405, headers: { Allow: "POST" } });
  const declared = Number(request.headers.get("Content-Length") ?? "0");
  if (declared > MAX_BODY_BYTES) return badRequest("The body is too large for a solve request (64 KB at most).");
  const text = await request.text();
  if (text.length > MAX_BODY_BYTES) return badRequest("The body is too large for a solve request (64 KB at most).");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return badRequest("The body is not valid JSON. Send the load, lift points and hook (or leg lengths) as JSON.");
  }
  const tables = await getReferenceTables();
  const result = handleSolve(body, tables, {
    todayIso: await getOrganisationToday(user.organisationId),
    defaultRuleSet: await getOrganisationRuleSet(user.organisationId),
  });
  return Response.json(result.body, { status: result.status });
}
