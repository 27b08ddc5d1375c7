import { data, useFetcher } from "react-router";
import { z } from "zod";
import { guardFileSize } from "~/components/ui/file-size";
import type { Route } from "./+types/gear.import";
import { Button, Card, FormError, PageHeader } from "~/components/ui/form";
import {
  CSV_HEADERS,
  MAX_IMPORT_BYTES,
  MAX_IMPORT_ROWS,
  READ_ONLY_COLUMNS,
  REQUIRED_HEADERS,
} from "~/gear/csv-columns";
import { confirmGearImport, stageGearImport, type ImportPreview } from "~/gear/import.server";
import { watchAllocatedGear } from "~/plans/live-state.server";
import type { ImportCounts } from "~/models/gear-item.server";
import { requireUserWithRole } from "~/utils/session.server";
import { readUploadForm, uploadedFile } from "~/utils/uploads.server";

const confirmSchema = z.object({
  intent: z.literal("confirm"),
  fileId: z.coerce.number().int().positive(),
  mode: z.enum(["all", "valid"]).default("all"),
});

type ActionResult =
  | { intent: "preview"; preview: ImportPreview; error?: undefined; done?: undefined }
  | { intent: "preview" | "confirm"; error: string; preview?: undefined; done?: undefined }
  | { intent: "confirm"; done: ImportCounts & { skipped: number }; error?: undefined; preview?: undefined };

export const meta: Route.MetaFunction = () => [{ title: "Import gear · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireUserWithRole(request, "admin");
  return { maxMegabytes: MAX_IMPORT_BYTES / (1024 * 1024), maxRows: MAX_IMPORT_ROWS };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUserWithRole(request, "admin");
  const fail = (intent: "preview" | "confirm", error: string, status = 400) =>
    data<ActionResult>({ intent, error }, { status });
  const upload = await readUploadForm(request, { maxFileBytes: MAX_IMPORT_BYTES, maxFiles: 1 });
  if (!upload.ok) {
    const message =
      upload.status === 413
        ? `The file is larger than the ${MAX_IMPORT_BYTES / (1024 * 1024)} MB an import takes; split it into smaller files.`
        : upload.message;
    return fail("preview", message, upload.status);
  }
  const formData = upload.formData;
  if (formData.get("intent") === "confirm") {
    const form = confirmSchema.safeParse(Object.fromEntries([...formData].filter(([, v]) => typeof v === "string")));
    if (!form.success) return fail("confirm", "The confirmation did not name a staged file; upload the file again.");
    const result = await watchAllocatedGear(
      user.organisationId,
      "every allocated item",
      () => confirmGearImport(user.organisationId, form.data.fileId, form.data.mode === "valid", user.id),
      request,
    );
    if (!result.ok) return fail("confirm", result.message, result.status);
    return data<ActionResult>({ intent: "confirm", done: { ...result.counts, skipped: result.skipped } });
  }
  const file = uploadedFile(formData, "file");
  if (!file) return fail("preview", "Choose a CSV file to import.");
  const staged = await stageGearImport(user.organisationId, file, user.id);
  if (!staged.ok) return fail("preview", staged.message);
  return data<ActionResult>({ intent: "preview", preview: staged.preview });
}

export default function ImportGear({ loaderData }: Route.ComponentProps) {
  const preview = useFetcher<ActionResult>();
  const confirm = useFetcher<ActionResult>();
  const staged = preview.data?.preview;
  const done = confirm.data?.done;
  const checking = preview.state !== "idle";
  const importing = confirm.state !== "idle";
  const importingRows = confirm.formData?.get("mode") === "valid" ? staged?.validCount : staged?.rowCount;
  return (
    <>
      <PageHeader
        title="Import gear from CSV"
        lead="Add and update items from a spreadsheet. Nothing is written until you confirm."
      >
        <a href="/gear" className="px-2 py-2 text-sm">
          Back to the register
        </a>
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-3">
        <div className="min-w-0 space-y-6 lg:col-span-2">
          <Card title="1. Choose the file">
            <preview.Form method="post" encType="multipart/form-data" className="space-y-3">
              <input type="hidden" name="intent" value="preview" />
              <FormError message={preview.data?.error} />
              <div>
                <label htmlFor="import-file" className="block text-sm font-medium">
                  CSV file (up to {loaderData.maxMegabytes} MB, {loaderData.maxRows.toLocaleString("en-GB")} items)
                </label>
                <input
                  id="import-file"
                  name="file"
                  type="file"
                  accept=".csv,text/csv"
                  required
                  onChange={guardFileSize(loaderData.maxMegabytes * 1024 * 1024)}
                  className="mt-1 block w-full text-sm"
                />
              </div>
              <Button type="submit" disabled={checking}>
                {checking ? "Checking…" : "Check the file"}
              </Button>
              {checking && (
                <p className="flex items-center gap-2 text-sm" role="status">
                  <progress className="w-40" aria-label="Checking the file" /> Uploading and checking every row…
                </p>
              )}
            </preview.Form>
          </Card>

          {staged && !done && (
            <Card title="2. Check what will change">
              <p className="text-sm">
                <strong>{staged.fileName}</strong>: {staged.rowCount} row(s). Of the valid rows, {staged.counts.created}{" "}
                would be created, {staged.counts.updated} updated and {staged.counts.unchanged} left unchanged.
              </p>
              {staged.ignoredColumns.length > 0 && (
                <p className="mt-2 text-sm text-ink-soft">Columns not read: {staged.ignoredColumns.join(", ")}.</p>
              )}
              {staged.errorCount > 0 && (
                <div className="mt-4" role="alert">
                  <h3 className="text-fail">
                    {staged.errorCount} row(s) have problems and will not be imported as they are
                  </h3>
                  <div className="mt-2 max-h-96 overflow-auto rounded border border-fail/40">
                    <table>
                      <thead>
                        <tr>
                          <th scope="col">Line</th>
                          <th scope="col">Item id</th>
                          <th scope="col">Problem</th>
                        </tr>
                      </thead>
                      <tbody>
                        {staged.errors.map((e) => (
                          <tr key={e.line}>
                            <td className="whitespace-nowrap">Line {e.line}</td>
                            <td>{e.itemCode || "—"}</td>
                            <td>
                              <ul>
                                {e.messages.map((m) => (
                                  <li key={m}>{m}</li>
                                ))}
                              </ul>
                            </td>
                          </tr>
                        ))}
                      </tbody>
                    </table>
                  </div>
                  {staged.errorCount > staged.errors.length && (
                    <p className="mt-1 text-sm">…and {staged.errorCount - staged.errors.length} more.</p>
                  )}
                </div>
              )}
              {staged.updates.length > 0 && (
                <details className="mt-4 text-sm">
                  <summary className="cursor-pointer font-semibold">
                    Items that would be updated ({staged.counts.updated})
                  </summary>
                  <ul className="mt-2 space-y-1">
                    {staged.updates.map((u) => (
                      <li key={u.line}>
                        Line {u.line}, {u.itemCode}: {u.fields.join(", ")}
                      </li>
                    ))}
                  </ul>
                </details>
              )}
              <confirm.Form method="post" className="mt-4 flex flex-wrap items-center gap-3">
                <input type="hidden" name="intent" value="confirm" />
                <input type="hidden" name="fileId" value={staged.fileId} />
                <FormError message={confirm.data?.error} />
                {staged.errorCount === 0 ? (
                  <Button type="submit" name="mode" value="all" disabled={importing}>
                    Import {staged.rowCount} row(s)
                  </Button>
                ) : staged.validCount > 0 ? (
                  <Button type="submit" name="mode" value="valid" tone="secondary" disabled={importing}>
                    Import only the {staged.validCount} valid rows
                  </Button>
                ) : (
                  <p className="text-sm">No row is valid: fix the file and check it again.</p>
                )}
                {importing && (
                  <span className="flex items-center gap-2 text-sm" role="status">
                    <progress className="w-40" aria-label="Importing" /> Importing {importingRows ?? ""} rows in one
                    transaction…
                  </span>
                )}
              </confirm.Form>
            </Card>
          )}

          {done && (
            <Card title="Imported">
              <p role="status" className="text-sm">
                {done.created} created, {done.updated} updated, {done.unchanged} unchanged
                {done.skipped ? `; ${done.skipped} row(s) with problems skipped` : ""}.
              </p>
              <p className="mt-2 text-sm">
                <a href="/gear">Open the register</a>
              </p>
            </Card>
          )}
        </div>

        <Card title="The file's format">
          <div className="space-y-2 text-sm">
            <p>
              The first line names the columns. Needed: <code>{REQUIRED_HEADERS.join(", ")}</code>. Export the register
              to get a file in this format.
            </p>
            <p>
              Columns read:{" "}
              <code>{CSV_HEADERS.filter((h) => !(READ_ONLY_COLUMNS as readonly string[]).includes(h)).join(", ")}</code>
              .
            </p>
            <p>
              Rows are matched to the register by <code>item_code</code>: new ids are added, changed items updated.{" "}
              <code>{READ_ONLY_COLUMNS.join(", ")}</code> are for reading only: status and examinations change only on
              the item's page.
            </p>
            <p>
              <code>kind</code> is one of eyebolt, shackle, chain_sling, wire_rope_sling, web_sling, round_sling,
              master_link, beam, chain_block, lever_hoist, hoist, crane. <code>wll_unit</code> is kg, t, lb or shortTon.{" "}
              <code>home_site</code> is a site's name.
            </p>
          </div>
        </Card>
      </div>
    </>
  );
}
