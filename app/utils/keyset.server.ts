// Lists read a page at a time by the sort key of the row at the page's edge (keyset pagination), never by OFFSET:
// a page costs the same at the first row and the fifty-thousandth, and a row added meanwhile shifts nothing.
//
// A list names its sort keys (SQL expressions that are never NULL, the last one unique, e.g. the id); the page's
// links carry the edge row's keys as an opaque cursor: `?after=` for the next page, `?before=` for the previous.

export const PAGE_SIZE = 50;

export type SortKey = { sql: string; direction: "ASC" | "DESC" };
export type KeyValue = string | number;
export type PageRequest = { cursor: KeyValue[] | null; towards: "next" | "previous"; limit: number };
export type Page<T> = { rows: T[]; next: string | null; previous: string | null };

export function encodeCursor(values: readonly KeyValue[]): string {
  return Buffer.from(JSON.stringify(values), "utf8").toString("base64url");
}

/** The cursor's values when it is one this list could have made (`keys.length` strings or numbers), else null. */
export function decodeCursor(raw: string | null, keys: readonly SortKey[]): KeyValue[] | null {
  if (!raw || raw.length > 2000 || !/^[A-Za-z0-9_-]+$/.test(raw)) return null;
  try {
    const values: unknown = JSON.parse(Buffer.from(raw, "base64url").toString("utf8"));
    if (!Array.isArray(values) || values.length !== keys.length) return null;
    const ok = values.every((v) => (typeof v === "number" && Number.isFinite(v)) || typeof v === "string");
    return ok ? (values as KeyValue[]) : null;
  } catch {
    return null;
  }
}

/** Which page the URL asks for: `?after=` (the next page), `?before=` (the previous one) or the first page. */
export function readPageRequest(url: URL, keys: readonly SortKey[], limit = PAGE_SIZE): PageRequest {
  const after = decodeCursor(url.searchParams.get("after"), keys);
  if (after) return { cursor: after, towards: "next", limit };
  const before = decodeCursor(url.searchParams.get("before"), keys);
  if (before) return { cursor: before, towards: "previous", limit };
  return { cursor: null, towards: "next", limit };
}

/** How a page is read: from the start, after the cursor, or before it (backwards, turned round by `pageOf`). */
export type KeysetWay = "first" | "next" | "previous";

/** Each way's WHERE condition and ORDER BY: SQL fixed when the list is defined, the cursor's values bound. */
export type KeysetSql = Record<KeysetWay, { where: string; order: string }>;

/**
 * The fixed SQL for a list's sort keys: for each way of reading, the condition for rows beyond the cursor (its
 * values bound as `$key0`, `$key1`, ... in key order) and the order. Reading backwards reverses the order.
 * Made once per list, at load time, from the list's own constant keys: no value ever reaches this text.
 */
export function keysetSql(keys: readonly SortKey[]): KeysetSql {
  const orderBy = (backwards: boolean) =>
    keys.map((k) => `${k.sql} ${(k.direction === "ASC") !== backwards ? "ASC" : "DESC"}`).join(", ");
  const beyond = (backwards: boolean) => {
    const alternatives = keys.map((key, i) => {
      const equal = keys.slice(0, i).map((k, j) => `${k.sql} = $key${j}`);
      const past = `${key.sql} ${(key.direction === "ASC") !== backwards ? ">" : "<"} $key${i}`;
      return `(${[...equal, past].join(" AND ")})`;
    });
    return `(${alternatives.join(" OR ")})`;
  };
  return {
    first: { where: "1 = 1", order: orderBy(false) },
    next: { where: beyond(false), order: orderBy(false) },
    previous: { where: beyond(true), order: orderBy(true) },
  };
}

/** Which of `keysetSql`'s statements reads the requested page. */
export function keysetWay(request: PageRequest): KeysetWay {
  return request.cursor ? request.towards : "first";
}

/**
 * The bound values for `keysetSql`'s condition and the LIMIT (`$limit`: one row more than the page, to learn
 * whether there is another).
 */
export function keysetBind(request: PageRequest): Record<string, KeyValue> {
  const bind: Record<string, KeyValue> = { limit: request.limit + 1 };
  (request.cursor ?? []).forEach((value, i) => (bind[`key${i}`] = value));
  return bind;
}

/** The page from the rows read with `keysetSql` (up to limit + 1, in reading order), with its links' cursors. */
export function pageOf<T>(rows: readonly T[], request: PageRequest, keyOf: (row: T) => KeyValue[]): Page<T> {
  const more = rows.length > request.limit;
  const shown = rows.slice(0, request.limit);
  if (request.towards === "previous") shown.reverse();
  const first = shown[0];
  const last = shown[shown.length - 1];
  const forwards = request.towards === "next";
  return {
    rows: shown,
    next: last && (forwards ? more : true) ? encodeCursor(keyOf(last)) : null,
    previous: first && (forwards ? request.cursor !== null : more) ? encodeCursor(keyOf(first)) : null,
  };
}

/** The query string of a page link: the page's other parameters kept, the cursor replaced. */
export function pageHref(url: URL | string, which: "after" | "before", cursor: string) {
  const u = new URL(url, "http://x");
  u.searchParams.delete("after");
  u.searchParams.delete("before");
  u.searchParams.set(which, cursor);
  return `${u.pathname}?${u.searchParams.toString()}`;
}

/** The page's Previous / Next hrefs for the `Pager`. */
export function pageLinks(url: URL, page: Pick<Page<unknown>, "next" | "previous">) {
  return {
    previous: page.previous ? pageHref(url, "before", page.previous) : null,
    next: page.next ? pageHref(url, "after", page.next) : null,
  };
}
