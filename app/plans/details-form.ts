// The details form (sequence, hazards, people, zone, communication, clearance, lift date) to a PlanDetails.
import { detailsSchema, type PlanDetails } from "~/plans/document";
import { fromDisplayLength, type Units } from "~/utils/format";

export type DetailsFormResult = { ok: true; data: PlanDetails } | { ok: false; errors: Record<string, string[]> };

/** Row indices present for a prefix ("step" -> [0, 1, 2]) from field names like step-0-title, in order. */
function rowIndices(formData: FormData, prefix: string): number[] {
  const re = new RegExp(`^${prefix}-(\\d{1,3})-`);
  const seen = new Set<number>();
  for (const key of formData.keys()) {
    const m = re.exec(key);
    if (m) seen.add(Number(m[1]));
  }
  return [...seen].sort((a, b) => a - b);
}

const str = (formData: FormData, key: string) => {
  const v = formData.get(key);
  return typeof v === "string" ? v.trim() : "";
};

/** Parses the details form; lengths are typed in the user's units. Rows left wholly blank are dropped. Errors are keyed like "sequence.1.title". */
export function parseDetailsForm(formData: FormData, units: Units): DetailsFormResult {
  const sequence = rowIndices(formData, "step")
    .map((i) => ({
      title: str(formData, `step-${i}-title`),
      holdPoint: formData.get(`step-${i}-hold`) === "on",
      notes: str(formData, `step-${i}-notes`),
    }))
    .filter((s) => s.title || s.notes);
  const hazards = rowIndices(formData, "hazard")
    .map((i) => ({ hazard: str(formData, `hazard-${i}-hazard`), control: str(formData, `hazard-${i}-control`) }))
    .filter((h) => h.hazard || h.control);
  const people = rowIndices(formData, "person")
    .map((i) => ({ name: str(formData, `person-${i}-name`), role: str(formData, `person-${i}-role`) }))
    .filter((p) => p.name);
  const clearanceText = str(formData, "floorClearance");
  const clearance = clearanceText === "" ? Number.NaN : Number(clearanceText);
  const errors: Record<string, string[]> = {};
  if (!Number.isFinite(clearance))
    errors.floorClearanceM = ["Enter how far the load's underside must rise above the floor, as a number."];
  const parsed = detailsSchema.safeParse({
    sequence,
    hazards,
    people,
    exclusionZone: str(formData, "exclusionZone"),
    communication: str(formData, "communication"),
    floorClearanceM: Number.isFinite(clearance) ? fromDisplayLength(clearance, units) : 0,
    ...(str(formData, "liftDate") ? { liftDate: str(formData, "liftDate") } : {}),
  });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = issue.path.map(String).join(".") || "_form";
      (errors[key] ??= []).push(issue.message);
    }
  }
  if (Object.keys(errors).length > 0 || !parsed.success) return { ok: false, errors };
  return { ok: true, data: parsed.data };
}
