import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { DEFAULT_TIME_ZONE, todayIn } from "~/utils/dates";
import { sequelize } from "~/utils/db.server";
import { oncePerPage } from "~/utils/page-reads.server";
import { DEFAULT_RULE_SET, isRuleSetId, type RuleSetId } from "~/statics/reference";

export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare allowSelfApproval: CreationOptional<boolean>;
  /** The rules the organisation works to: factors, tables, limits and examination intervals. */
  declare ruleSet: CreationOptional<RuleSetId>;
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
    ruleSet: { type: DataTypes.STRING(10), allowNull: false, defaultValue: DEFAULT_RULE_SET },
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
  settings: { name: string; allowSelfApproval: boolean; ruleSet?: RuleSetId; timeZone?: string },
) {
  const { ruleSet, timeZone, ...rest } = settings;
  await Organisation.update(
    { ...rest, ...(ruleSet ? { ruleSet } : {}), ...(timeZone ? { timeZone } : {}) },
    { where: { id: organisationId } },
  );
}

/** What an organisation has chosen: the settings its pages and checks read. */
export type OrganisationSettings = {
  id: number;
  name: string;
  allowSelfApproval: boolean;
  ruleSet: RuleSetId;
  timeZone: string;
};

/** Settings as a row gives them (SQLite's booleans are 0 and 1), the rule set UK / EU when unknown. */
export function organisationSettingsFromRow(row: {
  id: number;
  name: string;
  allowSelfApproval: boolean | number;
  ruleSet: string;
  timeZone: string | null;
}): OrganisationSettings {
  return {
    id: Number(row.id),
    name: row.name,
    allowSelfApproval: Boolean(row.allowSelfApproval),
    ruleSet: isRuleSetId(row.ruleSet) ? row.ruleSet : DEFAULT_RULE_SET,
    timeZone: row.timeZone ?? DEFAULT_TIME_ZONE,
  };
}

export const organisationSettingsKey = (organisationId: number) => `organisation-settings:${organisationId}`;

/**
 * The organisation's settings, read once per page: the session read brings them along with the user, so a page's
 * loaders ask the database again only for another organisation.
 */
export function getOrganisationSettings(organisationId: number): Promise<OrganisationSettings | null> {
  return oncePerPage(organisationSettingsKey(organisationId), async () => {
    const row = await Organisation.findByPk(organisationId, {
      attributes: ["id", "name", "allowSelfApproval", "ruleSet", "timeZone"],
      raw: true,
    });
    return row ? organisationSettingsFromRow(row) : null;
  });
}

/** The rule set the organisation works to (UK / EU when unknown); read within `transaction` when one is given. */
export async function getOrganisationRuleSet(organisationId: number, transaction?: Transaction): Promise<RuleSetId> {
  if (!transaction) return (await getOrganisationSettings(organisationId))?.ruleSet ?? DEFAULT_RULE_SET;
  const row = await Organisation.findByPk(organisationId, { attributes: ["ruleSet"], transaction });
  return isRuleSetId(row?.ruleSet) ? row.ruleSet : DEFAULT_RULE_SET;
}

/** The organisation's time zone (the default when the row is missing). */
export async function getOrganisationTimeZone(organisationId: number): Promise<string> {
  return (await getOrganisationSettings(organisationId))?.timeZone ?? DEFAULT_TIME_ZONE;
}

/** Today's calendar day (YYYY-MM-DD) where the organisation works: the one "today" of due dates, checks and approval. */
export async function getOrganisationToday(organisationId: number, now: Date = new Date()): Promise<string> {
  return todayIn(await getOrganisationTimeZone(organisationId), now);
}
