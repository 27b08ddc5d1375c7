import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { DEFAULT_RULE_SET, isRuleSetId, type RuleSetId } from "~/statics/reference";

export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare allowSelfApproval: CreationOptional<boolean>;
  /** The rules the organisation works to: factors, tables, limits and examination intervals. */
  declare ruleSet: CreationOptional<RuleSetId>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Organisation.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    allowSelfApproval: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ruleSet: { type: DataTypes.STRING(10), allowNull: false, defaultValue: DEFAULT_RULE_SET },
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
  settings: { name: string; allowSelfApproval: boolean; ruleSet?: RuleSetId },
) {
  const { ruleSet, ...rest } = settings;
  await Organisation.update(ruleSet ? { ...rest, ruleSet } : rest, { where: { id: organisationId } });
}

/** The rule set the organisation works to (UK / EU when unknown). */
export async function getOrganisationRuleSet(organisationId: number, transaction?: Transaction): Promise<RuleSetId> {
  const row = await Organisation.findByPk(organisationId, { attributes: ["ruleSet"], transaction });
  return isRuleSetId(row?.ruleSet) ? row.ruleSet : DEFAULT_RULE_SET;
}
