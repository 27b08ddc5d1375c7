import type { Route } from "./+types/api.sync";
import { receiveSubmission } from "~/plans/offline-sync.server";
import { flashNotice, requireUser } from "~/utils/session.server";
import { readUploadForm } from "~/utils/uploads.server";

/**
 * Work made on a phone without signal arrives here, one piece per request, oldest first: a lift record (the lift
 * page's fields and photos) or a defect report, each with the phone's id for it and when it was made.
 */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const upload = await readUploadForm(request, { maxFiles: 3 });
  if (!upload.ok)
    return Response.json({ clientId: null, outcome: "invalid", message: upload.message }, { status: upload.status });
  const { status, ...answer } = await receiveSubmission(user, upload.formData, request);
  // A lift recorded now leaves a notice for the plan page the phone goes to next.
  const headers =
    answer.outcome === "recorded" && upload.formData.get("kind") === "lift"
      ? { "Set-Cookie": await flashNotice(request, answer.message) }
      : undefined;
  return Response.json(answer, { status, headers });
}
