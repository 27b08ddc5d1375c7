import type { Route } from "./+types/gear.export.csv";
import { getOrganisationToday } from "~/models/organisation.server";
import { gearRegisterCsv } from "~/gear/export.server";
import { requireUser } from "~/utils/session.server";

/** The whole register as CSV, in the format the import reads back (formula-looking cells neutralised), streamed. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const today = await getOrganisationToday(user.organisationId);
  return new Response(gearRegisterCsv(user.organisationId, today), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="gear-register-${today}.csv"`,
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "private, no-store",
    },
  });
}
