// Reads of the register that must cost the same at 50,000 items as at 50: the register's pages (by keyset), the export
// a batch at a time, and the dashboard's count of what needs attention with the first few items of each group.
import { Op, QueryTypes, type WhereOptions } from "sequelize";
import type { AttentionGroup } from "~/gear/attention";
import type { GearKind, GearStatus } from "~/gear/kinds";
import type { MassUnit } from "~/statics/units";
import {
  dueWhere,
  GearItem,
  ROW_ATTRIBUTES,
  searchWhere,
  toRow,
  type GearRow,
  type GearSearch,
  type GearSortKey,
} from "~/models/gear-item.server";
import { Site } from "~/models/site.server";
import { sequelize } from "~/utils/db.server";
import { pageOf, type KeyValue, type Page, type PageRequest, type SortKey } from "~/utils/keyset.server";

export type GearExportRow = {
  itemCode: string;
  kind: GearKind;
  description: string;
  manufacturer: string;
  serial: string;
  wllValue: number;
  wllUnit: MassUnit;
  wllKg: number;
  thread: string | null;
  eyeboltFamily: string | null;
  shackleType: string | null;
  pinType: string | null;
  chainGrade: number | null;
  diameterMm: number | null;
  legs: number | null;
  lengthM: number | null;
  hookHeightM: number | null;
  beamMassKg: number | null;
  massKg: number | null;
  dropLugsM: string | null;
  topLugsM: string | null;
  homeSiteName: string | null;
  status: GearStatus;
  lastExaminedOn: string | null;
  nextDueOn: string | null;
};

const EXPORT_COLUMNS = `g.item_code AS "itemCode", g.kind AS kind, g.description AS description,
  g.manufacturer AS manufacturer, g.serial AS serial, g.wll_value AS "wllValue", g.wll_unit AS "wllUnit",
  g.wll_kg AS "wllKg", g.thread AS thread, g.eyebolt_family AS "eyeboltFamily", g.shackle_type AS "shackleType",
  g.pin_type AS "pinType", g.chain_grade AS "chainGrade", g.diameter_mm AS "diameterMm", g.legs AS legs,
  g.length_m AS "lengthM", g.hook_height_m AS "hookHeightM", g.beam_mass_kg AS "beamMassKg", g.mass_kg AS "massKg",
  g.drop_lugs_m AS "dropLugsM", g.top_lugs_m AS "topLugsM",
  s.name AS "homeSiteName", g.status AS status, g.last_examined_on AS "lastExaminedOn", g.next_due_on AS "nextDueOn"`;

const EXPORT_FIRST_BATCH = `SELECT ${EXPORT_COLUMNS}
   FROM gear_items g LEFT JOIN sites s ON s.id = g.home_site_id
  WHERE g.organisation_id = $organisationId
  ORDER BY g.item_code LIMIT $limit`;

const EXPORT_NEXT_BATCH = `SELECT ${EXPORT_COLUMNS}
   FROM gear_items g LEFT JOIN sites s ON s.id = g.home_site_id
  WHERE g.organisation_id = $organisationId AND g.item_code > $afterItemCode
  ORDER BY g.item_code LIMIT $limit`;

/**
 * Up to `limit` items of the organisation in item id order, after `afterItemCode` (from the first when null): the
 * export's next batch, read through the (organisation, item id) index.
 */
export async function readGearExportBatch(organisationId: number, afterItemCode: string | null, limit: number) {
  if (afterItemCode === null)
    return sequelize.query<GearExportRow>(EXPORT_FIRST_BATCH, {
      bind: { organisationId, limit },
      type: QueryTypes.SELECT,
    });
  return sequelize.query<GearExportRow>(EXPORT_NEXT_BATCH, {
    bind: { organisationId, afterItemCode, limit },
    type: QueryTypes.SELECT,
  });
}

export type AttentionPreview = { id: number; itemCode: string; description: string; nextDueOn: string | null };

const USABLE = "g.status NOT IN ('withdrawn', 'quarantined')";

/**
 * Each attention group's condition (attentionGroup in gear/attention.ts, as SQL) and the dates it binds: `$today`,
 * and for due soon `$until`.
 */
const ATTENTION_GROUP_SQL: Record<AttentionGroup, { where: string; dates: ReadonlyArray<"today" | "until"> }> = {
  quarantined: { where: "g.status = 'quarantined'", dates: [] },
  never_examined: { where: `${USABLE} AND g.next_due_on IS NULL`, dates: [] },
  overdue: { where: `${USABLE} AND g.next_due_on < $today`, dates: ["today"] },
  due_soon: { where: `${USABLE} AND g.next_due_on >= $today AND g.next_due_on <= $until`, dates: ["today", "until"] },
};

/**
 * How many items fall in each attention group on `today` (due soon: by `until`), and the first `perGroup` of each
 * in due date and item id order: counted in the database, never read whole.
 */
export async function gearAttentionSummary(
  organisationId: number,
  today: string,
  until: string,
  groups: readonly AttentionGroup[],
  perGroup: number,
) {
  const dates = { today, until };
  return Promise.all(
    groups.map(async (group) => {
      const condition = ATTENTION_GROUP_SQL[group];
      const bind = { organisationId, ...Object.fromEntries(condition.dates.map((d) => [d, dates[d]])) };
      const [counted] = await sequelize.query<{ n: number }>(
        `SELECT COUNT(*) AS n FROM gear_items g
          WHERE g.organisation_id = $organisationId AND ${ATTENTION_GROUP_SQL[group].where}`,
        { bind, type: QueryTypes.SELECT },
      );
      const items = await sequelize.query<AttentionPreview>(
        `SELECT g.id AS id, g.item_code AS "itemCode", g.description AS description, g.next_due_on AS "nextDueOn"
           FROM gear_items g WHERE g.organisation_id = $organisationId AND ${ATTENTION_GROUP_SQL[group].where}
          ORDER BY g.next_due_on, g.item_code LIMIT $perGroup`,
        { bind: { ...bind, perGroup }, type: QueryTypes.SELECT },
      );
      return { group, count: counted?.n ?? 0, items };
    }),
  );
}

/**
 * The register's order: the sort column, then the item code (unique in an organisation). A missing home site sorts
 * as "" and a missing next due date as the earliest date (as NULL does in SQLite), so every row has a key to page
 * from and the order is the same in any database. The cursor carries NEVER_DUE for a missing due date.
 */
const NEVER_DUE = "0001-01-01";
function sortExpression(sort: Exclude<GearSortKey, "itemCode">) {
  switch (sort) {
    case "nextDueOn":
      return sequelize.col("GearItem.next_due_on");
    case "site":
      return sequelize.fn("COALESCE", sequelize.col("homeSite.name"), "");
    case "kind":
      return sequelize.col("GearItem.kind");
    case "wllKg":
      return sequelize.col("GearItem.wll_kg");
    case "status":
      return sequelize.col("GearItem.status");
  }
}

/**
 * The due date's direction: with no date first going up and last going down, which PostgreSQL must be told (its
 * default is the other way) and SQLite does by itself (where saying it could cost the index, migration 0031).
 */
function dueDirection(dir: "ASC" | "DESC") {
  if (sequelize.getDialect() !== "postgres") return dir;
  return dir === "ASC" ? "ASC NULLS FIRST" : "DESC NULLS LAST";
}

/**
 * The rows after the cursor's (`dueKey`, `codeKey` bound) in the due-date order going `dir`, a missing date being the
 * earliest. SQL's comparisons with NULL are never true, so the missing dates are named.
 */
function pastDueKey(dir: "ASC" | "DESC", cursorDue: KeyValue, dueKey: unknown, codeKey: unknown): WhereOptions {
  const due = sequelize.col("GearItem.next_due_on");
  const code = { itemCode: { [dir === "ASC" ? Op.gt : Op.lt]: codeKey } };
  if (cursorDue === NEVER_DUE) {
    return dir === "ASC"
      ? { [Op.or]: [{ [Op.and]: [{ nextDueOn: null }, code] }, { nextDueOn: { [Op.ne]: null } }] }
      : { [Op.and]: [{ nextDueOn: null }, code] };
  }
  const beyond = sequelize.where(due, dir === "ASC" ? Op.gt : Op.lt, dueKey);
  const same = { [Op.and]: [sequelize.where(due, Op.eq, dueKey), code] };
  return dir === "ASC" ? { [Op.or]: [beyond, same] } : { [Op.or]: [beyond, { nextDueOn: null }, same] };
}

/** The keys of a register page's edge row (its cursor): the sort column's value (unless it is the item id), the item id. */
export function gearPageKeys(sort: GearSortKey): SortKey[] {
  const itemCode: SortKey = { sql: "item_code", direction: "ASC" };
  return sort === "itemCode" ? [itemCode] : [{ sql: sort, direction: "ASC" }, itemCode];
}

function edgeKeys(row: GearRow, sort: GearSortKey): KeyValue[] {
  if (sort === "itemCode") return [row.itemCode];
  const value =
    sort === "nextDueOn" ? (row.nextDueOn ?? NEVER_DUE) : sort === "site" ? (row.siteName ?? "") : row[sort];
  return [value, row.itemCode];
}

/**
 * One page of the organisation's register, filtered and sorted in the database, read by keyset (never OFFSET, never
 * a count of the whole register): a page costs the same at the first item and the fifty-thousandth.
 */
export async function searchGearItems(
  organisationId: number,
  search: GearSearch,
  today: string,
  request: PageRequest,
): Promise<Page<GearRow>> {
  const and: WhereOptions[] = [{ organisationId }];
  if (search.kind) and.push({ kind: search.kind });
  if (search.status) and.push({ status: search.status });
  if (search.site === "none") and.push({ homeSiteId: null });
  else if (search.site) and.push({ homeSiteId: search.site });
  if (search.due) and.push(dueWhere(search.due, today));
  const q = search.q?.trim();
  const text = q ? searchWhere(q) : null;
  if (text) and.push(text.where);
  // Descending is the ascending order reversed, the item code included, so that one index serves both ways
  // (migration 0030). Reading backwards (the previous page) turns every direction round; pageOf puts the rows back
  // in order.
  const backwards = request.cursor !== null && request.towards === "previous";
  const sortDir = (search.dir === "desc") !== backwards ? "DESC" : "ASC";
  const codeDir = sortDir;
  const past = (dir: string) => (dir === "ASC" ? Op.gt : Op.lt);
  const sortKey = search.sort === "itemCode" ? null : sortExpression(search.sort);
  const order: Array<[unknown, string]> = sortKey
    ? [[sortKey, search.sort === "nextDueOn" ? dueDirection(sortDir) : sortDir]]
    : [];
  order.push(["itemCode", codeDir]);
  // The cursor's values are bound ($key0, $key1), never written into the statement.
  const key0 = sequelize.literal("$key0");
  const key1 = sequelize.literal("$key1");
  if (request.cursor && search.sort === "nextDueOn") {
    and.push(pastDueKey(sortDir, request.cursor[0]!, key0, key1));
  } else if (request.cursor && sortKey) {
    and.push({
      [Op.or]: [
        sequelize.where(sortKey, past(sortDir), key0),
        { [Op.and]: [sequelize.where(sortKey, Op.eq, key0), { itemCode: { [past(codeDir)]: key1 } }] },
      ],
    });
  } else if (request.cursor) and.push({ itemCode: { [past(codeDir)]: key0 } });
  // A cursor at an item never examined names no date ($key0 is not in the statement, and SQLite refuses a value
  // bound to nothing).
  const keys = (request.cursor ?? []).map((v, i) => [`key${i}`, v] as const);
  const neverDue = search.sort === "nextDueOn" && request.cursor?.[0] === NEVER_DUE;
  const bind = { ...text?.bind, ...Object.fromEntries(neverDue ? keys.slice(1) : keys) };
  const rows = await GearItem.findAll({
    where: { [Op.and]: and },
    attributes: [...ROW_ATTRIBUTES],
    include: [{ model: Site, as: "homeSite", required: false, attributes: ["name"] }],
    order: order as never,
    // One row more than the page, to learn whether there is another.
    limit: request.limit + 1,
    // Plain rows of the columns a row shows: building model instances cost more than the query.
    raw: true,
    nest: true,
    bind,
  });
  return pageOf(
    rows.map((r) => toRow(r, today)),
    request,
    (row) => edgeKeys(row, search.sort),
  );
}
