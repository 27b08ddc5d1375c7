import crypto from "node:crypto";
import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { endUserSessions } from "~/models/session.server";
import { hashPassword, User } from "~/models/user.server";

export type TokenPurpose = "invite" | "reset";

/** Links to set a password stay valid for 72 hours and work once. */
export const TOKEN_LIFETIME_MS = 72 * 60 * 60 * 1000;

export class PasswordToken extends Model<InferAttributes<PasswordToken>, InferCreationAttributes<PasswordToken>> {
  declare id: CreationOptional<number>;
  declare userId: number;
  declare tokenHash: string;
  declare purpose: TokenPurpose;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

PasswordToken.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    purpose: { type: DataTypes.STRING(10), allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "password_tokens", underscored: true, updatedAt: false },
);

function hashToken(token: string) {
  return crypto.createHash("sha256").update(token).digest("hex");
}

/** Makes a new single-use token for `userId`; only its hash is stored. Returns the token itself. */
export async function issuePasswordToken(userId: number, purpose: TokenPurpose, now = new Date()): Promise<string> {
  const token = crypto.randomBytes(32).toString("base64url");
  await PasswordToken.create({
    userId,
    purpose,
    tokenHash: hashToken(token),
    expiresAt: new Date(now.getTime() + TOKEN_LIFETIME_MS),
    usedAt: null,
  });
  return token;
}

/** The user a token still works for, or null when it is unknown, used, expired or the user is inactive. */
export async function findUsableToken(token: string, now = new Date()) {
  const row = await PasswordToken.findOne({
    where: { tokenHash: hashToken(token), usedAt: null, expiresAt: { [Op.gt]: now } },
  });
  if (!row) return null;
  const user = await User.findOne({ where: { id: row.userId, active: true } });
  return user ? { token: row, user } : null;
}

/**
 * Sets the password, spends the token and ends every session of the user in one transaction (whoever knew the old
 * password is signed out everywhere); null when the token no longer works.
 */
export async function redeemPasswordToken(token: string, password: string, now = new Date()): Promise<number | null> {
  const passwordHash = await hashPassword(password);
  return sequelize
    .transaction(async (transaction) => {
      const row = await PasswordToken.findOne({
        where: { tokenHash: hashToken(token), usedAt: null, expiresAt: { [Op.gt]: now } },
        transaction,
      });
      if (!row) return null;
      const [spent] = await PasswordToken.update({ usedAt: now }, { where: { id: row.id, usedAt: null }, transaction });
      if (spent !== 1) return null;
      const [updated] = await User.update({ passwordHash }, { where: { id: row.userId, active: true }, transaction });
      if (updated !== 1) throw new Error("token user is not active");
      await endUserSessions(row.userId, { transaction });
      return row.userId;
    })
    .catch((error: unknown) => {
      if (error instanceof Error && error.message === "token user is not active") return null;
      throw error;
    });
}
