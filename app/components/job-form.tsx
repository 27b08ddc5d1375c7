import { Form } from "react-router";
import { Button, Field, SelectField, TextAreaField } from "~/components/ui/form";

export type JobValues = {
  siteId: number;
  workOrder: string;
  title: string;
  description: string;
  status: string;
  startsOn: string | null;
};

export function JobForm({
  sites,
  values,
  errors,
  submitLabel,
}: {
  sites: Array<{ id: number; name: string; customer: string }>;
  values?: Partial<JobValues>;
  errors: Record<string, string[] | undefined>;
  submitLabel: string;
}) {
  return (
    <Form method="post" className="space-y-4">
      <SelectField
        label="Site"
        name="siteId"
        defaultValue={values?.siteId ? String(values.siteId) : undefined}
        errors={errors.siteId}
        options={sites.map((s) => ({ value: String(s.id), label: `${s.name} (${s.customer})` }))}
      />
      <Field
        label="Work order number"
        name="workOrder"
        required
        defaultValue={values?.workOrder}
        errors={errors.workOrder}
      />
      <Field
        label="Title"
        name="title"
        required
        defaultValue={values?.title}
        errors={errors.title}
        hint="What the job is, e.g. the overhaul and which machine."
      />
      <TextAreaField
        label="Description"
        name="description"
        defaultValue={values?.description}
        errors={errors.description}
      />
      <Field
        label="Starts on"
        name="startsOn"
        type="date"
        defaultValue={values?.startsOn ?? undefined}
        errors={errors.startsOn}
      />
      <SelectField
        label="Status"
        name="status"
        defaultValue={values?.status ?? "open"}
        errors={errors.status}
        options={[
          { value: "open", label: "Open" },
          { value: "closed", label: "Closed" },
        ]}
      />
      <Button type="submit">{submitLabel}</Button>
    </Form>
  );
}
