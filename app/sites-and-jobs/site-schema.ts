import { z } from "zod";
import { optionalText, requiredText } from "~/utils/forms";

export const siteSchema = z.object({
  name: requiredText("site name", 200),
  customer: requiredText("customer", 200),
  address: optionalText(1000, { multiline: true }),
  siteContact: optionalText(200),
  notes: optionalText(4000, { multiline: true }),
});
