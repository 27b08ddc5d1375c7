import type { Route } from "./+types/api.ping";
import { requireUser } from "~/utils/session.server";

/** A trivial signed-in JSON route: a health check, and the baseline the benchmark compares against. */
export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  return Response.json({ ok: true });
}
