import { Form } from "react-router";
import { Button, Field, TextAreaField } from "~/components/ui/form";

export type SiteValues = { name: string; customer: string; address: string; siteContact: string; notes: string };

export function SiteForm({
  values,
  errors,
  submitLabel,
}: {
  values?: Partial<SiteValues>;
  errors: Record<string, string[] | undefined>;
  submitLabel: string;
}) {
  return (
    <Form method="post" className="space-y-4">
      <Field
        label="Site name"
        name="name"
        required
        defaultValue={values?.name}
        errors={errors.name}
        hint="For example: the plant room or works where the lifts happen."
      />
      <Field label="Customer" name="customer" required defaultValue={values?.customer} errors={errors.customer} />
      <TextAreaField label="Address" name="address" defaultValue={values?.address} errors={errors.address} />
      <Field
        label="Site contact"
        name="siteContact"
        defaultValue={values?.siteContact}
        errors={errors.siteContact}
        hint="Name and phone of the customer's person on site."
      />
      <TextAreaField
        label="Notes (access, permits, site rules)"
        name="notes"
        defaultValue={values?.notes}
        errors={errors.notes}
      />
      <Button type="submit">{submitLabel}</Button>
    </Form>
  );
}
