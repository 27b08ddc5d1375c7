import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { pageOf, type Page, type PageRequest, type SortKey } from "~/utils/keyset.server";

/** A row of the audit trail: appended, never updated or deleted. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare userId: number | null;
  declare entity: string;
  declare entityId: number | null;
  declare action: string;
  declare details: string | null;
  declare createdAt: CreationOptional<Date>;
}

AuditEvent.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: true },
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entityId: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    details: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  {
    sequelize,
    tableName: "audit_events",
    underscored: true,
    updatedAt: false,
    hooks: {
      beforeUpdate: () => {
        throw new Error("The audit trail is append-only.");
      },
      beforeDestroy: () => {
        throw new Error("The audit trail is append-only.");
      },
    },
  },
);

export type AuditInput = {
  organisationId: number;
  userId: number | null;
  entity: string;
  entityId?: number | null;
  action: string;
  details?: Record<string, unknown>;
};

export async function recordAudit(input: AuditInput, transaction?: Transaction) {
  await AuditEvent.create(
    {
      organisationId: input.organisationId,
      userId: input.userId,
      entity: input.entity,
      entityId: input.entityId ?? null,
      action: input.action,
      details: input.details ? JSON.stringify(input.details) : null,
    },
    { transaction },
  );
}

export async function listAuditEvents(organisationId: number, entity: string, entityId: number) {
  return AuditEvent.findAll({ where: { organisationId, entity, entityId }, order: [["id", "ASC"]] });
}

/** Oldest first: the id alone orders an entity's events. */
export const AUDIT_LIST_KEYS: SortKey[] = [{ sql: "id", direction: "ASC" }];

/** One page of an entity's events, oldest first. */
export async function listAuditEventsPage(
  organisationId: number,
  entity: string,
  entityId: number,
  request: PageRequest,
): Promise<Page<AuditEvent>> {
  const backwards = request.towards === "previous";
  const after = request.cursor ? Number(request.cursor[0]) : null;
  const rows = await AuditEvent.findAll({
    where: {
      organisationId,
      entity,
      entityId,
      ...(after !== null ? { id: { [backwards ? Op.lt : Op.gt]: after } } : {}),
    },
    order: [["id", backwards ? "DESC" : "ASC"]],
    limit: request.limit + 1,
  });
  return pageOf(rows, request, (e) => [e.id]);
}
