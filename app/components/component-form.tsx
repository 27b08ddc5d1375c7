import { useMemo, useState } from "react";
import { Form, useNavigation } from "react-router";
import { LiftPointsCard } from "~/components/component-form/lift-points";
import { PartsCard } from "~/components/component-form/parts";
import { newRowKey, toNumber, type Errors, type LiftRow, type PartRow } from "~/components/component-form/rows";
import { ComponentViews } from "~/components/component-views";
import { Button, Card, Field, FormError, SelectField, TextAreaField } from "~/components/ui/form";
import {
  COG_SOURCE_LABELS,
  COG_SOURCES,
  DEFAULT_CONTINGENCY_PCT,
  MASS_SOURCE_LABELS,
  MASS_SOURCES,
  rectangleOutlines,
  type ComponentDefinition,
  type MassSource,
} from "~/loads/component-definition";
import type { CompositeResult } from "~/statics/composite";
import { DEFAULT_FIT_TOLERANCE_DEG } from "~/statics/tilt";
import { convertLength } from "~/statics/units";
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

function initialState(def: ComponentDefinition | null, units: Units) {
  const len = (m: number) => inputNumber(toDisplayLength(m, units), units === "metric" ? 1 : 3);
  const mass = (kg: number) => inputNumber(toDisplayMass(kg, units), 2);
  const rectangle = def ? rectangleOutlines(def.lengthM, def.widthM, def.heightM) : null;
  const isRectangle =
    !def ||
    (JSON.stringify(def.outlineElevation) === JSON.stringify(rectangle?.outlineElevation) &&
      JSON.stringify(def.outlinePlan) === JSON.stringify(rectangle?.outlinePlan));
  return {
    head: {
      name: def?.name ?? "",
      description: def?.description ?? "",
      mass: def ? mass(def.massKg) : "",
      massSource: (def?.massSource ?? "certified") as MassSource,
      massNote: def?.massNote ?? "",
      contingencyPct: def ? String(def.contingencyPct) : String(DEFAULT_CONTINGENCY_PCT.certified),
      length: def ? len(def.lengthM) : "",
      width: def ? len(def.widthM) : "",
      height: def ? len(def.heightM) : "",
      cogX: def ? len(def.cog.x) : "0",
      cogY: def ? len(def.cog.y) : "0",
      cogZ: def ? len(def.cog.z) : "",
      cogSource: def?.cogSource ?? "manufacturer",
      cogNote: def?.cogNote ?? "",
      fitTolerance: def?.fitToleranceDeg ? inputNumber(def.fitToleranceDeg, 2) : "",
      fitToleranceSource: def?.fitToleranceSource ?? "",
      outlineMode: isRectangle ? "rectangle" : "custom",
      outlineElevation: def ? def.outlineElevation.map(([a, b]) => `${len(a)}, ${len(b)}`).join("\n") : "",
      outlinePlan: def ? def.outlinePlan.map(([a, b]) => `${len(a)}, ${len(b)}`).join("\n") : "",
    },
    liftPoints: (def?.liftPoints ?? []).map<LiftRow>((p) => ({
      key: newRowKey(),
      label: p.label,
      x: len(p.position.x),
      y: len(p.position.y),
      z: len(p.position.z),
      ax: inputNumber(p.axis.x, 4),
      ay: inputNumber(p.axis.y, 4),
      az: inputNumber(p.axis.z, 4),
      thread: p.thread,
      engagement:
        p.engagementMm === null
          ? ""
          : inputNumber(units === "metric" ? p.engagementMm : convertLength(p.engagementMm, "mm", "in"), 2),
    })),
    parts: (def?.parts ?? []).map<PartRow>((p) => ({
      key: newRowKey(),
      name: p.name,
      mass: mass(p.massKg),
      x: len(p.position.x),
      y: len(p.position.y),
      z: len(p.position.z),
    })),
  };
}

/** The component form: load, CoG, outline, lift points and the composite calculator, with a live to-scale preview. */
export function ComponentForm({
  definition,
  units,
  errors,
  version,
  submitLabel,
}: {
  definition: ComponentDefinition | null;
  units: Units;
  errors: Errors;
  version?: number;
  submitLabel: string;
}) {
  const initial = useMemo(() => initialState(definition, units), [definition, units]);
  const [head, setHead] = useState(initial.head);
  const [liftPoints, setLiftPoints] = useState(initial.liftPoints);
  const [parts, setParts] = useState(initial.parts);
  const navigation = useNavigation();
  const lu = lengthUnitLabel(units);
  const mu = massUnitLabel(units);
  const set =
    (field: keyof typeof head) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>) =>
      setHead((h) => ({ ...h, [field]: e.target.value }));

  const preview = useMemo(() => {
    const [l, w, h] = [toNumber(head.length), toNumber(head.width), toNumber(head.height)];
    if (!l || !w || !h || l <= 0 || w <= 0 || h <= 0) return null;
    const L = (v: number) => fromDisplayLength(v, units);
    let outlines = rectangleOutlines(L(l), L(w), L(h));
    if (head.outlineMode === "custom") {
      const parse = (t: string) =>
        t
          .split(/\n/)
          .map((line) =>
            line
              .split(/[\s,;]+/)
              .filter(Boolean)
              .map(Number),
          )
          .filter((p) => p.length === 2 && p.every(Number.isFinite))
          .map(([a, b]) => [L(a!), L(b!)] as [number, number]);
      const elevation = parse(head.outlineElevation);
      const plan = parse(head.outlinePlan);
      if (elevation.length >= 3 && plan.length >= 3) outlines = { outlineElevation: elevation, outlinePlan: plan };
    }
    return {
      ...outlines,
      cog: { x: L(toNumber(head.cogX) ?? 0), y: L(toNumber(head.cogY) ?? 0), z: L(toNumber(head.cogZ) ?? 0) },
      liftPoints: liftPoints
        .filter((p) => p.label && toNumber(p.x) !== null && toNumber(p.y) !== null && toNumber(p.z) !== null)
        .map((p) => ({
          label: p.label,
          position: { x: L(toNumber(p.x)!), y: L(toNumber(p.y)!), z: L(toNumber(p.z)!) },
        })),
    };
  }, [head, liftPoints, units]);

  // The mass and CoG as typed, for the composite calculator to compare its sum with.
  const typedLoad = useMemo(() => {
    const mass = toNumber(head.mass);
    const [x, y, z] = [toNumber(head.cogX), toNumber(head.cogY), toNumber(head.cogZ)];
    const L = (v: number) => fromDisplayLength(v, units);
    return {
      massKg: mass !== null && mass > 0 ? fromDisplayMass(mass, units) : null,
      cog: x !== null && y !== null && z !== null ? { x: L(x), y: L(y), z: L(z) } : null,
    };
  }, [head.mass, head.cogX, head.cogY, head.cogZ, units]);

  function applyComposite(composite: CompositeResult) {
    const len = (m: number) => inputNumber(toDisplayLength(m, units), units === "metric" ? 1 : 3);
    setHead((h) => ({
      ...h,
      mass: inputNumber(toDisplayMass(composite.massKg, units), 2),
      massSource: "calculated",
      contingencyPct: String(Math.max(Number(h.contingencyPct) || 0, DEFAULT_CONTINGENCY_PCT.calculated)),
      cogX: len(composite.cog.x),
      cogY: len(composite.cog.y),
      cogZ: len(composite.cog.z),
      cogSource: "calculated",
    }));
  }

  function useRectangle() {
    const [l, w, h] = [toNumber(head.length), toNumber(head.width), toNumber(head.height)];
    if (!l || !w || !h) return;
    const r = rectangleOutlines(l, w, h);
    const fmt = (pts: Array<[number, number]>) =>
      pts.map(([a, b]) => `${inputNumber(a, 3)}, ${inputNumber(b, 3)}`).join("\n");
    setHead((s) => ({
      ...s,
      outlineMode: "custom",
      outlineElevation: fmt(r.outlineElevation),
      outlinePlan: fmt(r.outlinePlan),
    }));
  }

  return (
    <Form method="post" className="space-y-6">
      {version !== undefined && <input type="hidden" name="version" value={version} />}
      <FormError message={errors._form?.join(" ")} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-6">
          <Card title="The component">
            <div className="grid gap-4 sm:grid-cols-2">
              <Field label="Name" name="name" value={head.name} onChange={set("name")} required errors={errors.name} />
              <TextAreaField
                label="Description"
                name="description"
                value={head.description}
                onChange={set("description")}
                errors={errors.description}
              />
              <Field
                label={`Length along x (${lu})`}
                name="length"
                inputMode="decimal"
                value={head.length}
                onChange={set("length")}
                required
                errors={errors.length}
              />
              <Field
                label={`Width along y (${lu})`}
                name="width"
                inputMode="decimal"
                value={head.width}
                onChange={set("width")}
                required
                errors={errors.width}
              />
              <Field
                label={`Height along z (${lu})`}
                name="height"
                inputMode="decimal"
                value={head.height}
                onChange={set("height")}
                required
                errors={errors.height}
              />
            </div>
          </Card>

          <Card title="Mass">
            <div className="grid gap-4 sm:grid-cols-3">
              <Field
                label={`Mass (${mu})`}
                name="mass"
                inputMode="decimal"
                value={head.mass}
                onChange={set("mass")}
                required
                errors={errors.mass}
              />
              <SelectField
                label="Where the mass comes from"
                name="massSource"
                value={head.massSource}
                onChange={(e) => {
                  const source = e.target.value as MassSource;
                  setHead((h) => ({
                    ...h,
                    massSource: source,
                    contingencyPct: String(DEFAULT_CONTINGENCY_PCT[source]),
                  }));
                }}
                errors={errors.massSource}
                options={MASS_SOURCES.map((s) => ({ value: s, label: MASS_SOURCE_LABELS[s] }))}
              />
              <Field
                label="Contingency (%)"
                name="contingencyPct"
                inputMode="decimal"
                value={head.contingencyPct}
                onChange={set("contingencyPct")}
                errors={errors.contingencyPct}
                hint="Added to the mass in every plan. The default follows the source; an estimate must carry one."
              />
              <div className="sm:col-span-3">
                <Field
                  label="Mass reference (certificate, drawing, weighing record)"
                  name="massNote"
                  value={head.massNote}
                  onChange={set("massNote")}
                  errors={errors.massNote}
                />
              </div>
            </div>
          </Card>

          <Card title="Centre of gravity">
            <p className="mb-3 text-sm text-ink-soft">
              In the component's own frame: x along the length, y across, z up as it sits level. The drawn outline is
              centred on x and y with its base at z = 0 unless you give your own outline.
            </p>
            <div className="grid gap-4 sm:grid-cols-3">
              <Field
                label={`CoG x (${lu})`}
                name="cogX"
                inputMode="decimal"
                value={head.cogX}
                onChange={set("cogX")}
                required
                errors={errors.cogX}
              />
              <Field
                label={`CoG y (${lu})`}
                name="cogY"
                inputMode="decimal"
                value={head.cogY}
                onChange={set("cogY")}
                required
                errors={errors.cogY}
              />
              <Field
                label={`CoG z (${lu})`}
                name="cogZ"
                inputMode="decimal"
                value={head.cogZ}
                onChange={set("cogZ")}
                required
                errors={errors.cogZ}
              />
              <SelectField
                label="Where the CoG comes from"
                name="cogSource"
                value={head.cogSource}
                onChange={set("cogSource")}
                errors={errors.cogSource}
                options={COG_SOURCES.map((s) => ({ value: s, label: COG_SOURCE_LABELS[s] }))}
              />
              <div className="sm:col-span-2">
                <Field
                  label="CoG reference"
                  name="cogNote"
                  value={head.cogNote}
                  onChange={set("cogNote")}
                  errors={errors.cogNote}
                />
              </div>
              <Field
                label="Fit tolerance (°, blank if not known)"
                name="fitTolerance"
                inputMode="decimal"
                value={head.fitTolerance}
                onChange={set("fitTolerance")}
                hint={`The largest tilt, along its length or across its width, at which it can still be guided onto its spigot or dowels without damaging a seal. Blank: the checks use ${DEFAULT_FIT_TOLERANCE_DEG}° (common practice) and say so.`}
                errors={errors.fitTolerance}
              />
              <Field
                label="Where the fit tolerance comes from"
                name="fitToleranceSource"
                value={head.fitToleranceSource}
                onChange={set("fitToleranceSource")}
                hint="The drawing or the maker's fitting instructions."
                errors={errors.fitToleranceSource}
              />
            </div>
          </Card>

          <LiftPointsCard
            liftPoints={liftPoints}
            setLiftPoints={setLiftPoints}
            newPointZ={head.height}
            errors={errors}
            units={units}
          />

          <PartsCard
            parts={parts}
            setParts={setParts}
            onUseComposite={applyComposite}
            errors={errors}
            units={units}
            component={typedLoad}
          />

          <Card title="Outline">
            <fieldset className="space-y-2 text-sm">
              <legend className="sr-only">Outline</legend>
              <label className="flex items-center gap-2">
                <input
                  type="radio"
                  name="outlineMode"
                  value="rectangle"
                  checked={head.outlineMode === "rectangle"}
                  onChange={set("outlineMode")}
                />
                A box of the overall dimensions
              </label>
              <label className="flex items-center gap-2">
                <input
                  type="radio"
                  name="outlineMode"
                  value="custom"
                  checked={head.outlineMode === "custom"}
                  onChange={set("outlineMode")}
                />
                My own outline (corners, one "a, b" pair per line, in {lu})
              </label>
            </fieldset>
            {head.outlineMode === "custom" ? (
              <div className="mt-3 grid gap-4 sm:grid-cols-2">
                <TextAreaField
                  label="Elevation corners (x, z)"
                  name="outlineElevation"
                  rows={6}
                  value={head.outlineElevation}
                  onChange={set("outlineElevation")}
                  errors={errors.outlineElevation}
                />
                <TextAreaField
                  label="Plan corners (x, y)"
                  name="outlinePlan"
                  rows={6}
                  value={head.outlinePlan}
                  onChange={set("outlinePlan")}
                  errors={errors.outlinePlan}
                />
                <Button type="button" tone="secondary" onClick={useRectangle}>
                  Start from the box
                </Button>
              </div>
            ) : (
              <>
                <input type="hidden" name="outlineElevation" value="" />
                <input type="hidden" name="outlinePlan" value="" />
              </>
            )}
          </Card>
        </div>

        <aside className="space-y-3 lg:sticky lg:top-4 lg:self-start">
          <h2 className="text-lg">Preview, to scale</h2>
          {preview ? (
            <ComponentViews data={preview} units={units} />
          ) : (
            <p className="rounded border border-dashed border-rule p-4 text-sm text-ink-soft">
              Enter the length, width and height to see the outline.
            </p>
          )}
          <Button type="submit" className="w-full" disabled={navigation.state === "submitting"}>
            {navigation.state === "submitting" ? "Saving…" : submitLabel}
          </Button>
        </aside>
      </div>
    </Form>
  );
}
