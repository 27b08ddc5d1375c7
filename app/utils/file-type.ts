/** The kinds of file Plumbline keeps, known by their content, never by their name. */
/** The largest file any upload takes (certificates, drawings, photos): 10 MB. Checked in the browser before sending and on the server while reading. */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

export type FileKind = "pdf" | "png" | "jpeg" | "csv";

export const FILE_KIND_CONTENT_TYPES: Record<FileKind, string> = {
  pdf: "application/pdf",
  png: "image/png",
  jpeg: "image/jpeg",
  csv: "text/csv; charset=utf-8",
};

export const FILE_KIND_LABELS: Record<FileKind, string> = {
  pdf: "a PDF",
  png: "a PNG image",
  jpeg: "a JPEG image",
  csv: "a CSV text file",
};

export type Sniffed = { kind: FileKind } | { kind: null; description: string };

const startsWith = (bytes: Uint8Array, signature: readonly number[], offset = 0) =>
  bytes.length >= offset + signature.length && signature.every((b, i) => bytes[offset + i] === b);

// Executables and archives are named so the refusal can say what the file really is.
const KNOWN_OTHERS: Array<{ signature: number[]; description: string }> = [
  { signature: [0x7f, 0x45, 0x4c, 0x46], description: "a Linux program (ELF)" },
  { signature: [0x4d, 0x5a], description: "a Windows program (EXE/DLL)" },
  { signature: [0xcf, 0xfa, 0xed, 0xfe], description: "a macOS program (Mach-O)" },
  { signature: [0xfe, 0xed, 0xfa, 0xcf], description: "a macOS program (Mach-O)" },
  { signature: [0xca, 0xfe, 0xba, 0xbe], description: "a program or Java class file" },
  { signature: [0x23, 0x21], description: "a script" },
  { signature: [0x50, 0x4b, 0x03, 0x04], description: "a ZIP archive or Office document" },
  { signature: [0xd0, 0xcf, 0x11, 0xe0], description: "an old Office document" },
  { signature: [0x47, 0x49, 0x46, 0x38], description: "a GIF image" },
  { signature: [0x1f, 0x8b], description: "a gzip archive" },
];

/** Whether the bytes read as UTF-8 text with no control characters but tab, CR and LF. */
function isPlainText(bytes: Uint8Array): boolean {
  for (const b of bytes) if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d) return false;
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/**
 * What a file is by its first bytes (magic numbers): PDF ("%PDF-"), PNG (89 50 4E 47 0D 0A 1A 0A),
 * JPEG (FF D8 FF), or plain UTF-8 text, which is all a CSV can be checked for.
 */
export function sniffFileKind(bytes: Uint8Array): Sniffed {
  if (bytes.length === 0) return { kind: null, description: "an empty file" };
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) return { kind: "pdf" };
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return { kind: "png" };
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return { kind: "jpeg" };
  for (const other of KNOWN_OTHERS)
    if (startsWith(bytes, other.signature)) return { kind: null, description: other.description };
  if (isPlainText(bytes)) return { kind: "csv" };
  return { kind: null, description: "a binary file of a kind Plumbline does not keep" };
}

/** A readable refusal when a file is not one of the `accepted` kinds, else null. */
export function fileKindProblem(sniffed: Sniffed, accepted: readonly FileKind[], originalName: string): string | null {
  if (sniffed.kind && accepted.includes(sniffed.kind)) return null;
  const what = sniffed.kind ? FILE_KIND_LABELS[sniffed.kind] : sniffed.description;
  const wanted = accepted.map((k) => FILE_KIND_LABELS[k]).join(" or ");
  return `"${originalName}" is ${what} by its content, whatever its name says; this needs ${wanted}.`;
}
