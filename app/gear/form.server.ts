import { parseForm, type FormResult } from "~/utils/forms";
import { gearItemSchema, type GearItemInput } from "~/gear/schema";
import { isItemCodeTaken } from "~/models/gear-item.server";
import { getSite } from "~/models/site.server";

/** Parses and checks an item form against the organisation's sites and item ids. */
export async function parseGearItemForm(
  organisationId: number,
  formData: FormData,
  exceptItemId?: number,
): Promise<FormResult<GearItemInput>> {
  const form = parseForm(gearItemSchema, formData);
  const rawSite = formData.get("homeSiteId");
  const siteText = typeof rawSite === "string" ? rawSite.trim() : "";
  const siteId = siteText ? Number(siteText) : null;
  const siteOk = siteId === null || (Number.isInteger(siteId) && !!(await getSite(organisationId, siteId)));
  if (!form.ok || !siteOk) {
    const errors = form.ok ? {} : form.errors;
    if (!siteOk) errors.homeSiteId = ["Choose one of your sites, or none."];
    return { ok: false, errors };
  }
  if (await isItemCodeTaken(organisationId, form.data.itemCode, exceptItemId)) {
    return { ok: false, errors: { itemCode: ["Another item in the register already has that id."] } };
  }
  return { ok: true, data: { ...form.data, homeSiteId: siteId } };
}
