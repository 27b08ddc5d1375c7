import Papa from "papaparse";
import { MAX_IMPORT_ROWS, EDITABLE_COLUMNS, CSV_HEADERS, REQUIRED_HEADERS } from "~/gear/csv-columns";
import { gearItemSchema, type GearItemInput } from "~/gear/schema";

const FORMULA_START = /^[=+\-@\t\r]/;

/** A cell a spreadsheet would run as a formula (=, +, -, @, tab, CR first) gets a leading apostrophe. */
export function neutraliseCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/** Undoes neutraliseCell, so an exported file imports back to the same values. */
export function restoreCell(value: string): string {
  return value.startsWith("'") && FORMULA_START.test(value.slice(1)) ? value.slice(1) : value;
}

/** The byte order mark the export starts with, so spreadsheets read UTF-8. */
export const CSV_BOM = "\uFEFF";

/** CSV lines for rows, each ended by CRLF, every cell neutralised: a part of a file, to stream a batch at a time. */
export function csvLines(rows: ReadonlyArray<ReadonlyArray<string | number | null>>): string {
  if (rows.length === 0) return "";
  const cells = rows.map((row) => row.map((v) => neutraliseCell(v === null ? "" : String(v))));
  return Papa.unparse(cells, { newline: "\r\n" }) + "\r\n";
}

/** The CSV text for a header and rows: every cell neutralised, CRLF line ends, a BOM so spreadsheets read UTF-8. */
export function toCsv(rows: ReadonlyArray<ReadonlyArray<string | number | null>>): string {
  return CSV_BOM + csvLines(rows);
}

export type CsvRow = { line: number; values: Record<string, string> };
export type ParsedCsv = { ok: true; rows: CsvRow[]; ignoredColumns: string[] } | { ok: false; message: string };

/** Reads CSV text into rows keyed by header, each with the line it starts on (the header is line 1). */
export function parseCsv(text: string): ParsedCsv {
  const body = text.startsWith("\uFEFF") ? text.slice(1) : text;
  const records: Array<{ line: number; cells: string[] }> = [];
  const problems: string[] = [];
  let rowStart = 0;
  let counted = 0;
  let newlinesBefore = 0;
  Papa.parse<string[]>(body, {
    delimitersToGuess: [",", ";", "\t"],
    step: (result) => {
      newlinesBefore += countNewlines(body, counted, rowStart);
      counted = rowStart;
      const line = 1 + newlinesBefore;
      for (const e of result.errors) if (e.type !== "Delimiter") problems.push(`line ${line}: ${e.message}`);
      records.push({ line, cells: result.data });
      rowStart = result.meta.cursor;
    },
  });
  return toRows(records, problems);
}

function countNewlines(text: string, from: number, to: number) {
  let n = 0;
  for (let i = from; i < to; i++) if (text.charCodeAt(i) === 10) n++;
  return n;
}

function toRows(records: Array<{ line: number; cells: string[] }>, problems: string[]): ParsedCsv {
  if (problems.length)
    return { ok: false, message: `The file is not well-formed CSV (${problems.slice(0, 3).join("; ")}).` };
  const nonEmpty = records.filter((r) => r.cells.some((c) => c.trim() !== ""));
  const [head, ...data] = nonEmpty;
  if (!head) return { ok: false, message: "The file is empty: it needs a header line and at least one item." };
  const headers = head.cells.map((h) => h.trim().toLowerCase());
  const missing = REQUIRED_HEADERS.filter((h) => !headers.includes(h));
  if (missing.length) {
    return {
      ok: false,
      message: `The header line must name the columns ${REQUIRED_HEADERS.join(", ")}; it lacks ${missing.join(", ")}.`,
    };
  }
  const repeated = headers.filter((h, i) => h && headers.indexOf(h) !== i);
  if (repeated.length)
    return { ok: false, message: `The header line names ${[...new Set(repeated)].join(", ")} more than once.` };
  if (!data.length) return { ok: false, message: "The file has a header line but no items." };
  if (data.length > MAX_IMPORT_ROWS)
    return { ok: false, message: `The file has ${data.length} items; one import takes at most ${MAX_IMPORT_ROWS}.` };
  const known = new Set<string>(CSV_HEADERS);
  const ignoredColumns = headers.filter((h) => h && !known.has(h));
  const rows = data.map((r) => {
    const values: Record<string, string> = {};
    headers.forEach((h, i) => {
      if (h) values[h] = restoreCell(r.cells[i] ?? "");
    });
    return { line: r.line, values };
  });
  return { ok: true, rows, ignoredColumns };
}

export type RowError = { line: number; itemCode: string; messages: string[] };
export type ValidRow = { line: number; input: GearItemInput };

/**
 * Checks every row with the same schema as the item form; home sites are matched by name
 * (case-insensitive) against `siteIds`. A repeated item id is an error on each later line.
 */
export function validateGearRows(
  rows: CsvRow[],
  siteIds: ReadonlyMap<string, number>,
): { valid: ValidRow[]; errors: RowError[] } {
  const valid: ValidRow[] = [];
  const errors: RowError[] = [];
  const firstLine = new Map<string, number>();
  for (const row of rows) {
    const messages: string[] = [];
    const raw: Record<string, string> = {};
    for (const column of EDITABLE_COLUMNS)
      if (column.field !== "homeSite") raw[column.field] = row.values[column.header] ?? "";
    const parsed = gearItemSchema.safeParse(raw);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = issue.path[0];
        const column = EDITABLE_COLUMNS.find((c) => c.field === field)?.header ?? String(field ?? "row");
        messages.push(`${column}: ${issue.message}`);
      }
    }
    const siteName = (row.values.home_site ?? "").trim();
    const homeSiteId = siteName ? (siteIds.get(siteName.toLowerCase()) ?? null) : null;
    if (siteName && homeSiteId === null)
      messages.push(`home_site: there is no site named "${siteName}" in your organisation.`);
    const code = (row.values.item_code ?? "").trim();
    const seen = code ? firstLine.get(code) : undefined;
    if (seen !== undefined) messages.push(`item_code: ${code} is already on line ${seen} of this file.`);
    else if (code) firstLine.set(code, row.line);
    if (messages.length || !parsed.success) errors.push({ line: row.line, itemCode: code, messages });
    else valid.push({ line: row.line, input: { ...parsed.data, homeSiteId } });
  }
  return { valid, errors };
}

type ExportItem = { [K in keyof GearItemInput]: string | number | null } & {
  homeSiteName: string | null;
  wllKg: number;
  status: string;
  lastExaminedOn: string | null;
  nextDueOn: string | null;
  dueState: string;
};

/** The export's cells for one item, in CSV_HEADERS order. */
export function exportRow(item: ExportItem): Array<string | number | null> {
  const editable = EDITABLE_COLUMNS.map((c) => (c.field === "homeSite" ? item.homeSiteName : (item[c.field] ?? null)));
  return [
    ...editable,
    Math.round(item.wllKg * 1000) / 1000,
    item.status,
    item.lastExaminedOn,
    item.nextDueOn,
    item.dueState,
  ];
}
