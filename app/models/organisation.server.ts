import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { DEFAULT_TIME_ZONE, todayIn } from "~/utils/dates";
import { sequelize } from "~/utils/db.server";

export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare allowSelfApproval: CreationOptional<boolean>;
  /** IANA time zone the organisation works in: its calendar "today". */
  declare timeZone: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Organisation.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    allowSelfApproval: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: DEFAULT_TIME_ZONE },
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
  settings: { name: string; allowSelfApproval: boolean; timeZone?: string },
) {
  const { timeZone, ...rest } = settings;
  await Organisation.update(timeZone ? { ...rest, timeZone } : rest, { where: { id: organisationId } });
}

/** The organisation's time zone (the default when the row is missing). */
export async function getOrganisationTimeZone(organisationId: number): Promise<string> {
  const row = await Organisation.findByPk(organisationId, { attributes: ["timeZone"], raw: true });
  return row?.timeZone ?? DEFAULT_TIME_ZONE;
}

/** Today's calendar day (YYYY-MM-DD) where the organisation works: the one "today" of due dates, checks and approval. */
export async function getOrganisationToday(organisationId: number, now: Date = new Date()): Promise<string> {
  return todayIn(await getOrganisationTimeZone(organisationId), now);
}
