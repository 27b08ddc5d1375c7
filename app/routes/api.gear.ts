import { z } from "zod";
import type { Route } from "./+types/api.gear";
import { safeText, searchText } from "~/utils/forms";
import { searchGearPicks } from "~/gear/picks.server";
import { getOrganisationRuleSet } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { requireUser } from "~/utils/session.server";

const querySchema = z.object({
  query: searchText().pipe(safeText().max(100, "The search is at most 100 characters.")).default(""),
  role: z
    .enum(["eyebolt", "shackle", "sling", "masterLink", "crane", "beam"], {
      error: "role is one of eyebolt, shackle, sling, masterLink, crane, beam.",
    })
    .optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** GET /api/gear?query=&role=: the organisation's gear as the plan editor's picker offers it (withdrawn items left out). */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const url = new URL(request.url);
  const parsed = querySchema.safeParse(Object.fromEntries(url.searchParams));
  if (!parsed.success)
    return Response.json(
      { error: parsed.error.issues[0]?.message ?? "The search is not valid.", issues: parsed.error.issues },
      { status: 400 },
    );
  const items = await searchGearPicks(
    user.organisationId,
    parsed.data,
    await getReferenceTables(),
    await getOrganisationRuleSet(user.organisationId),
  );
  return Response.json({ items });
}
