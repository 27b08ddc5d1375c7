import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/utils/db.server";

/** A message received by the local SMTP catcher (development, demo and tests only). */
export class CaughtMail extends Model<InferAttributes<CaughtMail>, InferCreationAttributes<CaughtMail>> {
  declare id: CreationOptional<number>;
  declare organisationId: number | null;
  declare fromAddress: string;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare receivedAt: Date;
}

CaughtMail.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: true },
    fromAddress: { type: DataTypes.STRING(400), allowNull: false },
    toAddress: { type: DataTypes.STRING(2000), allowNull: false },
    subject: { type: DataTypes.STRING(400), allowNull: false },
    textBody: { type: DataTypes.TEXT, allowNull: false },
    htmlBody: { type: DataTypes.TEXT, allowNull: true },
    receivedAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: "caught_mail", underscored: true, timestamps: false },
);

export async function storeCaughtMail(input: Omit<InferCreationAttributes<CaughtMail>, "id">) {
  return CaughtMail.create(input);
}

export async function listCaughtMail(organisationId: number, limit = 100) {
  return CaughtMail.findAll({ where: { organisationId }, order: [["id", "DESC"]], limit });
}

export async function getCaughtMail(organisationId: number, id: number) {
  return CaughtMail.findOne({ where: { organisationId, id } });
}
