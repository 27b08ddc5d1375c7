import {
  FormDataParseError,
  MaxFilesExceededError,
  MaxFileSizeExceededError,
  MaxPartsExceededError,
  MaxTotalSizeExceededError,
  parseFormData,
} from "@remix-run/form-data-parser";
import type { Transaction } from "sequelize";
import { sequelize } from "~/utils/db.server";
import { fileStore, newStorageKey } from "~/utils/file-store.server";
import {
  FILE_KIND_CONTENT_TYPES,
  fileKindProblem,
  MAX_UPLOAD_BYTES,
  sniffFileKind,
  type FileKind,
} from "~/utils/file-type";
import { createStoredFileRecord, type FilePurpose, type StoredFile } from "~/models/stored-file.server";

const MIB = 1024 * 1024;

export type UploadForm = { ok: true; formData: FormData } | { ok: false; status: 400 | 413; message: string };

function megabytes(bytes: number) {
  return `${Math.round((bytes / MIB) * 10) / 10} MB`;
}

/**
 * Reads a form that may carry files (multipart or urlencoded). Each file is kept in memory as a
 * File of at most `maxFileBytes`; nothing is written anywhere until a file is checked and stored.
 * Oversize and malformed bodies come back as a readable refusal, never a thrown error.
 */
export async function readUploadForm(
  request: Request,
  { maxFileBytes = MAX_UPLOAD_BYTES, maxFiles = 3 }: { maxFileBytes?: number; maxFiles?: number } = {},
): Promise<UploadForm> {
  const maxTotalSize = maxFiles * maxFileBytes + MIB;
  const declared = Number(request.headers.get("Content-Length"));
  if (Number.isFinite(declared) && declared > maxTotalSize) {
    return {
      ok: false,
      status: 413,
      message: `The upload is larger than the ${megabytes(maxFileBytes)} limit for a file.`,
    };
  }
  try {
    const formData = await parseFormData(
      request,
      { maxFileSize: maxFileBytes, maxFiles, maxTotalSize, maxParts: 200 },
      // A plain File (not the parser's part object), as the rest of the app expects.
      async (upload) => new File([await upload.arrayBuffer()], upload.name, { type: upload.type }),
    );
    return { ok: true, formData };
  } catch (error) {
    if (error instanceof MaxFileSizeExceededError || error instanceof MaxTotalSizeExceededError) {
      return { ok: false, status: 413, message: `The file is larger than the ${megabytes(maxFileBytes)} limit.` };
    }
    if (error instanceof MaxFilesExceededError || error instanceof MaxPartsExceededError) {
      return { ok: false, status: 400, message: "The form carries more files or fields than it should." };
    }
    if (error instanceof FormDataParseError) {
      return { ok: false, status: 400, message: "The upload could not be read; try sending the form again." };
    }
    throw error;
  }
}

/** The file sent in `field`, or null when the field is missing or was left empty. */
export function uploadedFile(formData: FormData, field: string): File | null {
  const value = formData.get(field);
  if (!(value instanceof File)) return null;
  if (value.size === 0 && !value.name) return null;
  return value;
}

export type CheckedUpload = { bytes: Uint8Array; kind: FileKind; contentType: string; originalName: string };

/** A file name safe to keep and to offer back: no folders, no control characters, at most 200 characters. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const clean = base
    // eslint-disable-next-line no-control-regex -- removing control characters is the point
    .replace(/[\u0000-\u001f\u007f"]/g, "")
    .trim()
    .slice(-200);
  return clean || "upload";
}

/** Checks an uploaded file by its content against the kinds `accepted`; its name and declared type are not trusted. */
export async function checkUpload(
  file: File,
  accepted: readonly FileKind[],
): Promise<{ ok: true; upload: CheckedUpload } | { ok: false; message: string }> {
  const originalName = cleanFileName(file.name);
  if (file.size > MAX_UPLOAD_BYTES)
    return { ok: false, message: `"${originalName}" is larger than the ${megabytes(MAX_UPLOAD_BYTES)} limit.` };
  const bytes = new Uint8Array(await file.arrayBuffer());
  const sniffed = sniffFileKind(bytes);
  const problem = fileKindProblem(sniffed, accepted, originalName);
  if (problem || !sniffed.kind) return { ok: false, message: problem ?? "The file's kind is not accepted." };
  return {
    ok: true,
    upload: { bytes, kind: sniffed.kind, contentType: FILE_KIND_CONTENT_TYPES[sniffed.kind], originalName },
  };
}

export type StoreMeta = { organisationId: number; purpose: FilePurpose; uploadedBy: number | null };
export type StoreFile = (upload: CheckedUpload, meta: StoreMeta) => Promise<StoredFile>;

/**
 * Runs `work` in one transaction with a `store` function that puts checked uploads in the file store (random
 * keys) and records them in stored_files; if the transaction rolls back, the bytes it stored are removed again,
 * so no half-written upload stays behind.
 */
export async function transactionWithFiles<T>(
  work: (transaction: Transaction, store: StoreFile) => Promise<T>,
): Promise<T> {
  const files = fileStore();
  const written: string[] = [];
  try {
    return await sequelize.transaction(async (transaction) => {
      const store: StoreFile = async (upload, meta) => {
        const storageKey = newStorageKey();
        await files.put(storageKey, upload.bytes);
        written.push(storageKey);
        return createStoredFileRecord(
          {
            organisationId: meta.organisationId,
            storageKey,
            purpose: meta.purpose,
            originalName: upload.originalName,
            contentType: upload.contentType,
            sizeBytes: upload.bytes.byteLength,
            uploadedBy: meta.uploadedBy,
          },
          transaction,
        );
      };
      return work(transaction, store);
    });
  } catch (error) {
    await Promise.all(written.map((key) => files.remove(key).catch(() => undefined)));
    throw error;
  }
}

/** The stored bytes of a file record, or null when the file store has none under its key. */
export async function readStoredBytes(file: Pick<StoredFile, "storageKey">): Promise<Buffer | null> {
  try {
    return await fileStore().get(file.storageKey);
  } catch (error) {
    // Not a missing file (that is null already): a bad key or the store failing to read; the caller says "missing".
    console.error("Reading a stored file failed:", error);
    return null;
  }
}

/** A Content-Disposition value that survives any file name (ASCII fallback plus RFC 5987 UTF-8 form). */
export function contentDisposition(type: "inline" | "attachment", name: string) {
  const ascii = name.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}
