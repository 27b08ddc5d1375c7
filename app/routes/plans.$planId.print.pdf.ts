import { redirect } from "react-router";
import type { Route } from "./+types/plans.$planId.print.pdf";
import { recordAudit } from "~/models/audit-event.server";
import { printSealedPlan } from "~/plans/pdf/sealed-body.server";
import { buildPrintablePlan } from "~/plans/printable.server";
import { requireUser } from "~/utils/session.server";

/**
 * GET /plans/:planId/print.pdf: the sealed plan of the current approved revision (or of the completed
 * one) as a PDF. A plan that is not printable is sent to /plans/:planId/print, which says why.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const planId = Number(params.planId);
  const outcome = await buildPrintablePlan(user, planId, request);
  if (!outcome.ok) {
    if (outcome.status === 404)
      return new Response(outcome.message, { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });
    throw redirect(`/plans/${planId}/print`);
  }
  const bytes = await printSealedPlan(outcome.printable, outcome.revisionId);
  await recordAudit({
    organisationId: user.organisationId,
    userId: user.id,
    entity: "plan",
    entityId: planId,
    action: "printed",
    details: {
      revision: outcome.revision,
      fingerprint: outcome.printable.fingerprint,
      ...(outcome.printable.live ? { fitToLift: outcome.printable.live.fit } : {}),
    },
  });
  const name = `lift-plan-${planId}-rev-${outcome.revision}.pdf`;
  return new Response(bytes as Uint8Array<ArrayBuffer>, {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `inline; filename="${name}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
