import type { Route } from "./+types/gear.export.csv";
import { getOrganisationToday } from "~/models/organisation.server";
import { CSV_HEADERS } from "~/gear/csv-columns";
import { exportRow, toCsv } from "~/gear/csv";
import { dueState } from "~/gear/due";
import { listAllGearItems } from "~/models/gear-item.server";
import { requireUser } from "~/utils/session.server";

/** The whole register as CSV, in the format the import reads back (formula-looking cells neutralised). */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const today = await getOrganisationToday(user.organisationId);
  const items = await listAllGearItems(user.organisationId);
  const rows = items.map((item) =>
    exportRow({
      ...item.get({ plain: true }),
      homeSiteName: item.homeSite?.name ?? null,
      dueState: dueState(item.nextDueOn, today),
    }),
  );
  return new Response(toCsv([CSV_HEADERS, ...rows]), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="gear-register-${today}.csv"`,
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "private, no-store",
    },
  });
}
