import {
  DataTypes,
  Model,
  Op,
  QueryTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import type { ComponentDefinition, CogSource, MassSource } from "~/loads/component-definition";
import { sequelize } from "~/utils/db.server";
import { bySqlDialect, caseInsensitiveLike } from "~/utils/sql-dialect.server";
import { recordAudit } from "~/models/audit-event.server";
import { StoredFile } from "~/models/stored-file.server";
import {
  keysetBind,
  keysetSql,
  keysetWay,
  pageOf,
  type Page,
  type PageRequest,
  type SortKey,
} from "~/utils/keyset.server";

export class Component extends Model<InferAttributes<Component>, InferCreationAttributes<Component>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare name: string;
  declare description: string;
  declare massKg: number;
  declare massSource: MassSource;
  declare massNote: string;
  declare contingencyPct: number;
  declare lengthM: number;
  declare widthM: number;
  declare heightM: number;
  declare cogXM: number;
  declare cogYM: number;
  declare cogZM: number;
  declare cogSource: CogSource;
  declare cogNote: string;
  declare fitToleranceDeg: CreationOptional<number | null>;
  declare fitToleranceSource: CreationOptional<string>;
  declare outlineElevation: string;
  declare outlinePlan: string;
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare liftPoints?: NonAttribute<ComponentLiftPoint[]>;
  declare parts?: NonAttribute<ComponentPart[]>;
}

export class ComponentLiftPoint extends Model<
  InferAttributes<ComponentLiftPoint>,
  InferCreationAttributes<ComponentLiftPoint>
> {
  declare id: CreationOptional<number>;
  declare componentId: number;
  declare position: number;
  declare label: string;
  declare xM: number;
  declare yM: number;
  declare zM: number;
  declare axisX: number;
  declare axisY: number;
  declare axisZ: number;
  declare thread: string;
  declare engagementMm: number | null;
}

export class ComponentPart extends Model<InferAttributes<ComponentPart>, InferCreationAttributes<ComponentPart>> {
  declare id: CreationOptional<number>;
  declare componentId: number;
  declare position: number;
  declare name: string;
  declare massKg: number;
  declare xM: number;
  declare yM: number;
  declare zM: number;
}

const double = (allowNull = false) => ({ type: DataTypes.DOUBLE, allowNull });

Component.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    massKg: double(),
    massSource: { type: DataTypes.STRING(20), allowNull: false },
    massNote: { type: DataTypes.STRING(500), allowNull: false },
    contingencyPct: double(),
    lengthM: double(),
    widthM: double(),
    heightM: double(),
    cogXM: { ...double(), field: "cog_x_m" },
    cogYM: { ...double(), field: "cog_y_m" },
    cogZM: { ...double(), field: "cog_z_m" },
    cogSource: { type: DataTypes.STRING(20), allowNull: false },
    cogNote: { type: DataTypes.STRING(500), allowNull: false },
    fitToleranceDeg: { type: DataTypes.DOUBLE, allowNull: true, defaultValue: null },
    fitToleranceSource: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
    outlineElevation: { type: DataTypes.TEXT, allowNull: false },
    outlinePlan: { type: DataTypes.TEXT, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    archivedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "components", underscored: true },
);

ComponentLiftPoint.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    componentId: { type: DataTypes.INTEGER, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    label: { type: DataTypes.STRING(10), allowNull: false },
    xM: { ...double(), field: "x_m" },
    yM: { ...double(), field: "y_m" },
    zM: { ...double(), field: "z_m" },
    axisX: double(),
    axisY: double(),
    axisZ: double(),
    thread: { type: DataTypes.STRING(20), allowNull: false },
    engagementMm: double(true),
  },
  { sequelize, tableName: "component_lift_points", underscored: true, timestamps: false },
);

ComponentPart.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    componentId: { type: DataTypes.INTEGER, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.STRING(200), allowNull: false },
    massKg: double(),
    xM: { ...double(), field: "x_m" },
    yM: { ...double(), field: "y_m" },
    zM: { ...double(), field: "z_m" },
  },
  { sequelize, tableName: "component_parts", underscored: true, timestamps: false },
);

Component.hasMany(ComponentLiftPoint, { foreignKey: "componentId", as: "liftPoints" });
Component.hasMany(ComponentPart, { foreignKey: "componentId", as: "parts" });

/** The component as a plain SI definition (what a plan snapshots). */
export function toDefinition(component: Component): ComponentDefinition {
  return {
    name: component.name,
    description: component.description,
    massKg: component.massKg,
    massSource: component.massSource,
    massNote: component.massNote,
    contingencyPct: component.contingencyPct,
    lengthM: component.lengthM,
    widthM: component.widthM,
    heightM: component.heightM,
    cog: { x: component.cogXM, y: component.cogYM, z: component.cogZM },
    cogSource: component.cogSource,
    cogNote: component.cogNote,
    fitToleranceDeg: component.fitToleranceDeg ?? null,
    fitToleranceSource: component.fitToleranceSource ?? "",
    outlineElevation: JSON.parse(component.outlineElevation) as Array<[number, number]>,
    outlinePlan: JSON.parse(component.outlinePlan) as Array<[number, number]>,
    liftPoints: [...(component.liftPoints ?? [])]
      .sort((a, b) => a.position - b.position)
      .map((p) => ({
        label: p.label,
        position: { x: p.xM, y: p.yM, z: p.zM },
        axis: { x: p.axisX, y: p.axisY, z: p.axisZ },
        thread: p.thread,
        engagementMm: p.engagementMm,
      })),
    parts: [...(component.parts ?? [])]
      .sort((a, b) => a.position - b.position)
      .map((p) => ({ name: p.name, massKg: p.massKg, position: { x: p.xM, y: p.yM, z: p.zM } })),
  };
}

function columns(def: ComponentDefinition) {
  return {
    name: def.name,
    description: def.description,
    massKg: def.massKg,
    massSource: def.massSource,
    massNote: def.massNote,
    contingencyPct: def.contingencyPct,
    lengthM: def.lengthM,
    widthM: def.widthM,
    heightM: def.heightM,
    cogXM: def.cog.x,
    cogYM: def.cog.y,
    cogZM: def.cog.z,
    cogSource: def.cogSource,
    cogNote: def.cogNote,
    fitToleranceDeg: def.fitToleranceDeg ?? null,
    fitToleranceSource: def.fitToleranceSource ?? "",
    outlineElevation: JSON.stringify(def.outlineElevation),
    outlinePlan: JSON.stringify(def.outlinePlan),
  };
}

const withChildren = [
  { model: ComponentLiftPoint, as: "liftPoints" },
  { model: ComponentPart, as: "parts" },
];

export async function listComponents(organisationId: number, options: { archived?: boolean; query?: string } = {}) {
  return Component.findAll({
    where: {
      organisationId,
      archivedAt: options.archived ? { [Op.ne]: null } : null,
      ...(options.query
        ? { name: { [caseInsensitiveLike(sequelize)]: `%${options.query.replace(/[%_\\]/g, (c) => `\\${c}`)}%` } }
        : {}),
    },
    include: [{ model: ComponentLiftPoint, as: "liftPoints" }],
    order: [["name", "ASC"]],
  });
}

export type ComponentListRow = {
  id: number;
  name: string;
  massKg: number;
  massSource: MassSource;
  contingencyPct: number;
  /** How many lift points it has. */
  liftPoints: number;
};

export const COMPONENT_LIST_KEYS: SortKey[] = [
  { sql: "c.name", direction: "ASC" },
  { sql: "c.id", direction: "ASC" },
];
const COMPONENT_KEYSET = keysetSql(COMPONENT_LIST_KEYS);

/** Every component, or those whose name holds `$query` (any case). */
const NAME_FILTER = {
  any: "TRUE",
  holds: bySqlDialect(sequelize, {
    sqlite: "instr(lower(c.name), lower($query)) > 0",
    postgres: "strpos(lower(c.name), lower($query)) > 0",
  }),
};

/** The current components, or the archived ones. */
const ARCHIVED_CONDITION = { current: "c.archived_at IS NULL", archived: "c.archived_at IS NOT NULL" } as const;

const COMPONENT_LIST_COLUMNS = `c.id AS id, c.name AS name, c.mass_kg AS "massKg", c.mass_source AS "massSource",
  c.contingency_pct AS "contingencyPct",
  (SELECT COUNT(*) FROM component_lift_points p WHERE p.component_id = c.id) AS "liftPoints"`;

/** One page of the organisation's current (or archived) components by name, optionally those whose name holds `query`. */
export async function listComponentsPage(
  organisationId: number,
  request: PageRequest,
  options: { archived?: boolean; query?: string } = {},
): Promise<Page<ComponentListRow>> {
  const way = keysetWay(request);
  const rows = await sequelize.query<ComponentListRow>(
    `SELECT ${COMPONENT_LIST_COLUMNS} FROM components c
      WHERE c.organisation_id = $organisationId
        AND ${ARCHIVED_CONDITION[options.archived ? "archived" : "current"]}
        AND ${NAME_FILTER[options.query ? "holds" : "any"]}
        AND ${COMPONENT_KEYSET[way].where} ORDER BY ${COMPONENT_KEYSET[way].order} LIMIT $limit`,
    {
      bind: { organisationId, ...(options.query ? { query: options.query } : {}), ...keysetBind(request) },
      type: QueryTypes.SELECT,
    },
  );
  return pageOf(rows, request, (c) => [c.name, c.id]);
}

/** The current components a plan can be made from (those with lift points), by name: the columns a choice shows. */
export async function listComponentChoices(organisationId: number) {
  return sequelize.query<Pick<ComponentListRow, "id" | "name" | "massKg" | "liftPoints">>(
    `SELECT c.id AS id, c.name AS name, c.mass_kg AS "massKg",
            (SELECT COUNT(*) FROM component_lift_points p WHERE p.component_id = c.id) AS "liftPoints"
       FROM components c
      WHERE c.organisation_id = $organisationId AND c.archived_at IS NULL
        AND EXISTS (SELECT 1 FROM component_lift_points p WHERE p.component_id = c.id)
      ORDER BY c.name, c.id`,
    { bind: { organisationId }, type: QueryTypes.SELECT },
  );
}

export async function getComponent(organisationId: number, componentId: number, transaction?: Transaction) {
  return Component.findOne({ where: { organisationId, id: componentId }, include: withChildren, transaction });
}

/** The component's id and current version only (a plain row), or null. */
export async function getComponentVersion(organisationId: number, componentId: number) {
  return Component.findOne({ where: { organisationId, id: componentId }, attributes: ["id", "version"], raw: true });
}

async function writeChildren(
  componentId: number,
  def: ComponentDefinition,
  transaction: import("sequelize").Transaction,
) {
  await ComponentLiftPoint.destroy({ where: { componentId }, transaction });
  await ComponentPart.destroy({ where: { componentId }, transaction });
  await ComponentLiftPoint.bulkCreate(
    def.liftPoints.map((p, position) => ({
      componentId,
      position,
      label: p.label,
      xM: p.position.x,
      yM: p.position.y,
      zM: p.position.z,
      axisX: p.axis.x,
      axisY: p.axis.y,
      axisZ: p.axis.z,
      thread: p.thread,
      engagementMm: p.engagementMm,
    })),
    { transaction },
  );
  await ComponentPart.bulkCreate(
    def.parts.map((p, position) => ({
      componentId,
      position,
      name: p.name,
      massKg: p.massKg,
      xM: p.position.x,
      yM: p.position.y,
      zM: p.position.z,
    })),
    { transaction },
  );
}

export async function createComponent(organisationId: number, def: ComponentDefinition, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const component = await Component.create({ organisationId, ...columns(def), archivedAt: null }, { transaction });
    await writeChildren(component.id, def, transaction);
    await recordAudit(
      { organisationId, userId: actorId, entity: "component", entityId: component.id, action: "created" },
      transaction,
    );
    return component;
  });
}

/**
 * Saves a new version of the component when `expectedVersion` is still current; returns the new
 * version, or null when someone else saved first (nothing is written then).
 */
export async function updateComponent(
  organisationId: number,
  componentId: number,
  def: ComponentDefinition,
  expectedVersion: number,
  actorId: number,
) {
  return sequelize.transaction(async (transaction) => {
    const [count] = await Component.update(
      { ...columns(def), version: expectedVersion + 1 },
      { where: { organisationId, id: componentId, version: expectedVersion }, transaction },
    );
    if (count !== 1) return null;
    await writeChildren(componentId, def, transaction);
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "component",
        entityId: componentId,
        action: "updated",
        details: { version: expectedVersion + 1 },
      },
      transaction,
    );
    return expectedVersion + 1;
  });
}

export async function setComponentArchived(
  organisationId: number,
  componentId: number,
  archived: boolean,
  actorId: number,
) {
  return sequelize.transaction(async (transaction) => {
    const [count] = await Component.update(
      { archivedAt: archived ? new Date() : null },
      { where: { organisationId, id: componentId }, transaction },
    );
    if (count) {
      await recordAudit(
        {
          organisationId,
          userId: actorId,
          entity: "component",
          entityId: componentId,
          action: archived ? "archived" : "restored",
        },
        transaction,
      );
    }
    return count === 1;
  });
}

export type ComponentFileKind = "drawing" | "photo";

/** A drawing or photo of a component: a link to a stored file. */
export class ComponentFile extends Model<InferAttributes<ComponentFile>, InferCreationAttributes<ComponentFile>> {
  declare id: CreationOptional<number>;
  declare componentId: number;
  declare storedFileId: number;
  declare kind: ComponentFileKind;
  declare caption: string;
  declare createdAt: CreationOptional<Date>;
  declare storedFile?: NonAttribute<StoredFile>;
}

ComponentFile.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    componentId: { type: DataTypes.INTEGER, allowNull: false },
    storedFileId: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.STRING(10), allowNull: false },
    caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "component_files", underscored: true, updatedAt: false },
);

ComponentFile.belongsTo(StoredFile, { foreignKey: "storedFileId", as: "storedFile" });

export async function listComponentFiles(componentId: number) {
  return ComponentFile.findAll({
    where: { componentId },
    include: [{ model: StoredFile, as: "storedFile" }],
    order: [["id", "ASC"]],
  });
}
