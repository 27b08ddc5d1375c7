import { data } from "react-router";
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

/** The request's form fields; a body that is not a readable form (a broken multipart, JSON) is refused with a thrown 400, never a 500. */
export async function requireFormData(request: Request): Promise<FormData> {
  try {
    return await request.formData();
  } catch {
    throw data({ message: "The form could not be read. Reload the page and send it again." }, { status: 400 });
  }
}

// Sequelize writes text into SQLite statements inline when it filters or inserts several rows, and a NUL there ends the
// statement early: text that reaches a WHERE clause or a multi-row insert must not carry control characters.
// eslint-disable-next-line no-control-regex
const CONTROL_CHARACTERS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g;

export const CONTROL_CHARACTER_MESSAGE =
  "Remove the control character (an invisible one, such as NUL) from this field.";

/** Whether `text` holds a control character other than tab, CR and LF. */
export function hasControlCharacters(text: string): boolean {
  return text.search(CONTROL_CHARACTERS) !== -1;
}

/** `text` with its control characters (other than tab, CR and LF) taken out: for search boxes. */
export function withoutControlCharacters(text: string): string {
  return text.replace(CONTROL_CHARACTERS, "");
}

export type FormResult<T> = { ok: true; data: T } | { ok: false; errors: Record<string, string[]> };

/** Parses a form with `schema`, returning field errors keyed by field name (`_form` for the whole form). */
export function parseForm<S extends z.ZodType>(
  schema: S,
  formData: FormData,
  arrayFields: readonly string[] = [],
): FormResult<z.output<S>> {
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
  return z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    z.string().max(max, `At most ${max} characters.`),
  );
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
