import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/utils/db.server";

export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare allowSelfApproval: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Organisation.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    allowSelfApproval: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "organisations", underscored: true },
);

export async function getOrganisation(organisationId: number) {
  return Organisation.findByPk(organisationId);
}

export async function updateOrganisationSettings(
  organisationId: number,
  settings: { name: string; allowSelfApproval: boolean },
) {
  await Organisation.update(settings, { where: { id: organisationId } });
}
