import { z } from "zod";
import { isIsoDate } from "~/utils/dates";
import { optionalText, requiredText, safeText } from "~/utils/forms";

export const jobSchema = z.object({
  siteId: z.coerce.number({ error: "Choose the site." }).int().positive("Choose the site."),
  workOrder: requiredText("work order number", 60),
  title: requiredText("title", 200),
  description: optionalText(4000, { multiline: true }),
  status: z.enum(["open", "closed"], { error: "Choose open or closed." }).default("open"),
  startsOn: z.preprocess(
    (v) => (typeof v === "string" && v.trim() ? v.trim() : null),
    safeText()
      .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.")
      .refine(isIsoDate, "That is not a date on the calendar.")
      .nullable(),
  ),
});
