import { useState } from "react";
import { Form, useNavigation } from "react-router";
import type { Route } from "./+types/gear.$itemId";
import { handleGearItemAction, requireGearItem, type GearIntent } from "./gear.$itemId.server";
import { DueLabel, StatusLabel, formatWll } from "~/components/gear-labels";
import {
  Button,
  Card,
  EmptyState,
  Field,
  FormError,
  PageHeader,
  SelectField,
  TextAreaField,
} from "~/components/ui/form";
import {
  defaultNextDue,
  dueState,
  examinationIntervalMonths,
  intervalsOf,
  isIsoDate,
  todayIso,
  type ExaminationIntervals,
} from "~/gear/due";
import {
  GEAR_KIND_INFO,
  GEAR_STATUS_LABELS,
  GEAR_STATUSES,
  SPEC_FIELD_LABELS,
  type GearKind,
  type GearStatus,
} from "~/gear/kinds";
import { listExaminations } from "~/models/examination.server";
import { listGearHistory, type GearHistoryEntry } from "~/models/gear-item.server";
import { getOrganisationRuleSet } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { ruleSetRow } from "~/statics/rule-sets";
import { formatMass } from "~/utils/format";
import { hasAnyRole } from "~/utils/roles";
import { requireUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.item.itemCode ?? "Gear"} · Plumbline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const item = await requireGearItem(user.organisationId, params.itemId);
  const [examinations, history] = await Promise.all([
    listExaminations(user.organisationId, item.id),
    listGearHistory(user.organisationId, item.id),
  ]);
  const today = todayIso();
  const rules = ruleSetRow(await getReferenceTables(), await getOrganisationRuleSet(user.organisationId));
  return {
    today,
    units: user.units,
    intervals: intervalsOf(rules),
    ruleSetName: rules.name,
    canAdmin: hasAnyRole(user, "admin"),
    item: {
      id: item.id,
      itemCode: item.itemCode,
      kind: item.kind,
      description: item.description,
      manufacturer: item.manufacturer,
      serial: item.serial,
      wllValue: item.wllValue,
      wllUnit: item.wllUnit,
      wllKg: item.wllKg,
      specs: GEAR_KIND_INFO[item.kind].fields.map((f) => ({ label: SPEC_FIELD_LABELS[f], value: item[f] })),
      homeSite: item.homeSite ? { id: item.homeSite.id, name: item.homeSite.name } : null,
      status: item.status,
      statusReason: item.statusReason,
      statusChangedAt: item.statusChangedAt?.toISOString() ?? null,
      statusChangedBy: item.statusChanger?.name ?? null,
      lastExaminedOn: item.lastExaminedOn,
      nextDueOn: item.nextDueOn,
      dueState: dueState(item.nextDueOn, today),
      massKg: item.massKg,
    },
    examinations: examinations.map((e) => ({
      id: e.id,
      examinedOn: e.examinedOn,
      examiner: e.examiner,
      result: e.result,
      defects: e.defects,
      nextDueOn: e.nextDueOn,
      recordedBy: e.recorder?.name ?? "",
      certificate: e.certificate ? { id: e.certificate.id, name: e.certificate.originalName } : null,
    })),
    history,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUser(request);
  const item = await requireGearItem(user.organisationId, params.itemId);
  return handleGearItemAction(request, user, item);
}

function when(iso: string) {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

function describeEvent(entry: GearHistoryEntry): string {
  const d = entry.details;
  const status = (s: unknown) =>
    typeof s === "string" && s in GEAR_STATUS_LABELS ? GEAR_STATUS_LABELS[s as GearStatus] : String(s);
  switch (entry.action) {
    case "created":
      return "Added to the register.";
    case "imported":
      return `Added by CSV import (${String(d.fileName ?? "file")}).`;
    case "updated":
      return `Details edited: ${Array.isArray(d.fields) ? d.fields.join(", ") : ""}.`;
    case "updated by import":
      return `Updated by CSV import (${String(d.fileName ?? "file")}): ${Array.isArray(d.fields) ? d.fields.join(", ") : ""}.`;
    case "examination recorded":
      return `Thorough examination on ${String(d.examinedOn)} by ${String(d.examiner)}: ${d.result === "fail" ? "FAIL" : "pass"}; next due ${String(d.nextDueOn)}.`;
    case "status changed":
      return `Status ${status(d.from)} → ${status(d.to)}. Reason: ${String(d.reason)}`;
    case "defect reported":
      return d.from !== d.to
        ? `Defect reported; status ${status(d.from)} → ${status(d.to)}. ${String(d.defect)}`
        : `Defect reported (status stays ${status(d.to)}): ${String(d.defect)}`;
    default:
      return entry.action;
  }
}

export default function GearItemPage({ loaderData, actionData }: Route.ComponentProps) {
  const { item, examinations, history, canAdmin, today, units, intervals, ruleSetName } = loaderData;
  const errorsFor = (intent: GearIntent): Record<string, string[] | undefined> =>
    actionData && "intent" in actionData && actionData.intent === intent ? actionData.errors : {};
  const info = GEAR_KIND_INFO[item.kind];
  return (
    <>
      <PageHeader title={item.itemCode} lead={[info.label, item.description].filter(Boolean).join(" · ")}>
        <a href="/gear" className="px-2 py-2 text-sm">
          Back to the register
        </a>
        {canAdmin && (
          <a
            href={`/gear/${item.id}/edit`}
            className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline"
          >
            Edit item
          </a>
        )}
      </PageHeader>

      {item.status !== "in_service" && (
        <div role="alert" className="mb-6 rounded border border-fail/50 bg-fail-soft p-3 text-sm text-fail">
          <p className="font-bold">
            {item.status === "quarantined"
              ? "QUARANTINED: do not use this item."
              : "WITHDRAWN from service: do not use this item."}
          </p>
          {item.statusReason && <p className="mt-1">Reason: {item.statusReason}</p>}
          {item.statusChangedAt && (
            <p className="mt-1 text-xs">
              {item.statusChangedBy ?? "Someone"}, {when(item.statusChangedAt)}
            </p>
          )}
        </div>
      )}

      <div className="grid gap-6 md:grid-cols-3">
        <div className="min-w-0 space-y-6 md:col-span-2">
          <Card title="Thorough examinations">
            <div className="mb-3 flex flex-wrap items-center gap-2 text-sm">
              <span>Next due: {item.nextDueOn ?? "—"}</span>
              <DueLabel state={item.dueState} />
            </div>
            {examinations.length === 0 ? (
              <EmptyState title="Never examined">
                No thorough examination is recorded; the item must not be used until one is.
              </EmptyState>
            ) : (
              <div className="overflow-x-auto">
                <table>
                  <thead>
                    <tr>
                      <th scope="col">Examined</th>
                      <th scope="col">Examiner</th>
                      <th scope="col">Result</th>
                      <th scope="col">Next due</th>
                      <th scope="col">Certificate</th>
                    </tr>
                  </thead>
                  <tbody>
                    {examinations.map((e) => (
                      <tr key={e.id}>
                        <td className="whitespace-nowrap">{e.examinedOn}</td>
                        <td>
                          {e.examiner}
                          <span className="block text-xs text-ink-soft">recorded by {e.recordedBy}</span>
                        </td>
                        <td>
                          {e.result === "pass" ? (
                            <span className="font-semibold text-pass">Pass</span>
                          ) : (
                            <>
                              <span className="font-bold text-fail">FAIL</span>
                              <span className="block text-xs">{e.defects}</span>
                            </>
                          )}
                        </td>
                        <td className="whitespace-nowrap">{e.nextDueOn}</td>
                        <td>
                          {e.certificate ? (
                            <a href={`/files/${e.certificate.id}`}>{e.certificate.name}</a>
                          ) : (
                            <span className="text-ink-soft">none</span>
                          )}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
            {canAdmin && (
              <ExaminationForm kind={item.kind} today={today} intervals={intervals} errors={errorsFor("examination")} />
            )}
          </Card>

          <Card title="History">
            {history.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing recorded yet.</p>
            ) : (
              <ol className="space-y-2 text-sm">
                {[...history].reverse().map((h) => (
                  <li key={h.id} className="border-b border-rule/60 pb-2 last:border-0">
                    <span className="block text-xs text-ink-soft">
                      {when(h.at)} · {h.who}
                    </span>
                    {describeEvent(h)}
                  </li>
                ))}
              </ol>
            )}
          </Card>
        </div>

        <div className="order-first min-w-0 space-y-6 md:order-none">
          <Card title="Item">
            <dl className="grid grid-cols-2 gap-x-3 gap-y-2 text-sm">
              <dt className="text-ink-soft">WLL (marked)</dt>
              <dd className="font-semibold">{formatWll(item.wllValue, item.wllUnit, item.wllKg)}</dd>
              <dt className="text-ink-soft">Status</dt>
              <dd>
                <StatusLabel status={item.status} />
              </dd>
              {item.specs.map((s) => (
                <Spec key={s.label} label={s.label} value={s.value} />
              ))}
              <Spec label="Manufacturer" value={item.manufacturer} />
              <Spec label="Serial number" value={item.serial} />
              <dt className="text-ink-soft">Own mass</dt>
              <dd>{item.massKg === null ? "not recorded" : formatMass(item.massKg, units)}</dd>
              <dt className="text-ink-soft">Home site</dt>
              <dd>{item.homeSite ? item.homeSite.name : "none"}</dd>
              <dt className="text-ink-soft">Examination interval</dt>
              <dd>
                {examinationIntervalMonths(item.kind, intervals)} months (
                {info.accessory ? "lifting accessory" : "lifting equipment"}, {ruleSetName}: {intervals.source})
              </dd>
            </dl>
          </Card>

          {canAdmin && (
            <Card title="Change status">
              <Form method="post" className="space-y-3">
                <input type="hidden" name="intent" value="status" />
                <FormError message={errorsFor("status").status?.join(" ")} />
                <SelectField
                  label="New status"
                  name="status"
                  defaultValue={item.status === "in_service" ? "quarantined" : "in_service"}
                  options={GEAR_STATUSES.filter((s) => s !== item.status).map((s) => ({
                    value: s,
                    label: GEAR_STATUS_LABELS[s],
                  }))}
                />
                <TextAreaField label="Reason" name="reason" errors={errorsFor("status").reason} maxLength={1000} />
                <Button type="submit" tone="secondary">
                  Change status
                </Button>
              </Form>
            </Card>
          )}

          <Card title="Report a defect">
            <Form method="post" className="space-y-3" id="report-defect">
              <input type="hidden" name="intent" value="defect" />
              <FormError message={errorsFor("defect")._form?.join(" ")} />
              <p className="text-sm text-ink-soft">
                Found damage, wear or a missing mark? Report it:{" "}
                {item.status === "in_service"
                  ? "the item is quarantined at once and your admins are e-mailed."
                  : "your admins are e-mailed."}
              </p>
              <TextAreaField label="What is wrong" name="defect" errors={errorsFor("defect").defect} maxLength={2000} />
              <Button type="submit" tone="danger">
                Report defect
              </Button>
            </Form>
          </Card>
        </div>
      </div>
    </>
  );
}

function Spec({ label, value }: { label: string; value: string | number | null }) {
  return (
    <>
      <dt className="text-ink-soft">{label}</dt>
      <dd>{value === null || value === "" ? "—" : String(value)}</dd>
    </>
  );
}

function ExaminationForm({
  kind,
  today,
  intervals,
  errors,
}: {
  kind: GearKind;
  today: string;
  intervals: ExaminationIntervals;
  errors: Record<string, string[] | undefined>;
}) {
  const [examinedOn, setExaminedOn] = useState(today);
  const [nextDueOn, setNextDueOn] = useState(defaultNextDue(kind, today, intervals));
  const [nextDueEdited, setNextDueEdited] = useState(false);
  const [result, setResult] = useState<"pass" | "fail">("pass");
  const navigation = useNavigation();
  const busy = navigation.state === "submitting" && navigation.formData?.get("intent") === "examination";
  const months = examinationIntervalMonths(kind, intervals);
  return (
    <Form method="post" encType="multipart/form-data" className="mt-4 space-y-4 border-t border-rule pt-4">
      <h3>Record a thorough examination</h3>
      <input type="hidden" name="intent" value="examination" />
      <div className="grid gap-4 sm:grid-cols-2">
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
        <Field label="Examiner (competent person)" name="examiner" errors={errors.examiner} required maxLength={200} />
      </div>
      <fieldset>
        <legend className="text-sm font-medium">Result</legend>
        <div className="mt-1 flex gap-4">
          {(["pass", "fail"] as const).map((r) => (
            <label key={r} className="flex items-center gap-2 text-sm">
              <input type="radio" name="result" value={r} checked={result === r} onChange={() => setResult(r)} />
              {r === "pass" ? "Pass" : "Fail (the item will be quarantined)"}
            </label>
          ))}
        </div>
      </fieldset>
      {result === "fail" && (
        <TextAreaField label="Defects found" name="defects" errors={errors.defects} maxLength={4000} required />
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
        hint={`Default ${months} months for ${GEAR_KIND_INFO[kind].accessory ? "a lifting accessory" : "lifting equipment"} (${intervals.source ?? "LOLER 1998 reg 9(3)"}). Change it only to follow your examination scheme.`}
      />
      <Field
        label="Certificate (PDF, up to 10 MB)"
        name="certificate"
        type="file"
        accept="application/pdf,.pdf"
        errors={errors.certificate}
      />
      <Button type="submit" disabled={busy}>
        {busy ? "Recording…" : "Record examination"}
      </Button>
    </Form>
  );
}
