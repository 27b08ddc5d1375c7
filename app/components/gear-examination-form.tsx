// Recording a thorough examination as the examiner's report writes it: kind, report number, examiner
// and their organisation, result, defects with their urgency, the next due date within the rules'
// interval (or a named written scheme) and the certificate.
import { useState } from "react";
import { Form, useNavigation } from "react-router";
import { Button, Field, SelectField, TextAreaField } from "~/components/ui/form";
import { defaultNextDue, examinationIntervalMonths, type ExaminationIntervals } from "~/gear/due";
import {
  DEFECT_URGENCIES,
  DEFECT_URGENCY_LABELS,
  EXAMINATION_KIND_LABELS,
  EXAMINATION_KINDS,
  type DefectUrgency,
  type ExaminationKind,
  GEAR_KIND_INFO,
  type GearKind,
} from "~/gear/kinds";
import { guardFileSize } from "~/components/ui/file-size";
import { MAX_UPLOAD_BYTES } from "~/utils/file-type";
import { isIsoDate } from "~/utils/dates";

type Errors = Record<string, string[] | undefined>;

export function ExaminationForm({
  kind,
  today,
  intervals,
  errors,
}: {
  kind: GearKind;
  today: string;
  intervals: ExaminationIntervals;
  errors: Errors;
}) {
  const [examinedOn, setExaminedOn] = useState(today);
  const [nextDueOn, setNextDueOn] = useState(defaultNextDue(kind, today, intervals));
  const [nextDueEdited, setNextDueEdited] = useState(false);
  const [examKind, setExamKind] = useState<ExaminationKind>("periodic");
  const [result, setResult] = useState<"pass" | "fail">("pass");
  const [urgency, setUrgency] = useState<DefectUrgency>("none");
  const navigation = useNavigation();
  const busy = navigation.state === "submitting" && navigation.formData?.get("intent") === "examination";
  const months = examinationIntervalMonths(kind, intervals);
  const latest = isIsoDate(examinedOn) ? defaultNextDue(kind, examinedOn, intervals) : null;
  const beyondInterval = latest !== null && isIsoDate(nextDueOn) && nextDueOn > latest;
  const rule = intervals.source ?? "LOLER 1998 reg 9(3)(a)";
  const what = GEAR_KIND_INFO[kind].accessory ? "a lifting accessory" : "lifting equipment";
  const showDefects = result === "fail" || urgency !== "none";
  return (
    <Form method="post" encType="multipart/form-data" className="mt-4 space-y-4 border-t border-rule pt-4">
      <h3>Record a thorough examination</h3>
      <input type="hidden" name="intent" value="examination" />
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Kind of examination"
          name="kind"
          value={examKind}
          onChange={(e) => setExamKind(e.target.value as ExaminationKind)}
          options={EXAMINATION_KINDS.map((k) => ({ value: k, label: EXAMINATION_KIND_LABELS[k] }))}
          errors={errors.kind}
        />
        <Field
          label="Examined on"
          name="examinedOn"
          type="date"
          max={today}
          value={examinedOn}
          onChange={(e) => {
            setExaminedOn(e.target.value);
            if (!nextDueEdited && isIsoDate(e.target.value))
              setNextDueOn(defaultNextDue(kind, e.target.value, intervals));
          }}
          errors={errors.examinedOn}
          required
        />
        <Field label="Report number" name="reportNumber" errors={errors.reportNumber} maxLength={100} />
        <Field label="Examiner (competent person)" name="examiner" errors={errors.examiner} required maxLength={200} />
        <Field
          label="Examiner's organisation"
          name="examinerOrganisation"
          errors={errors.examinerOrganisation}
          maxLength={200}
        />
      </div>
      <fieldset>
        <legend className="text-sm font-medium">Result</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {(["pass", "fail"] as const).map((r) => (
            <label key={r} className="flex min-h-11 items-center gap-2 text-sm">
              <input type="radio" name="result" value={r} checked={result === r} onChange={() => setResult(r)} />
              {r === "pass" ? "Pass" : "Fail (the item is quarantined)"}
            </label>
          ))}
        </div>
        {errors.result && <p className="mt-1 text-sm text-fail">{errors.result.join(" ")}</p>}
      </fieldset>
      <SelectField
        label="Defects found"
        name="defectUrgency"
        value={urgency}
        onChange={(e) => setUrgency(e.target.value as DefectUrgency)}
        options={DEFECT_URGENCIES.map((u) => ({ value: u, label: DEFECT_URGENCY_LABELS[u] }))}
        errors={errors.defectUrgency}
      />
      {showDefects && (
        <TextAreaField
          label="The defects, as the report states them"
          name="defects"
          errors={errors.defects}
          maxLength={4000}
          required
        />
      )}
      {urgency === "by_date" && (
        <Field
          label="Put right by"
          name="defectsDueBy"
          type="date"
          min={examinedOn}
          errors={errors.defectsDueBy}
          required
        />
      )}
      <Field
        label="Next examination due"
        name="nextDueOn"
        type="date"
        value={nextDueOn}
        onChange={(e) => {
          setNextDueOn(e.target.value);
          setNextDueEdited(true);
        }}
        errors={errors.nextDueOn}
        hint={`At most ${months} months for ${what} (${rule})${latest ? `: by ${latest}` : ""}. A longer interval needs a written examination scheme.`}
      />
      {(examKind === "scheme" || beyondInterval) && (
        <Field
          label="Written examination scheme"
          name="schemeReference"
          errors={errors.schemeReference}
          maxLength={200}
          required
          hint="The scheme's title and revision, as drawn up by the competent person."
        />
      )}
      <Field
        label="Certificate (PDF, up to 10 MB)"
        name="certificate"
        type="file"
        accept="application/pdf,.pdf"
        errors={errors.certificate}
        onChange={guardFileSize(MAX_UPLOAD_BYTES)}
      />
      <Button type="submit" disabled={busy}>
        {busy ? "Recording…" : "Record examination"}
      </Button>
    </Form>
  );
}
