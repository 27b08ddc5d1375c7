import { useState } from "react";
import { data, Form, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/plans.$planId.details";
import { Button, Card, FieldError, FormError, PageHeader } from "~/components/ui/form";
import { requireFormData } from "~/utils/forms";
import { getPlan } from "~/models/plan.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { parseDetailsForm } from "~/plans/details-form";
import {
  MAX_HAZARDS,
  MAX_PEOPLE,
  MAX_STEPS,
  PERSON_ROLE_LABELS,
  PERSON_ROLES,
  type PlanDetails,
} from "~/plans/document";
import { flashNotice, requireUserWithRole } from "~/utils/session.server";
import { inputNumber, lengthUnitLabel, toDisplayLength } from "~/utils/format";

const versionSchema = z.coerce.number().int().positive();

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Details of ${data?.title ?? "the plan"} · Plumbline` },
];

async function requirePlan(organisationId: number, rawId: string) {
  const found = await getPlan(organisationId, Number(rawId));
  if (!found) throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
  return found;
}

type Errors = Record<string, string[] | undefined>;

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const { plan, revision } = await requirePlan(user.organisationId, params.planId);
  return {
    id: plan.id,
    title: plan.title,
    version: revision.version,
    status: revision.status,
    details: revision.details,
    units: user.units,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "planner", "admin");
  const { plan, revision } = await requirePlan(user.organisationId, params.planId);
  const formData = await requireFormData(request);
  const version = versionSchema.safeParse(formData.get("version"));
  if (!version.success)
    return data(
      { errors: { _form: ["The form is missing its version; reload the page and try again."] } as Errors },
      { status: 400 },
    );
  const form = parseDetailsForm(formData, user.units);
  if (!form.ok) return data({ errors: form.errors as Errors }, { status: 400 });
  const saved = await savePlanRevision(
    user.organisationId,
    plan.id,
    version.data,
    { title: plan.title, arrangement: revision.arrangement, rigging: revision.rigging, details: form.data },
    user.id,
  );
  switch (saved.status) {
    case "not-found":
      throw data({ message: "There is no such plan in your organisation." }, { status: 404 });
    case "stale":
      return data(
        {
          errors: {
            _form: [
              "Someone else saved this plan while you were editing. Your changes are not saved: reload to see theirs, then make yours again.",
            ],
          } as Errors,
        },
        { status: 409 },
      );
    case "frozen":
      return data(
        { errors: { _form: ["This revision is no longer a draft and cannot be edited."] } as Errors },
        { status: 409 },
      );
    case "invalid":
      return data({ errors: { _form: [saved.error] } as Errors }, { status: 400 });
    case "saved":
      throw redirect(`/plans/${plan.id}`, {
        headers: { "Set-Cookie": await flashNotice(request, `${plan.title} is saved (version ${saved.version}).`) },
      });
  }
}

const input =
  "mt-1 block w-full rounded border border-rule bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-steel focus:ring-2 focus:ring-steel/30";

function move<T>(list: T[], from: number, to: number): T[] {
  if (to < 0 || to >= list.length) return list;
  const next = [...list];
  const [item] = next.splice(from, 1);
  next.splice(to, 0, item!);
  return next;
}

type Keyed<T> = T & { key: number };
let nextKey = 1;
const keyed = <T,>(rows: T[]): Array<Keyed<T>> => rows.map((r) => ({ ...r, key: nextKey++ }));

function RowButtons({
  index,
  count,
  onMove,
  onRemove,
  what,
}: {
  index: number;
  count: number;
  onMove: (to: number) => void;
  onRemove: () => void;
  what: string;
}) {
  return (
    <div className="flex gap-1">
      <Button
        type="button"
        tone="secondary"
        onClick={() => onMove(index - 1)}
        disabled={index === 0}
        aria-label={`Move ${what} up`}
      >
        ↑
      </Button>
      <Button
        type="button"
        tone="secondary"
        onClick={() => onMove(index + 1)}
        disabled={index === count - 1}
        aria-label={`Move ${what} down`}
      >
        ↓
      </Button>
      <Button type="button" tone="secondary" onClick={onRemove} aria-label={`Remove ${what}`}>
        Remove
      </Button>
    </div>
  );
}

export default function PlanDetailsPage({ loaderData, actionData }: Route.ComponentProps) {
  const { id, title, version, details, units, status } = loaderData;
  const errors: Errors = actionData?.errors ?? {};
  const [steps, setSteps] = useState(() => keyed<PlanDetails["sequence"][number]>(details.sequence));
  const [hazards, setHazards] = useState(() => keyed<PlanDetails["hazards"][number]>(details.hazards));
  const [people, setPeople] = useState(() => keyed<PlanDetails["people"][number]>(details.people));
  const rowError = (prefix: string) =>
    Object.entries(errors)
      .filter(([k]) => k.startsWith(prefix))
      .flatMap(([, v]) => v ?? []);
  return (
    <>
      <PageHeader
        title={`Details of ${title}`}
        lead="The sequence of the lift with its hold points, the hazards and their controls, and the people who do it."
      >
        <a href={`/plans/${id}`} className="px-2 py-2 text-sm">
          Back to the plan
        </a>
      </PageHeader>
      {status !== "draft" && <FormError message="This revision is no longer a draft; saving will be refused." />}
      <Form method="post" className="space-y-6">
        <input type="hidden" name="version" value={version} />
        <FormError message={errors._form?.join(" ")} />
        <Card title="Sequence">
          <ol className="space-y-4">
            {steps.map((s, i) => (
              <li key={s.key} className="rounded border border-rule p-3">
                <div className="flex flex-wrap items-end gap-3">
                  <label className="min-w-64 flex-1 text-sm font-medium">
                    Step {i + 1}
                    <input className={input} name={`step-${i}-title`} defaultValue={s.title} maxLength={120} required />
                  </label>
                  <label className="flex items-center gap-2 text-sm">
                    <input type="checkbox" name={`step-${i}-hold`} defaultChecked={s.holdPoint} /> Hold point
                  </label>
                  <RowButtons
                    index={i}
                    count={steps.length}
                    what={`step ${i + 1}`}
                    onMove={(to) => setSteps(move(steps, i, to))}
                    onRemove={() => setSteps(steps.filter((x) => x.key !== s.key))}
                  />
                </div>
                <label className="mt-2 block text-sm font-medium">
                  Notes
                  <textarea
                    className={input}
                    rows={2}
                    name={`step-${i}-notes`}
                    defaultValue={s.notes}
                    maxLength={2000}
                  />
                </label>
                <FieldError errors={rowError(`sequence.${i}.`)} />
              </li>
            ))}
          </ol>
          <FieldError errors={errors.sequence} />
          {steps.length < MAX_STEPS && (
            <Button
              type="button"
              tone="secondary"
              className="mt-3"
              onClick={() => setSteps([...steps, ...keyed([{ title: "", holdPoint: false, notes: "" }])])}
            >
              Add a step
            </Button>
          )}
        </Card>
        <Card title="Hazards and controls">
          <ul className="space-y-4">
            {hazards.map((h, i) => (
              <li key={h.key} className="grid gap-3 rounded border border-rule p-3 md:grid-cols-[1fr_2fr_auto]">
                <label className="text-sm font-medium">
                  Hazard
                  <input className={input} name={`hazard-${i}-hazard`} defaultValue={h.hazard} maxLength={300} />
                </label>
                <label className="text-sm font-medium">
                  Control
                  <input className={input} name={`hazard-${i}-control`} defaultValue={h.control} maxLength={1000} />
                </label>
                <div className="self-end">
                  <RowButtons
                    index={i}
                    count={hazards.length}
                    what={`hazard ${i + 1}`}
                    onMove={(to) => setHazards(move(hazards, i, to))}
                    onRemove={() => setHazards(hazards.filter((x) => x.key !== h.key))}
                  />
                </div>
                <div className="md:col-span-3">
                  <FieldError errors={rowError(`hazards.${i}.`)} />
                </div>
              </li>
            ))}
          </ul>
          {hazards.length < MAX_HAZARDS && (
            <Button
              type="button"
              tone="secondary"
              className="mt-3"
              onClick={() => setHazards([...hazards, ...keyed([{ hazard: "", control: "" }])])}
            >
              Add a hazard
            </Button>
          )}
          <div className="mt-4 grid gap-4 md:grid-cols-2">
            <label className="text-sm font-medium">
              Exclusion zone
              <textarea className={input} name="exclusionZone" defaultValue={details.exclusionZone} maxLength={2000} />
              <FieldError errors={errors.exclusionZone} />
            </label>
            <label className="text-sm font-medium">
              Communication
              <textarea className={input} name="communication" defaultValue={details.communication} maxLength={1000} />
              <FieldError errors={errors.communication} />
            </label>
            <label className="text-sm font-medium">
              Underside clear of the floor by ({lengthUnitLabel(units)})
              <input
                className={input}
                name="floorClearance"
                inputMode="decimal"
                defaultValue={inputNumber(toDisplayLength(details.floorClearanceM, units), 1)}
                required
              />
              <span className="mt-1 block text-xs text-ink-soft">
                How high the load must rise; used for the crane headroom check.
              </span>
              <FieldError errors={errors.floorClearanceM} />
            </label>
            <label className="text-sm font-medium">
              Planned lift date
              <input className={input} name="liftDate" type="date" defaultValue={details.liftDate ?? ""} />
              <span className="mt-1 block text-xs text-ink-soft">
                Every allocated item must be in date for thorough examination on this day as well as today.
              </span>
              <FieldError errors={errors.liftDate} />
            </label>
          </div>
        </Card>
        <Card title="People">
          <ul className="space-y-3">
            {people.map((p, i) => (
              <li key={p.key} className="grid gap-3 md:grid-cols-[2fr_1fr_auto]">
                <label className="text-sm font-medium">
                  Name
                  <input className={input} name={`person-${i}-name`} defaultValue={p.name} maxLength={120} />
                </label>
                <label className="text-sm font-medium">
                  Role
                  <select className={input} name={`person-${i}-role`} defaultValue={p.role}>
                    {PERSON_ROLES.map((r) => (
                      <option key={r} value={r}>
                        {PERSON_ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                </label>
                <div className="self-end">
                  <RowButtons
                    index={i}
                    count={people.length}
                    what={`person ${i + 1}`}
                    onMove={(to) => setPeople(move(people, i, to))}
                    onRemove={() => setPeople(people.filter((x) => x.key !== p.key))}
                  />
                </div>
                <div className="md:col-span-3">
                  <FieldError errors={rowError(`people.${i}.`)} />
                </div>
              </li>
            ))}
          </ul>
          {people.length < MAX_PEOPLE && (
            <Button
              type="button"
              tone="secondary"
              className="mt-3"
              onClick={() => setPeople([...people, ...keyed([{ name: "", role: "slinger_signaller" as const }])])}
            >
              Add a person
            </Button>
          )}
        </Card>
        <Button type="submit">Save the details</Button>
      </Form>
    </>
  );
}
