import { parseForm, type FormResult } from "~/utils/forms";
import { jobSchema } from "~/sites-and-jobs/job-schema";
import { isWorkOrderTaken, type JobInput } from "~/models/job.server";
import { getSite } from "~/models/site.server";

/** Parses and checks a job form against the organisation's sites and work orders. */
export async function parseJobForm(
  organisationId: number,
  formData: FormData,
  exceptJobId?: number,
): Promise<FormResult<JobInput>> {
  const form = parseForm(jobSchema, formData);
  if (!form.ok) return form;
  if (!(await getSite(organisationId, form.data.siteId)))
    return { ok: false, errors: { siteId: ["Choose one of your sites."] } };
  if (await isWorkOrderTaken(organisationId, form.data.workOrder, exceptJobId)) {
    return { ok: false, errors: { workOrder: ["Another job already has that work order number."] } };
  }
  return form;
}
