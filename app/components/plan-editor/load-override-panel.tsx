// The override of the component's mass and CoG in the editor: the plan lifts the component's figures
// unless the planner gives others with a reason. Checked here with the same rules the server applies.
import { useState } from "react";
import { LoadOverrideNotice } from "~/components/load-override-mark";
import { Button, Field, TextAreaField } from "~/components/ui/form";
import type { ComponentDefinition } from "~/loads/component-definition";
import type { EditorAction, PlanEdit } from "~/plans/editor-state";
import { effectiveOverride, loadOverrideSchema, overrideIssues, overrideMark } from "~/plans/load-override";
import {
  fromDisplayLength,
  fromDisplayMass,
  inputNumber,
  lengthUnitLabel,
  massUnitLabel,
  toDisplayLength,
  toDisplayMass,
  type Units,
} from "~/utils/format";

type Draft = { mass: string; x: string; y: string; z: string; reason: string };

function draftOf(massKg: number, cog: PlanEdit["cog"], reason: string, units: Units): Draft {
  const len = (m: number) => inputNumber(toDisplayLength(m, units), units === "metric" ? 1 : 3);
  return { mass: inputNumber(toDisplayMass(massKg, units), 3), x: len(cog.x), y: len(cog.y), z: len(cog.z), reason };
}

const typed = (text: string) => (text.trim() === "" ? NaN : Number(text.replace(/,/g, "")));

export function LoadOverridePanel({
  edit,
  dispatch,
  canEdit,
  units,
  component,
}: {
  edit: PlanEdit;
  dispatch: (action: EditorAction) => void;
  canEdit: boolean;
  units: Units;
  /** The plan's copy of the component, with its own mass and CoG. */
  component: ComponentDefinition;
}) {
  const [open, setOpen] = useState(false);
  // A figure left as the component's reads as the component's (no rounding of a typed copy counts as a change).
  const own = draftOf(component.massKg, component.cog, "", units);
  const current = () =>
    draftOf(edit.override?.massKg ?? component.massKg, edit.cog, edit.override?.reason ?? "", units);
  const [draft, setDraft] = useState<Draft>(current);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const mark = overrideMark(component, edit.override);
  const lu = lengthUnitLabel(units);
  const set = (key: keyof Draft) => (e: { target: { value: string } }) =>
    setDraft((d) => ({ ...d, [key]: e.target.value }));

  function apply() {
    const massKg = draft.mass.trim() === own.mass ? null : fromDisplayMass(typed(draft.mass), units);
    const cogUnchanged = (["x", "y", "z"] as const).every((axis) => draft[axis].trim() === own[axis]);
    const cog = cogUnchanged
      ? null
      : {
          x: fromDisplayLength(typed(draft.x), units),
          y: fromDisplayLength(typed(draft.y), units),
          z: fromDisplayLength(typed(draft.z), units),
        };
    const parsed = loadOverrideSchema.safeParse({ massKg, cog, reason: draft.reason });
    const found: Record<string, string[]> = {};
    const add = (key: string, message: string) => (found[key] ??= []).push(message);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) add(String(issue.path.at(-1) ?? "reason"), issue.message);
    } else {
      for (const issue of overrideIssues(component, parsed.data, [])) add(String(issue.path.at(-1)), issue.message);
    }
    setErrors(found);
    if (!parsed.success || Object.keys(found).length > 0) return;
    const override = effectiveOverride(component, parsed.data);
    dispatch({ type: "set-load-override", override, cog: override?.cog ?? component.cog });
    setOpen(false);
  }

  function remove() {
    dispatch({ type: "set-load-override", override: null, cog: component.cog });
    setErrors({});
    setOpen(false);
  }

  return (
    <section aria-labelledby="load-override-heading" className="space-y-2 border-t border-rule pt-3">
      <h3 id="load-override-heading" className="text-base font-semibold">
        Mass and CoG as planned
      </h3>
      {mark ? (
        <LoadOverrideNotice mark={mark} units={units} />
      ) : (
        <p className="text-sm text-ink-soft">The plan lifts the component&apos;s own mass and CoG.</p>
      )}
      {canEdit && !open && (
        <div className="flex flex-wrap gap-2">
          <Button
            type="button"
            tone="secondary"
            onClick={() => {
              setDraft(current());
              setErrors({});
              setOpen(true);
            }}
          >
            {mark ? "Change the override" : "Override the mass or CoG"}
          </Button>
          {mark && (
            <Button type="button" tone="secondary" onClick={remove}>
              Use the component&apos;s mass and CoG
            </Button>
          )}
        </div>
      )}
      {canEdit && open && (
        <fieldset className="space-y-2" data-testid="load-override-form">
          <legend className="text-sm">
            Give the figures the lift must be planned with and why they differ from the component&apos;s (a weighing, a
            part removed before the lift). The CoG must lie within the component&apos;s outline.
          </legend>
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
            <Field
              label={`Planned mass (${massUnitLabel(units)})`}
              name="override-mass"
              inputMode="decimal"
              value={draft.mass}
              onChange={set("mass")}
              errors={errors.massKg}
            />
            {(["x", "y", "z"] as const).map((axis) => (
              <Field
                key={axis}
                label={`Planned CoG ${axis} (${lu})`}
                name={`override-cog-${axis}`}
                inputMode="decimal"
                value={draft[axis]}
                onChange={set(axis)}
                errors={errors[axis]}
              />
            ))}
          </div>
          <TextAreaField
            label="Reason for the override"
            name="override-reason"
            value={draft.reason}
            onChange={set("reason")}
            errors={errors.reason}
          />
          <div className="flex flex-wrap gap-2">
            <Button type="button" onClick={apply}>
              Apply the override
            </Button>
            <Button type="button" tone="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </fieldset>
      )}
    </section>
  );
}
