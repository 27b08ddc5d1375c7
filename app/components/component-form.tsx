import { useMemo, useState } from "react";
import { Form, useNavigation } from "react-router";
import { ComponentViews } from "~/components/component-views";
import { Button, Card, Field, FieldError, FormError, SelectField, TextAreaField } from "~/components/ui/form";
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
import { MAX_LIFT_POINTS, MAX_PARTS } from "~/loads/component-input";
import { compositeMassAndCog } from "~/statics/composite";
import { convertLength } from "~/statics/units";
import {
  formatLength,
  formatMass,
  fromDisplayLength,
  fromDisplayMass,
  inputNumber,
  lengthUnitLabel,
  massUnitLabel,
  toDisplayLength,
  toDisplayMass,
  type Units,
} from "~/utils/format";

type Errors = Record<string, string[] | undefined>;
type LiftRow = {
  key: number;
  label: string;
  x: string;
  y: string;
  z: string;
  ax: string;
  ay: string;
  az: string;
  thread: string;
  engagement: string;
};
type PartRow = { key: number; name: string; mass: string; x: string; y: string; z: string };

let nextKey = 1;

function toNumber(v: string) {
  const n = Number(v.replace(/,/g, ""));
  return v.trim() !== "" && Number.isFinite(n) ? n : null;
}

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
      outlineMode: isRectangle ? "rectangle" : "custom",
      outlineElevation: def ? def.outlineElevation.map(([a, b]) => `${len(a)}, ${len(b)}`).join("\n") : "",
      outlinePlan: def ? def.outlinePlan.map(([a, b]) => `${len(a)}, ${len(b)}`).join("\n") : "",
    },
    liftPoints: (def?.liftPoints ?? []).map<LiftRow>((p) => ({
      key: nextKey++,
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
      key: nextKey++,
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

  const composite = useMemo(() => {
    const parsed = parts.map((p) => ({
      name: p.name,
      mass: toNumber(p.mass),
      x: toNumber(p.x),
      y: toNumber(p.y),
      z: toNumber(p.z),
    }));
    if (!parsed.length || parsed.some((p) => p.mass === null || p.x === null || p.y === null || p.z === null))
      return null;
    return compositeMassAndCog(
      parsed.map((p) => ({
        name: p.name,
        massKg: fromDisplayMass(p.mass!, units),
        position: {
          x: fromDisplayLength(p.x!, units),
          y: fromDisplayLength(p.y!, units),
          z: fromDisplayLength(p.z!, units),
        },
      })),
    );
  }, [parts, units]);

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

  function applyComposite() {
    if (!composite) return;
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

  const nextLabel = () => {
    const used = new Set(liftPoints.map((p) => p.label.toUpperCase()));
    for (const c of "ABCDEFGHJKLMNPQRSTUVWXYZ") if (!used.has(c)) return c;
    return "";
  };

  const rowError = (key: string) => errors[key];

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
            </div>
          </Card>

          <Card title="Lift points">
            <p className="mb-3 text-sm text-ink-soft">
              Each point is where a leg's line of force acts (the eye of the eyebolt, the shackle pin). The axis is the
              direction out of the tapped hole's surface: 0, 0, 1 for a hole in the top face.
            </p>
            <FieldError errors={errors.liftPoints} />
            {liftPoints.length > 0 && (
              // One block per point whose fields wrap to the card's width: nothing is clipped at any screen size.
              <div className="space-y-3">
                {liftPoints.map((p, i) => {
                  const update = (field: keyof LiftRow) => (e: React.ChangeEvent<HTMLInputElement>) =>
                    setLiftPoints((rows) => rows.map((r) => (r.key === p.key ? { ...r, [field]: e.target.value } : r)));
                  const cell = (field: keyof LiftRow, label: string, heading: string, width = "w-20") => (
                    <label className="flex flex-col text-xs font-medium text-ink-soft">
                      <span aria-hidden="true">{heading}</span>
                      <input
                        aria-label={`Lift point ${i + 1} ${label}`}
                        name={`lp-${i}-${field}`}
                        value={p[field]}
                        onChange={update(field)}
                        className={`${width} mt-0.5 rounded border border-rule px-2 py-1 text-sm text-ink aria-[invalid=true]:border-fail`}
                        aria-invalid={rowError(`lp-${i}-${field}`) ? true : undefined}
                      />
                      <FieldError errors={rowError(`lp-${i}-${field}`)} />
                    </label>
                  );
                  return (
                    <fieldset key={p.key} className="rounded border border-rule p-2">
                      <legend className="px-1 text-sm font-semibold">Lift point {p.label || i + 1}</legend>
                      <div className="flex flex-wrap items-end gap-x-3 gap-y-2">
                        {cell("label", "id", "Id", "w-14")}
                        {cell("x", "x", `x (${lu})`)}
                        {cell("y", "y", `y (${lu})`)}
                        {cell("z", "z", `z (${lu})`)}
                        {cell("ax", "axis x", "Axis x", "w-14")}
                        {cell("ay", "axis y", "Axis y", "w-14")}
                        {cell("az", "axis z", "Axis z", "w-14")}
                        {cell("thread", "thread", "Thread")}
                        {cell("engagement", "thread engagement", `Engagement (${lu})`)}
                        <button
                          type="button"
                          className="min-h-9 text-sm text-fail underline"
                          onClick={() => setLiftPoints((rows) => rows.filter((r) => r.key !== p.key))}
                        >
                          Remove {p.label || "point"}
                        </button>
                      </div>
                    </fieldset>
                  );
                })}
              </div>
            )}
            <Button
              type="button"
              tone="secondary"
              className="mt-3"
              disabled={liftPoints.length >= MAX_LIFT_POINTS}
              onClick={() =>
                setLiftPoints((rows) => [
                  ...rows,
                  {
                    key: nextKey++,
                    label: nextLabel(),
                    x: "",
                    y: "",
                    z: head.height,
                    ax: "0",
                    ay: "0",
                    az: "1",
                    thread: "",
                    engagement: "",
                  },
                ])
              }
            >
              Add a lift point
            </Button>
          </Card>

          <Card title="Composite calculator">
            <p className="mb-3 text-sm text-ink-soft">
              Build the mass and CoG from parts (for example the element, a fitted gear and the coupling): G = Σ mᵢ rᵢ /
              Σ mᵢ.
            </p>
            <FieldError errors={errors.parts} />
            {parts.length > 0 && (
              <div className="overflow-x-auto">
                <table className="min-w-[40rem]">
                  <thead>
                    <tr>
                      <th scope="col">Part</th>
                      <th scope="col">Mass ({mu})</th>
                      <th scope="col">x ({lu})</th>
                      <th scope="col">y ({lu})</th>
                      <th scope="col">z ({lu})</th>
                      <th scope="col">
                        <span className="sr-only">Remove</span>
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {parts.map((p, i) => {
                      const update = (field: keyof PartRow) => (e: React.ChangeEvent<HTMLInputElement>) =>
                        setParts((rows) => rows.map((r) => (r.key === p.key ? { ...r, [field]: e.target.value } : r)));
                      const cell = (field: keyof PartRow, label: string, width = "w-24") => (
                        <>
                          <input
                            aria-label={`Part ${i + 1} ${label}`}
                            name={`part-${i}-${field}`}
                            value={p[field]}
                            onChange={update(field)}
                            className={`${width} rounded border border-rule px-2 py-1 text-sm`}
                            aria-invalid={rowError(`part-${i}-${field}`) ? true : undefined}
                          />
                          <FieldError errors={rowError(`part-${i}-${field}`)} />
                        </>
                      );
                      return (
                        <tr key={p.key}>
                          <td>{cell("name", "name", "w-44")}</td>
                          <td>{cell("mass", "mass")}</td>
                          <td>{cell("x", "x")}</td>
                          <td>{cell("y", "y")}</td>
                          <td>{cell("z", "z")}</td>
                          <td>
                            <button
                              type="button"
                              className="text-sm text-fail underline"
                              onClick={() => setParts((rows) => rows.filter((r) => r.key !== p.key))}
                            >
                              Remove
                            </button>
                          </td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
              </div>
            )}
            {composite && (
              <div className="mt-3 rounded bg-steel-soft p-3 text-sm" data-testid="composite-result">
                <p>
                  Σ m = <strong>{formatMass(composite.massKg, units)}</strong>; Σ m·x, Σ m·y, Σ m·z ={" "}
                  {[composite.momentKgM.x, composite.momentKgM.y, composite.momentKgM.z]
                    .map((v) => v.toFixed(1))
                    .join(", ")}{" "}
                  kg·m
                </p>
                <p>
                  G = ({formatLength(composite.cog.x, units)}, {formatLength(composite.cog.y, units)},{" "}
                  {formatLength(composite.cog.z, units)})
                </p>
                <Button type="button" tone="secondary" className="mt-2" onClick={applyComposite}>
                  Use as the component's mass and CoG
                </Button>
              </div>
            )}
            <Button
              type="button"
              tone="secondary"
              className="mt-3"
              disabled={parts.length >= MAX_PARTS}
              onClick={() =>
                setParts((rows) => [...rows, { key: nextKey++, name: "", mass: "", x: "0", y: "0", z: "0" }])
              }
            >
              Add a part
            </Button>
          </Card>

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
