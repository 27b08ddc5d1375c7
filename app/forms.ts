import { z } from "zod";

/** FormData as a plain object; fields named in `arrayFields` always come out as string arrays. Files are dropped. */
export function formToObject(formData: FormData, arrayFields: readonly string[] = []): Record<string, unknown> {
  const result: Record<string, unknown> = {};
  for (const key of new Set(formData.keys())) {
    const values = formData.getAll(key).filter((v): v is string => typeof v === "string");
    result[key] = arrayFields.includes(key) ? values : values[0];
  }
  for (const key of arrayFields) result[key] ??= [];
  return result;
}

export type FormResult<T> = { ok: true; data: T } | { ok: false; errors: Record<string, string[]> };

/** Parses a form with `schema`, returning field errors keyed by field name (`_form` for the whole form). */
export function parseForm<S extends z.ZodType>(schema: S, formData: FormData, arrayFields: readonly string[] = []): FormResult<z.output<S>> {
  const parsed = schema.safeParse(formToObject(formData, arrayFields));
  if (parsed.success) return { ok: true, data: parsed.data };
  const errors: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.length ? String(issue.path[0]) : "_form";
    (errors[key] ??= []).push(issue.message);
  }
  return { ok: false, errors };
}

/** A trimmed text field, empty allowed, bounded. */
export function optionalText(max: number) {
  return z.preprocess((v) => (typeof v === "string" ? v.trim() : ""), z.string().max(max, `At most ${max} characters.`));
}

/** A trimmed text field that must not be empty. */
export function requiredText(label: string, max: number) {
  return z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    z.string().min(1, `Enter the ${label}.`).max(max, `The ${label} can be at most ${max} characters.`),
  );
}

export const newPasswordSchema = z
  .string({ error: "Enter a new password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");
