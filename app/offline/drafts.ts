// A form as typed, kept on the phone at every change so a reload, a closed tab or a lost signal loses nothing.
// Browser only.
import { phoneStore, type Draft } from "~/offline/store";

/** The form's text fields and ticks as name/value pairs (as the browser would send them) and its chosen files. */
export function readForm(form: HTMLFormElement): { fields: Array<[string, string]>; photos: File[] } {
  const fields: Array<[string, string]> = [];
  const photos: File[] = [];
  for (const [name, value] of new FormData(form).entries()) {
    if (typeof value === "string") fields.push([name, value]);
    else if (value.size > 0 || value.name) photos.push(value);
  }
  return { fields, photos };
}

export async function saveDraft(key: string, form: HTMLFormElement) {
  const { fields, photos } = readForm(form);
  await phoneStore.drafts.put({ key, fields, photos, updatedAt: new Date().toISOString() });
}

export async function loadDraft(key: string): Promise<Draft | undefined> {
  return phoneStore.drafts.get(key);
}

export async function putDraft(draft: Draft) {
  await phoneStore.drafts.put(draft);
}

export async function dropDraft(key: string) {
  await phoneStore.drafts.delete(key);
}

/** Puts a kept draft back into the form's fields: ticks, text, times and the chosen photos. */
export function restoreForm(form: HTMLFormElement, draft: Pick<Draft, "fields" | "photos">) {
  const values = new Map<string, string[]>();
  for (const [name, value] of draft.fields) values.set(name, [...(values.get(name) ?? []), value]);
  for (const element of Array.from(form.elements)) {
    if (element instanceof HTMLInputElement) {
      if (!element.name || element.type === "hidden") continue;
      if (element.type === "checkbox" || element.type === "radio") {
        element.checked = (values.get(element.name) ?? []).includes(element.value);
      } else if (element.type === "file") {
        if (!draft.photos.length) continue;
        const transfer = new DataTransfer();
        for (const photo of draft.photos) transfer.items.add(photo);
        element.files = transfer.files;
      } else if (values.has(element.name)) element.value = values.get(element.name)![0]!;
    } else if (element instanceof HTMLTextAreaElement || element instanceof HTMLSelectElement) {
      if (values.has(element.name)) element.value = values.get(element.name)![0]!;
    }
  }
}
