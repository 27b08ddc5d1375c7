import { data, redirect } from "react-router";
import { getOrganisationToday } from "~/models/organisation.server";
import { parseForm } from "~/utils/forms";
import { GEAR_STATUS_LABELS } from "~/gear/kinds";
import { sendDefectReportMail } from "~/gear/mail.server";
import { defectReportSchema, examinationSchema, statusChangeSchema } from "~/gear/schema";
import { recordExamination } from "~/gear/examinations.server";
import { changeGearStatus, reportGearDefect } from "~/gear/lifecycle.server";
import { getGearItem, type GearItem } from "~/models/gear-item.server";
import type { SessionUser } from "~/models/user.server";
import { watchAllocatedGear } from "~/plans/live-state.server";
import { flashNotice } from "~/utils/session.server";
import { checkUpload, readUploadForm, uploadedFile } from "~/utils/uploads.server";

export type GearIntent = "examination" | "status" | "defect";

/** The organisation's item with the id in the URL, or a 404 with a sentence (the item page and its edit form). */
export async function requireGearItem(organisationId: number, rawId: string | undefined) {
  const id = Number(rawId);
  const item = Number.isInteger(id) ? await getGearItem(organisationId, id) : null;
  if (!item) throw data({ message: "There is no such item in your organisation's register." }, { status: 404 });
  return item;
}
type Errors = Record<string, string[]>;

function refuse(intent: GearIntent, errors: Errors, status = 400) {
  return data({ intent, errors }, { status });
}

function forbidden() {
  return data(
    { message: "This needs the Admin role. Ask your organisation's admin if you should have it.", roles: ["admin"] },
    { status: 403 },
  );
}

async function backToItem(request: Request, item: GearItem, notice: string) {
  return redirect(`/gear/${item.id}`, { headers: { "Set-Cookie": await flashNotice(request, notice) } });
}

/** The item page's actions: record an examination and change status (admins), report a defect (anyone signed in). */
export async function handleGearItemAction(request: Request, user: SessionUser, item: GearItem) {
  const upload = await readUploadForm(request, { maxFiles: 1 });
  if (!upload.ok) return refuse("examination", { certificate: [upload.message] }, upload.status);
  const formData = upload.formData;
  const intent = formData.get("intent");
  const isAdmin = user.roles.includes("admin");

  if (intent === "examination") {
    if (!isAdmin) throw forbidden();
    const form = parseForm(examinationSchema, formData);
    const errors: Errors = form.ok ? {} : { ...form.errors };
    if (form.ok && form.data.examinedOn > (await getOrganisationToday(user.organisationId)))
      errors.examinedOn = ["An examination cannot be dated in the future."];
    const file = uploadedFile(formData, "certificate");
    const checked = file ? await checkUpload(file, ["pdf"]) : null;
    if (checked && !checked.ok) errors.certificate = [checked.message];
    if (!form.ok || Object.keys(errors).length) return refuse("examination", errors);
    const recorded = await watchAllocatedGear(
      user.organisationId,
      item.id,
      () => recordExamination(user.organisationId, item.id, form.data, checked?.ok ? checked.upload : null, user.id),
      request,
    );
    if (!recorded) throw data({ message: "There is no such item in your organisation's register." }, { status: 404 });
    if (!recorded.ok) return refuse("examination", { [recorded.field]: [recorded.message] });
    const notice =
      form.data.result === "pass" && form.data.defectUrgency !== "immediate"
        ? `Examination recorded: pass.${recorded.released ? " The item is back in service." : ""} Next thorough examination due ${recorded.nextDueOn}.`
        : `Examination recorded: FAIL.${recorded.quarantined ? " The item is quarantined." : ""} Next due ${recorded.nextDueOn}.`;
    return backToItem(request, item, notice);
  }

  if (intent === "status") {
    if (!isAdmin) throw forbidden();
    const form = parseForm(statusChangeSchema, formData);
    if (!form.ok) return refuse("status", form.errors);
    const result = await watchAllocatedGear(
      user.organisationId,
      item.id,
      () => changeGearStatus(user.organisationId, item.id, form.data, user.id),
      request,
    );
    if (!result.ok) return refuse("status", { status: [result.message] });
    return backToItem(request, item, `${item.itemCode} is now ${GEAR_STATUS_LABELS[form.data.status].toLowerCase()}.`);
  }

  if (intent === "defect") {
    const form = parseForm(defectReportSchema, formData);
    if (!form.ok) return refuse("defect", form.errors);
    const report = await watchAllocatedGear(
      user.organisationId,
      item.id,
      () => reportGearDefect(user.organisationId, item.id, form.data.defect, { id: user.id, name: user.name }),
      request,
    );
    if (!report) throw data({ message: "There is no such item in your organisation's register." }, { status: 404 });
    let mailNote: string;
    try {
      const sent = await sendDefectReportMail(
        user.organisationId,
        item,
        { defect: form.data.defect, reporterName: user.name, quarantined: report.quarantined },
        request,
      );
      mailNote = sent
        ? ` Your organisation's admins have been e-mailed.`
        : " Your organisation has no active admin to e-mail; tell your supervisor.";
    } catch {
      mailNote = " The e-mail to your admins could not be sent; tell them directly.";
    }
    const state = report.quarantined
      ? `${item.itemCode} is quarantined: do not use it.`
      : `The report is recorded on ${item.itemCode}.`;
    return backToItem(request, item, `${state}${mailNote}`);
  }

  return refuse("defect", {
    _form: ["Choose what to do: record an examination, change the status or report a defect."],
  });
}
