import { parseCsv, validateGearRows, type RowError } from "~/gear/csv";
import { applyGearImport, planGearImport, type ImportCounts } from "~/models/gear-item.server";
import { listSites } from "~/models/site.server";
import { getStoredFile } from "~/models/stored-file.server";
import { checkUpload, readStoredBytes, transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

/** The most row errors a preview lists; the count always covers them all. */
const MAX_LISTED_ERRORS = 200;

export type ImportPreview = {
  fileId: number;
  fileName: string;
  rowCount: number;
  validCount: number;
  errorCount: number;
  errors: RowError[];
  counts: ImportCounts;
  updates: Array<{ line: number; itemCode: string; fields: string[] }>;
  ignoredColumns: string[];
};

type Checked = { ok: true; text: string; upload: CheckedUpload } | { ok: false; message: string };

async function siteIdsByName(organisationId: number) {
  const sites = await listSites(organisationId);
  return new Map(sites.map((s) => [s.name.trim().toLowerCase(), s.id]));
}

/** Parses and validates CSV text against the organisation's register: nothing is written. */
async function evaluate(organisationId: number, text: string) {
  const parsed = parseCsv(text);
  if (!parsed.ok) return parsed;
  const { valid, errors } = validateGearRows(parsed.rows, await siteIdsByName(organisationId));
  const { plan, counts } = await planGearImport(
    organisationId,
    valid.map((v) => v.input),
  );
  const updates = plan.flatMap((p, i) =>
    p.action === "update" ? [{ line: valid[i]!.line, itemCode: p.input.itemCode, fields: p.changed }] : [],
  );
  return {
    ok: true as const,
    rowCount: parsed.rows.length,
    valid,
    errors,
    counts,
    updates,
    ignoredColumns: parsed.ignoredColumns,
  };
}

async function readCsv(file: File): Promise<Checked> {
  const checked = await checkUpload(file, ["csv"]);
  if (!checked.ok) return checked;
  return { ok: true, text: new TextDecoder("utf-8").decode(checked.upload.bytes), upload: checked.upload };
}

/**
 * Checks an uploaded CSV and keeps it as a stored file so the confirmation can refer to it by id
 * (no second upload). Refuses, storing nothing, a file that is not CSV or not the register's format.
 */
export async function stageGearImport(
  organisationId: number,
  file: File,
  actorId: number,
): Promise<{ ok: true; preview: ImportPreview } | { ok: false; message: string }> {
  const read = await readCsv(file);
  if (!read.ok) return read;
  const result = await evaluate(organisationId, read.text);
  if (!result.ok) return result;
  const stored = await transactionWithFiles((_t, store) =>
    store(read.upload, { organisationId, purpose: "gear-import", uploadedBy: actorId }),
  );
  return {
    ok: true,
    preview: {
      fileId: stored.id,
      fileName: stored.originalName,
      rowCount: result.rowCount,
      validCount: result.valid.length,
      errorCount: result.errors.length,
      errors: result.errors.slice(0, MAX_LISTED_ERRORS),
      counts: result.counts,
      updates: result.updates.slice(0, 100),
      ignoredColumns: result.ignoredColumns,
    },
  };
}

/**
 * Imports a staged CSV after validating it again against the register as it is now. With bad
 * rows it writes nothing unless `onlyValid` is chosen; the write is one transaction either way.
 */
export async function confirmGearImport(
  organisationId: number,
  fileId: number,
  onlyValid: boolean,
  actorId: number,
): Promise<{ ok: true; counts: ImportCounts; skipped: number } | { ok: false; status: 400 | 404; message: string }> {
  const file = await getStoredFile(organisationId, fileId, "gear-import");
  if (!file)
    return {
      ok: false,
      status: 404,
      message: "That staged import is not in your organisation; upload the file again.",
    };
  const bytes = await readStoredBytes(file);
  if (!bytes) return { ok: false, status: 404, message: "The staged file is missing from storage; upload it again." };
  const result = await evaluate(organisationId, new TextDecoder("utf-8").decode(bytes));
  if (!result.ok) return { ok: false, status: 400, message: result.message };
  if (result.errors.length && !onlyValid) {
    return {
      ok: false,
      status: 400,
      message: `${result.errors.length} row(s) have problems, so nothing was imported. Fix the file and upload it again, or choose to import only the ${result.valid.length} valid rows.`,
    };
  }
  if (!result.valid.length)
    return { ok: false, status: 400, message: "No row of the file is valid; nothing was imported." };
  const counts = await applyGearImport(
    organisationId,
    result.valid.map((v) => v.input),
    actorId,
    { fileId: file.id, fileName: file.originalName },
  );
  return { ok: true, counts, skipped: result.errors.length };
}
