import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
  type WhereOptions,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { sqlDialectOf } from "~/utils/sql-dialect.server";
import { dueState, DUE_SOON_DAYS, type DueState } from "~/gear/due";
import { addDays } from "~/utils/dates";
import { SPEC_FIELDS, type GearKind, type GearStatus } from "~/gear/kinds";
import type { GearItemInput } from "~/gear/schema";
import { AuditEvent, recordAudit } from "~/models/audit-event.server";
import { Site } from "~/models/site.server";
import { User } from "~/models/user.server";
import { massToKg, type MassUnit } from "~/statics/units";

/** One physical item of lifting gear, marked with the organisation's own id. */
export class GearItem extends Model<InferAttributes<GearItem>, InferCreationAttributes<GearItem>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare itemCode: string;
  declare kind: GearKind;
  declare description: CreationOptional<string>;
  declare manufacturer: CreationOptional<string>;
  declare serial: CreationOptional<string>;
  declare wllValue: number;
  declare wllUnit: MassUnit;
  declare wllKg: number;
  declare thread: string | null;
  declare eyeboltFamily: string | null;
  declare shackleType: string | null;
  declare pinType: string | null;
  declare chainGrade: number | null;
  declare diameterMm: number | null;
  declare legs: number | null;
  declare lengthM: number | null;
  declare hookHeightM: number | null;
  declare beamMassKg: number | null;
  /** A beam's drop lugs, m along it from end A ("0.25, 2.75"). */
  declare dropLugsM: string | null;
  /** A beam's top lug(s), m along it from end A: one for a lifting beam, two for a spreader. */
  declare topLugsM: string | null;
  /** The item's own mass, kg (null until recorded): the crane carries it with the load. */
  declare massKg: number | null;
  declare homeSiteId: number | null;
  declare status: CreationOptional<GearStatus>;
  declare statusReason: CreationOptional<string>;
  declare statusChangedBy: CreationOptional<number | null>;
  declare statusChangedAt: CreationOptional<Date | null>;
  declare lastExaminedOn: CreationOptional<string | null>;
  declare nextDueOn: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare homeSite?: NonAttribute<Site | null>;
  declare statusChanger?: NonAttribute<User | null>;
}

GearItem.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    itemCode: { type: DataTypes.STRING(40), allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    description: { type: DataTypes.STRING(300), allowNull: false, defaultValue: "" },
    manufacturer: { type: DataTypes.STRING(120), allowNull: false, defaultValue: "" },
    serial: { type: DataTypes.STRING(80), allowNull: false, defaultValue: "" },
    wllValue: { type: DataTypes.DOUBLE, allowNull: false },
    wllUnit: { type: DataTypes.STRING(10), allowNull: false },
    wllKg: { type: DataTypes.DOUBLE, allowNull: false },
    thread: { type: DataTypes.STRING(20), allowNull: true },
    eyeboltFamily: { type: DataTypes.STRING(10), allowNull: true },
    shackleType: { type: DataTypes.STRING(10), allowNull: true },
    pinType: { type: DataTypes.STRING(10), allowNull: true },
    chainGrade: { type: DataTypes.INTEGER, allowNull: true },
    diameterMm: { type: DataTypes.DOUBLE, allowNull: true },
    legs: { type: DataTypes.INTEGER, allowNull: true },
    lengthM: { type: DataTypes.DOUBLE, allowNull: true },
    hookHeightM: { type: DataTypes.DOUBLE, allowNull: true },
    beamMassKg: { type: DataTypes.DOUBLE, allowNull: true },
    dropLugsM: { type: DataTypes.STRING(200), allowNull: true },
    topLugsM: { type: DataTypes.STRING(200), allowNull: true },
    massKg: { type: DataTypes.DOUBLE, allowNull: true },
    homeSiteId: { type: DataTypes.INTEGER, allowNull: true },
    status: { type: DataTypes.STRING(15), allowNull: false, defaultValue: "in_service" },
    statusReason: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    statusChangedBy: { type: DataTypes.INTEGER, allowNull: true },
    statusChangedAt: { type: DataTypes.DATE, allowNull: true },
    lastExaminedOn: { type: DataTypes.DATEONLY, allowNull: true },
    nextDueOn: { type: DataTypes.DATEONLY, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "gear_items", underscored: true },
);

GearItem.belongsTo(Site, { foreignKey: "homeSiteId", as: "homeSite" });
GearItem.belongsTo(User, { foreignKey: "statusChangedBy", as: "statusChanger" });

export const GEAR_ENTITY = "gear_item";
const ENTITY = GEAR_ENTITY;

/** The stored columns for a checked input: the marked WLL as marked, plus its value in kg. */
function columnsFor(input: GearItemInput) {
  return { ...input, wllKg: massToKg(input.wllValue, input.wllUnit) };
}

/** The fields an import or an edit compares, in CSV order. */
export const COMPARED_FIELDS = [
  "itemCode",
  "kind",
  "description",
  "manufacturer",
  "serial",
  "wllValue",
  "wllUnit",
  ...SPEC_FIELDS,
  "massKg",
  "homeSiteId",
] as const satisfies ReadonlyArray<keyof GearItemInput>;

/** The names of the fields in which `input` differs from the stored item. */
export function changedFields(item: GearItem, input: GearItemInput): string[] {
  return COMPARED_FIELDS.filter((f) => (item[f] ?? null) !== (input[f] ?? null));
}

// ----- the register -----

export const GEAR_SORT_KEYS = ["itemCode", "kind", "wllKg", "status", "nextDueOn", "site"] as const;
export type GearSortKey = (typeof GEAR_SORT_KEYS)[number];

export type GearSearch = {
  q?: string;
  kind?: GearKind;
  status?: GearStatus;
  /** A site id, or "none" for items with no home site. */
  site?: number | "none";
  due?: DueState;
  sort: GearSortKey;
  dir: "asc" | "desc";
};

export type GearRow = {
  id: number;
  itemCode: string;
  kind: GearKind;
  description: string;
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
  dropLugsM: string | null;
  topLugsM: string | null;
  status: GearStatus;
  siteName: string | null;
  lastExaminedOn: string | null;
  nextDueOn: string | null;
  dueState: DueState;
};

function contains(column: string, q: string) {
  // instr() needs no escaping of % and _ the way LIKE would.
  return sequelize.where(
    sequelize.fn("instr", sequelize.fn("lower", sequelize.col(column)), q.toLowerCase()),
    Op.gt,
    0,
  );
}

/**
 * Items with `q` in their item id, description, manufacturer or serial (case-insensitive). Three characters or more
 * are looked up in the trigram index (migration 0026) as one phrase, bound as `$phrase`; shorter text, which no
 * trigram holds, is looked for in the columns themselves.
 */
export function searchWhere(q: string): { where: WhereOptions; bind?: { phrase: string } } {
  if (sqlDialectOf(sequelize) === "postgres") {
    // PostgreSQL: ILIKE on each column, served by its trigram index (migration 0026) from three characters on. The
    // pattern is bound, like every value reaching a statement that carries bound values.
    const phrase = `%${q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    return { where: sequelize.literal(ILIKE_ANY_COLUMN) as unknown as WhereOptions, bind: { phrase } };
  }
  const phrase = `"${q.replaceAll('"', '""')}"`;
  if ([...q].length >= 3) return { where: sequelize.literal(FTS_MATCH) as unknown as WhereOptions, bind: { phrase } };
  const columns = ["GearItem.item_code", "GearItem.description", "GearItem.manufacturer", "GearItem.serial"];
  return { where: { [Op.or]: columns.map((c) => contains(c, q)) } };
}
const ILIKE_ANY_COLUMN = `("GearItem"."item_code" ILIKE $phrase OR "GearItem"."description" ILIKE $phrase
  OR "GearItem"."manufacturer" ILIKE $phrase OR "GearItem"."serial" ILIKE $phrase)`;
const FTS_MATCH = '"GearItem"."id" IN (SELECT rowid FROM gear_items_search WHERE gear_items_search MATCH $phrase)';

export function dueWhere(due: DueState, today: string): WhereOptions {
  const soon = addDays(today, DUE_SOON_DAYS);
  switch (due) {
    case "overdue":
      return { nextDueOn: { [Op.lt]: today } };
    case "due_soon":
      return { nextDueOn: { [Op.gte]: today, [Op.lte]: soon } };
    case "in_date":
      return { nextDueOn: { [Op.gt]: soon } };
    case "never_examined":
      return { nextDueOn: null };
  }
}

/** The item as its edit form starts: its id and every field a register entry is made of. */
export function toFormValues(item: GearItem): GearItemInput & { id: number } {
  return { id: item.id, ...(Object.fromEntries(COMPARED_FIELDS.map((f) => [f, item[f]])) as GearItemInput) };
}

export const ROW_ATTRIBUTES = [
  "id",
  "itemCode",
  "kind",
  "description",
  "wllValue",
  "wllUnit",
  "wllKg",
  ...SPEC_FIELDS,
  "status",
  "lastExaminedOn",
  "nextDueOn",
] as const satisfies ReadonlyArray<keyof GearItem>;

export function toRow(item: GearItem, today: string): GearRow {
  return {
    id: item.id,
    itemCode: item.itemCode,
    kind: item.kind,
    description: item.description,
    wllValue: item.wllValue,
    wllUnit: item.wllUnit,
    wllKg: item.wllKg,
    thread: item.thread,
    eyeboltFamily: item.eyeboltFamily,
    shackleType: item.shackleType,
    pinType: item.pinType,
    chainGrade: item.chainGrade,
    diameterMm: item.diameterMm,
    legs: item.legs,
    lengthM: item.lengthM,
    hookHeightM: item.hookHeightM,
    beamMassKg: item.beamMassKg,
    dropLugsM: item.dropLugsM,
    topLugsM: item.topLugsM,
    status: item.status,
    siteName: item.homeSite?.name ?? null,
    lastExaminedOn: item.lastExaminedOn,
    nextDueOn: item.nextDueOn,
    dueState: dueState(item.nextDueOn, today),
  };
}

/** How many items not withdrawn are overdue, and due within DUE_SOON_DAYS, on `today`. */
export async function countGearDue(organisationId: number, today: string) {
  const base = { organisationId, status: { [Op.ne]: "withdrawn" } };
  const [overdue, dueSoon] = await Promise.all([
    GearItem.count({ where: { ...base, ...dueWhere("overdue", today) } }),
    GearItem.count({ where: { ...base, ...dueWhere("due_soon", today) } }),
  ]);
  return { overdue, dueSoon };
}

/** Every item of the organisation in item id order, for the CSV export. */
export async function listAllGearItems(organisationId: number) {
  return GearItem.findAll({
    where: { organisationId },
    include: [{ model: Site, as: "homeSite" }],
    order: [["itemCode", "ASC"]],
  });
}

export async function getGearItem(organisationId: number, itemId: number) {
  return GearItem.findOne({
    where: { organisationId, id: itemId },
    include: [
      { model: Site, as: "homeSite" },
      { model: User, as: "statusChanger", attributes: ["id", "name"] },
    ],
  });
}

/** The organisation's items with these ids (those a plan allocates). */
export async function listGearItemsByIds(organisationId: number, ids: readonly number[], transaction?: Transaction) {
  const unique = [...new Set(ids)];
  if (unique.length === 0) return [];
  return GearItem.findAll({ where: { organisationId, id: { [Op.in]: unique } }, transaction });
}

export async function isItemCodeTaken(organisationId: number, itemCode: string, exceptItemId?: number) {
  const item = await GearItem.findOne({ where: { organisationId, itemCode }, attributes: ["id"] });
  return !!item && item.id !== exceptItemId;
}

export async function createGearItem(organisationId: number, input: GearItemInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const item = await GearItem.create({ organisationId, ...columnsFor(input) }, { transaction });
    await recordAudit(
      { organisationId, userId: actorId, entity: ENTITY, entityId: item.id, action: "created" },
      transaction,
    );
    return item;
  });
}

/** Saves an edit; false when the item is not the organisation's. Status is changed only by changeGearStatus. */
export async function updateGearItem(organisationId: number, itemId: number, input: GearItemInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const item = await GearItem.findOne({ where: { organisationId, id: itemId }, transaction });
    if (!item) return false;
    const changed = changedFields(item, input);
    if (!changed.length) return true;
    await item.update(columnsFor(input), { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: itemId,
        action: "updated",
        details: { fields: changed },
      },
      transaction,
    );
    return true;
  });
}

/** Sets an item's status inside `transaction`, with the reason, who and when, and records it in the audit trail. */
export async function setGearStatus(
  item: GearItem,
  change: { status: GearStatus; reason: string; actorId: number; action?: string; details?: Record<string, unknown> },
  transaction: Transaction,
) {
  const from = item.status;
  await item.update(
    {
      status: change.status,
      statusReason: change.reason,
      statusChangedBy: change.actorId,
      statusChangedAt: new Date(),
    },
    { transaction },
  );
  await recordAudit(
    {
      organisationId: item.organisationId,
      userId: change.actorId,
      entity: ENTITY,
      entityId: item.id,
      action: change.action ?? "status changed",
      details: { from, to: change.status, reason: change.reason, ...change.details },
    },
    transaction,
  );
}

/**
 * Items that may need attention by `until`: not withdrawn, and quarantined, never examined, or due on
 * or before `until` (overdue included). Every organisation's when `organisationId` is left out.
 */
export async function listGearNeedingAttention(until: string, organisationId?: number) {
  return GearItem.findAll({
    where: {
      ...(organisationId === undefined ? {} : { organisationId }),
      status: { [Op.ne]: "withdrawn" },
      [Op.or]: [{ nextDueOn: { [Op.lte]: until } }, { nextDueOn: null }, { status: "quarantined" }],
    },
    include: [{ model: Site, as: "homeSite" }],
    order: [
      ["organisationId", "ASC"],
      ["nextDueOn", "ASC"],
      ["itemCode", "ASC"],
    ],
  });
}

// ----- import -----

export type ImportCounts = { created: number; updated: number; unchanged: number };

/** What importing `inputs` would do, matched by item id: new codes are created, changed items updated. */
export async function planGearImport(organisationId: number, inputs: GearItemInput[], transaction?: Transaction) {
  // The whole register, not an IN list: an import may name thousands of ids.
  const existing = await GearItem.findAll({ where: { organisationId }, transaction });
  const byCode = new Map(existing.map((item) => [item.itemCode, item]));
  const plan = inputs.map((input) => {
    const item = byCode.get(input.itemCode);
    if (!item) return { input, item: null, changed: [] as string[], action: "create" as const };
    const changed = changedFields(item, input);
    return { input, item, changed, action: changed.length ? ("update" as const) : ("unchanged" as const) };
  });
  const counts: ImportCounts = {
    created: plan.filter((p) => p.action === "create").length,
    updated: plan.filter((p) => p.action === "update").length,
    unchanged: plan.filter((p) => p.action === "unchanged").length,
  };
  return { plan, counts };
}

/** Applies an import in one transaction: every row or none. Status and examinations are never changed by an import. */
export async function applyGearImport(
  organisationId: number,
  inputs: GearItemInput[],
  actorId: number,
  source: { fileId: number; fileName: string },
) {
  return sequelize.transaction(async (transaction) => {
    const { plan, counts } = await planGearImport(organisationId, inputs, transaction);
    const toCreate = plan.filter((p) => p.action === "create");
    const created = await GearItem.bulkCreate(
      toCreate.map((p) => ({ organisationId, ...columnsFor(p.input) })),
      { transaction },
    );
    const audits: Array<Omit<InferCreationAttributes<AuditEvent>, "id" | "createdAt">> = created.map((item) => ({
      organisationId,
      userId: actorId,
      entity: ENTITY,
      entityId: item.id,
      action: "imported",
      details: JSON.stringify({ fileId: source.fileId, fileName: source.fileName }),
    }));
    for (const p of plan) {
      if (p.action !== "update" || !p.item) continue;
      await p.item.update(columnsFor(p.input), { transaction });
      audits.push({
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: p.item.id,
        action: "updated by import",
        details: JSON.stringify({ fields: p.changed, fileId: source.fileId, fileName: source.fileName }),
      });
    }
    await AuditEvent.bulkCreate(audits, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "gear_import",
        entityId: source.fileId,
        action: "imported",
        details: { ...counts, fileName: source.fileName },
      },
      transaction,
    );
    return counts;
  });
}
