import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/utils/db.server";
import { recordAudit } from "~/models/audit-event.server";

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare name: string;
  declare customer: string;
  declare address: CreationOptional<string>;
  declare siteContact: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Site.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.STRING(200), allowNull: false },
    customer: { type: DataTypes.STRING(200), allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    siteContact: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "sites", underscored: true },
);

export type SiteInput = { name: string; customer: string; address: string; siteContact: string; notes: string };

export async function listSites(organisationId: number) {
  return Site.findAll({ where: { organisationId }, order: [["name", "ASC"]] });
}

export async function getSite(organisationId: number, siteId: number) {
  return Site.findOne({ where: { organisationId, id: siteId } });
}

export async function createSite(organisationId: number, input: SiteInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const site = await Site.create({ organisationId, ...input }, { transaction });
    await recordAudit(
      { organisationId, userId: actorId, entity: "site", entityId: site.id, action: "created" },
      transaction,
    );
    return site;
  });
}

export async function updateSite(organisationId: number, siteId: number, input: SiteInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const [count] = await Site.update(input, { where: { organisationId, id: siteId }, transaction });
    if (count)
      await recordAudit(
        { organisationId, userId: actorId, entity: "site", entityId: siteId, action: "updated" },
        transaction,
      );
    return count === 1;
  });
}
