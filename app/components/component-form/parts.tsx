import { useMemo, type Dispatch, type SetStateAction } from "react";
import { newRowKey, toNumber, type Errors, type PartRow } from "~/components/component-form/rows";
import { Button, Card, FieldError } from "~/components/ui/form";
import { MAX_PARTS } from "~/loads/component-input";
import {
  COMPOSITE_COG_TOLERANCE_M,
  COMPOSITE_MASS_TOLERANCE,
  compositeDisagreements,
  compositeMassAndCog,
  type CompositeResult,
} from "~/statics/composite";
import type { Vec3 } from "~/statics/vector";
import {
  formatLength,
  formatMass,
  fromDisplayLength,
  fromDisplayMass,
  lengthUnitLabel,
  massUnitLabel,
  type Units,
} from "~/utils/format";

/** The composite calculator: parts with their masses and positions, summed to a mass and CoG the form can take. */
export function PartsCard({
  parts,
  setParts,
  onUseComposite,
  errors,
  units,
  component,
}: {
  parts: PartRow[];
  setParts: Dispatch<SetStateAction<PartRow[]>>;
  onUseComposite: (composite: CompositeResult) => void;
  errors: Errors;
  units: Units;
  /** The component's own mass (kg) and CoG (m) as typed in the form, null where not given. */
  component: { massKg: number | null; cog: Vec3 | null };
}) {
  const lu = lengthUnitLabel(units);
  const mu = massUnitLabel(units);
  const rowError = (key: string) => errors[key];

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

  return (
    <Card title="Composite calculator">
      <p className="mb-3 text-sm text-ink-soft">
        Build the mass and CoG from parts (for example the element, a fitted gear and the coupling): G = Σ mᵢ rᵢ / Σ mᵢ.
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
            {[composite.momentKgM.x, composite.momentKgM.y, composite.momentKgM.z].map((v) => v.toFixed(1)).join(", ")}{" "}
            kg·m
          </p>
          <p>
            G = ({formatLength(composite.cog.x, units)}, {formatLength(composite.cog.y, units)},{" "}
            {formatLength(composite.cog.z, units)})
          </p>
          {compositeDisagreements(composite, component).map((d) => (
            <p key={d.kind} role="status" className="mt-2 rounded border border-warn/40 bg-warn-soft px-2 py-1">
              {d.kind === "mass"
                ? `The parts add up to ${formatMass(d.partsKg, units)}, ${Math.abs(d.difference * 100).toFixed(1)} % ${d.difference > 0 ? "more" : "less"} than the component's mass of ${formatMass(d.componentKg, units)} (more than the ${COMPOSITE_MASS_TOLERANCE * 100} % common practice allows for rounding): check the parts, or use their sum.`
                : `The parts' CoG is ${formatLength(d.distanceM, units)} from the component's CoG (${formatLength(d.component.x, units)}, ${formatLength(d.component.y, units)}, ${formatLength(d.component.z, units)}), more than the ${formatLength(COMPOSITE_COG_TOLERANCE_M, units)} common practice allows for rounding: check the parts' positions and the datum, or use their CoG.`}
            </p>
          ))}
          <Button type="button" tone="secondary" className="mt-2" onClick={() => onUseComposite(composite)}>
            Use as the component's mass and CoG
          </Button>
        </div>
      )}
      <Button
        type="button"
        tone="secondary"
        className="mt-3"
        disabled={parts.length >= MAX_PARTS}
        onClick={() => setParts((rows) => [...rows, { key: newRowKey(), name: "", mass: "", x: "0", y: "0", z: "0" }])}
      >
        Add a part
      </Button>
    </Card>
  );
}
