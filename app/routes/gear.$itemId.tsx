import { Form } from "react-router";
import type { Route } from "./+types/gear.$itemId";
import { handleGearItemAction, requireGearItem, type GearIntent } from "./gear.$itemId.server";
import { DueLabel, StatusLabel, formatWll } from "~/components/gear-labels";
import { ExaminationForm } from "~/components/gear-examination-form";
import { Button, Card, EmptyState, FormError, PageHeader, SelectField, TextAreaField } from "~/components/ui/form";
import { dueState, examinationIntervalMonths, intervalsOf } from "~/gear/due";
import {
  DEFECT_URGENCY_LABELS,
  EXAMINATION_KIND_LABELS,
  type DefectUrgency,
  type ExaminationKind,
  GEAR_KIND_INFO,
  GEAR_STATUS_LABELS,
  GEAR_STATUSES,
  SPEC_FIELD_LABELS,
  type GearStatus,
} from "~/gear/kinds";
import { formatDateTime } from "~/utils/dates";
import { getOrganisationRuleSet, getOrganisationTimeZone, getOrganisationToday } from "~/models/organisation.server";
import { listExaminations } from "~/models/examination.server";
import { listGearHistory, type GearHistoryEntry } from "~/gear/history.server";
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
  const [today, timeZone, ruleSet, tables] = await Promise.all([
    getOrganisationToday(user.organisationId),
    getOrganisationTimeZone(user.organisationId),
    getOrganisationRuleSet(user.organisationId),
    getReferenceTables(),
  ]);
  const rules = ruleSetRow(tables, ruleSet);
  return {
    today,
    timeZone,
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
      kind: e.kind as ExaminationKind,
      examinedOn: e.examinedOn,
      reportNumber: e.reportNumber,
      examiner: e.examiner,
      examinerOrganisation: e.examinerOrganisation,
      result: e.result,
      defects: e.defects,
      defectUrgency: e.defectUrgency as DefectUrgency,
      defectsDueBy: e.defectsDueBy,
      schemeReference: e.schemeReference,
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
    case "examination recorded": {
      const kind = typeof d.kind === "string" && d.kind in EXAMINATION_KIND_LABELS ? d.kind : "periodic";
      const report = d.reportNumber ? `, report ${String(d.reportNumber)}` : "";
      const by = [d.examiner, d.examinerOrganisation].filter(Boolean).map(String).join(", ");
      return `Thorough examination (${EXAMINATION_KIND_LABELS[kind as keyof typeof EXAMINATION_KIND_LABELS].toLowerCase()}) on ${String(d.examinedOn)} by ${by}${report}: ${d.result === "fail" ? "FAIL" : "pass"}; next due ${String(d.nextDueOn)}${d.schemeReference ? ` under ${String(d.schemeReference)}` : ""}.`;
    }
    case "status changed":
      return `Status ${status(d.from)} → ${status(d.to)}. Reason: ${String(d.reason)}`;
    case "returned to service":
      return `Returned to service: ${String(d.reason)}`;
    case "defect reported":
      return d.from !== d.to
        ? `Defect reported; status ${status(d.from)} → ${status(d.to)}. ${String(d.defect)}`
        : `Defect reported (status stays ${status(d.to)}): ${String(d.defect)}`;
    default:
      return entry.action;
  }
}

export default function GearItemPage({ loaderData, actionData }: Route.ComponentProps) {
  const { item, examinations, history, canAdmin, today, timeZone, units, intervals, ruleSetName } = loaderData;
  const when = (iso: string) => formatDateTime(iso, timeZone);
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
              <DueLabel state={item.dueState} status={item.status} />
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
                      <th scope="col">Kind and report</th>
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
                          {EXAMINATION_KIND_LABELS[e.kind]}
                          {e.reportNumber && <span className="block text-xs">Report {e.reportNumber}</span>}
                          {e.schemeReference && <span className="block text-xs">Scheme: {e.schemeReference}</span>}
                        </td>
                        <td>
                          {e.examiner}
                          {e.examinerOrganisation && <span className="block text-xs">{e.examinerOrganisation}</span>}
                          <span className="block text-xs text-ink-soft">recorded by {e.recordedBy}</span>
                        </td>
                        <td>
                          {e.result === "pass" ? (
                            <span className="font-semibold text-pass">Pass</span>
                          ) : (
                            <span className="font-bold text-fail">FAIL</span>
                          )}
                          {e.defects && (
                            <span className="block text-xs">
                              {e.defects}
                              {e.defectUrgency !== "none" && (
                                <span className="block font-semibold">
                                  {e.defectUrgency === "by_date" && e.defectsDueBy
                                    ? `Put right by ${e.defectsDueBy}`
                                    : DEFECT_URGENCY_LABELS[e.defectUrgency]}
                                </span>
                              )}
                            </span>
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
            {canAdmin && item.status !== "withdrawn" && (
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
                at most {examinationIntervalMonths(item.kind, intervals)} months (
                {info.accessory ? "lifting accessory" : "lifting equipment"}, {ruleSetName}: {intervals.source}) unless
                a written examination scheme says otherwise
              </dd>
            </dl>
          </Card>

          {canAdmin && item.status !== "withdrawn" && (
            <Card title="Take out of use">
              <Form method="post" className="space-y-3">
                <input type="hidden" name="intent" value="status" />
                <FormError message={errorsFor("status").status?.join(" ")} />
                <p className="text-sm text-ink-soft">
                  {item.status === "quarantined"
                    ? "A quarantined item returns to service only through a passed thorough examination recorded above. Withdrawing it is final: it stays on record but can never be allocated again."
                    : "Quarantine the item until it is examined, or withdraw it for good (final: it stays on record but can never be allocated again)."}
                </p>
                <SelectField
                  label="New status"
                  name="status"
                  defaultValue={item.status === "in_service" ? "quarantined" : "withdrawn"}
                  options={GEAR_STATUSES.filter((s) => s !== item.status && s !== "in_service").map((s) => ({
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
