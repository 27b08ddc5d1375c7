import { redirect } from "react-router";
import type { Route } from "./+types/plans.$planId.lift-record.pdf";
import { recordAudit } from "~/models/audit-event.server";
import { buildPrintableLiftRecord } from "~/plans/lift-record-print.server";
import { buildLiftRecordPdf } from "~/plans/pdf/lift-record.server";
import { requireUser } from "~/utils/session.server";

/** GET /plans/:planId/lift-record.pdf: the record of the lift as a PDF; before there is one, back to the plan. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const planId = Number(params.planId);
  const outcome = await buildPrintableLiftRecord(user, planId, request);
  if (!outcome.ok) {
    if (outcome.status === 404)
      return new Response(outcome.message, { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });
    throw redirect(`/plans/${planId}`);
  }
  const bytes = await buildLiftRecordPdf(outcome.record);
  await recordAudit({
    organisationId: user.organisationId,
    userId: user.id,
    entity: "plan",
    entityId: planId,
    action: "lift record printed",
    details: { revision: outcome.revision },
  });
  return new Response(bytes as Uint8Array<ArrayBuffer>, {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `inline; filename="lift-record-${planId}-rev-${outcome.revision}.pdf"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
