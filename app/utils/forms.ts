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

// One rule for the text of every field: no control characters (C0 but for tab, LF and CR in multi-line fields,
// DEL, C1) and no bidirectional embedding, override or isolate marks (U+202A-202E, U+2066-2069). Control characters
// reach messages, CSV and PDFs invisibly, a NUL ends the statement Sequelize writes inline for a WHERE clause, and a
// right-to-left override makes "gpj.exe" read as "exe.jpg".
// eslint-disable-next-line no-control-regex
const FORBIDDEN_IN_LINE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;
// eslint-disable-next-line no-control-regex
const FORBIDDEN_IN_TEXT = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;

export const CONTROL_CHARACTER_MESSAGE =
  "Remove the invisible control or text-direction character (such as NUL or a right-to-left override) from this field.";

/** Whether `text` holds a character no field takes; `multiline` allows tab, LF and CR. */
export function hasControlCharacters(text: string, multiline = true): boolean {
  return text.search(multiline ? FORBIDDEN_IN_TEXT : FORBIDDEN_IN_LINE) !== -1;
}

/** `text` with the characters no field takes removed (tab, LF and CR kept): for search boxes, which never refuse. */
export function withoutControlCharacters(text: string): string {
  return text.replace(FORBIDDEN_IN_TEXT, "");
}

/**
 * The string schema of every text field in a form or an API body: refuses control characters and bidirectional
 * overrides with a sentence. A one-line field refuses tab and line breaks too; `multiline` (text areas) keeps them.
 * Chain `.trim()`, `.min()`, `.max()` on it as on `z.string()`.
 */
export function safeText(options: { multiline?: boolean; error?: string } = {}) {
  const multiline = options.multiline ?? false;
  return z
    .string(options.error ? { error: options.error } : undefined)
    .refine((v) => !hasControlCharacters(v, multiline), CONTROL_CHARACTER_MESSAGE);
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

/** A search box's text: never refused, the characters no field takes are dropped instead. */
export function searchText() {
  return z.string().transform(withoutControlCharacters);
}

/** A trimmed text field, empty allowed, bounded; `multiline` for a text area. */
export function optionalText(max: number, options: { multiline?: boolean } = {}) {
  return z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    safeText(options).max(max, `At most ${max} characters.`),
  );
}

/** A trimmed text field that must not be empty; `multiline` for a text area. */
export function requiredText(label: string, max: number, options: { multiline?: boolean } = {}) {
  return z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : ""),
    safeText(options).min(1, `Enter the ${label}.`).max(max, `The ${label} can be at most ${max} characters.`),
  );
}

export const newPasswordSchema = safeText({ error: "Enter a new password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");
