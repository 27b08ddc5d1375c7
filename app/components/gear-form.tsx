import { useState } from "react";
import { Form } from "react-router";
import { Button, Field, FormError, SelectField, type FieldErrors } from "~/components/ui/form";
import {
  CHAIN_GRADES,
  EYEBOLT_FAMILIES,
  GEAR_KIND_INFO,
  GEAR_KINDS,
  PIN_TYPES,
  SHACKLE_TYPES,
  SPEC_FIELD_LABELS,
  WLL_UNIT_LABELS,
  WLL_UNITS,
  isGearKind,
  type GearKind,
  type SpecField,
} from "~/gear/kinds";

export type GearFormValues = Partial<Record<string, string | number | null>>;

const choices = (values: readonly (string | number)[], blank = "Choose…") => [
  { value: "", label: blank },
  ...values.map((v) => ({ value: String(v), label: String(v) })),
];

const SPEC_HINTS: Partial<Record<SpecField, string>> = {
  thread: "As marked, e.g. M16.",
  legs: "Legs of the sling assembly.",
  lengthM: "Effective working length, bearing point to bearing point.",
  hookHeightM: "Highest hook position above the floor.",
  beamMassKg: "The beam's own mass, added to the load.",
  dropLugsM: "Where the drops hang, metres from end A along the beam, e.g. 0.25, 2.75.",
  topLugsM: "Where the beam hangs: one lug for a lifting beam, two for a spreader, metres from end A.",
};

function SpecInput({ field, value, errors }: { field: SpecField; value: string; errors?: string[] }) {
  const label = SPEC_FIELD_LABELS[field];
  const common = { label, name: field, defaultValue: value, errors };
  const hint = SPEC_HINTS[field];
  switch (field) {
    case "eyeboltFamily":
      return <SelectField {...common} options={choices(EYEBOLT_FAMILIES)} />;
    case "shackleType":
      return <SelectField {...common} options={choices(SHACKLE_TYPES)} />;
    case "pinType":
      return <SelectField {...common} options={choices(PIN_TYPES)} />;
    case "chainGrade":
      return <SelectField {...common} options={choices(CHAIN_GRADES)} />;
    case "legs":
      return <SelectField {...common} options={choices([1, 2, 3, 4])} />;
    case "thread":
      return <Field {...common} hint={hint} maxLength={20} autoComplete="off" />;
    case "dropLugsM":
    case "topLugsM":
      return <Field {...common} hint={hint} maxLength={200} autoComplete="off" inputMode="decimal" />;
    default:
      // Text, not type="number": the server reads "2,5", "1 240" or "12 in" and says why it refuses anything else.
      return <Field {...common} hint={hint} inputMode="decimal" autoComplete="off" />;
  }
}

/** The add/edit form of a gear item; the size fields shown follow the chosen kind. */
export function GearItemForm({
  sites,
  values = {},
  errors = {},
  submitLabel,
}: {
  sites: Array<{ id: number; name: string }>;
  values?: GearFormValues;
  errors?: FieldErrors;
  submitLabel: string;
}) {
  const initialKind = isGearKind(values.kind) ? values.kind : "eyebolt";
  const [kind, setKind] = useState<GearKind>(initialKind);
  const text = (key: string) => (values[key] === null || values[key] === undefined ? "" : String(values[key]));
  const info = GEAR_KIND_INFO[kind];
  return (
    <Form method="post" className="space-y-5" noValidate>
      <FormError message={errors._form?.join(" ")} />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Item id"
          name="itemCode"
          defaultValue={text("itemCode")}
          errors={errors.itemCode}
          required
          maxLength={40}
          hint="Your id as marked on the item."
          autoComplete="off"
        />
        <SelectField
          label="Kind"
          name="kind"
          value={kind}
          onChange={(e) => isGearKind(e.target.value) && setKind(e.target.value)}
          errors={errors.kind}
          options={GEAR_KINDS.map((k) => ({ value: k, label: GEAR_KIND_INFO[k].label }))}
        />
        <div className="sm:col-span-2">
          <Field
            label="Description"
            name="description"
            defaultValue={text("description")}
            errors={errors.description}
            maxLength={300}
          />
        </div>
        <Field
          label="Manufacturer"
          name="manufacturer"
          defaultValue={text("manufacturer")}
          errors={errors.manufacturer}
          maxLength={120}
        />
        <Field
          label="Serial number"
          name="serial"
          defaultValue={text("serial")}
          errors={errors.serial}
          maxLength={80}
        />
      </div>
      <fieldset className="rounded border border-rule p-3">
        <legend className="px-1 text-sm font-semibold">Working load limit, as marked</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field
            label="WLL"
            name="wllValue"
            inputMode="decimal"
            autoComplete="off"
            defaultValue={text("wllValue")}
            errors={errors.wllValue}
            hint="The figure in the unit chosen beside it, e.g. 2.5 or 1 240."
            required
          />
          <SelectField
            label="Unit"
            name="wllUnit"
            defaultValue={text("wllUnit") || "t"}
            errors={errors.wllUnit}
            options={WLL_UNITS.map((u) => ({ value: u, label: WLL_UNIT_LABELS[u] }))}
          />
        </div>
      </fieldset>
      {info.fields.length > 0 && (
        <fieldset className="rounded border border-rule p-3">
          <legend className="px-1 text-sm font-semibold">Size ({info.label.toLowerCase()})</legend>
          <div className="grid gap-4 sm:grid-cols-2">
            {info.fields.map((f) => (
              <SpecInput key={`${kind}-${f}`} field={f} value={text(f)} errors={errors[f]} />
            ))}
          </div>
        </fieldset>
      )}
      <Field
        label="Own mass (kg)"
        name="massKg"
        inputMode="decimal"
        autoComplete="off"
        defaultValue={text("massKg")}
        errors={errors.massKg}
        hint="What the item itself weighs: the crane check adds it to the load."
      />
      <SelectField
        label="Home site"
        name="homeSiteId"
        defaultValue={text("homeSiteId")}
        errors={errors.homeSiteId}
        options={[
          { value: "", label: "None (kept at the depot)" },
          ...sites.map((s) => ({ value: String(s.id), label: s.name })),
        ]}
      />
      <Button type="submit">{submitLabel}</Button>
    </Form>
  );
}
