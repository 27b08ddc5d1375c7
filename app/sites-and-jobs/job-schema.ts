import { z } from "zod";
import { CONTROL_CHARACTER_MESSAGE, hasControlCharacters, optionalText, requiredText } from "~/utils/forms";

export const jobSchema = z.object({
  siteId: z.coerce.number({ error: "Choose the site." }).int().positive("Choose the site."),
  // The work order is looked up to keep it unique, so it must be text a query can carry.
  workOrder: requiredText("work order number", 60).refine((v) => !hasControlCharacters(v), CONTROL_CHARACTER_MESSAGE),
  title: requiredText("title", 200),
  description: optionalText(4000),
  status: z.enum(["open", "closed"], { error: "Choose open or closed." }).default("open"),
  startsOn: z.preprocess(
    (v) => (typeof v === "string" && v.trim() ? v.trim() : null),
    z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.")
      .refine((s) => !Number.isNaN(Date.parse(s)), "That is not a date.")
      .nullable(),
  ),
});
