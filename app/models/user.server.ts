import bcrypt from "bcryptjs";
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
import { sequelize } from "~/utils/db.server";
import { env } from "~/utils/env.server";
import { isoTimeOf } from "~/utils/sql-dialect.server";
import { recordAudit } from "~/models/audit-event.server";
import {
  endUserSessions,
  ROLES_OF_USER,
  SESSION_USER_COLUMNS,
  sessionUserFromRow,
  type SessionUserRow,
} from "~/models/session.server";
import { Organisation } from "~/models/organisation.server";
import {
  keysetBind,
  keysetSql,
  keysetWay,
  pageOf,
  type Page,
  type PageRequest,
  type SortKey,
} from "~/utils/keyset.server";
import { ROLES, type Role } from "~/utils/roles";

export type Units = "metric" | "imperial";

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare units: CreationOptional<Units>;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare userRoles?: NonAttribute<UserRole[]>;
  declare organisation?: NonAttribute<Organisation>;
}

export class UserRole extends Model<InferAttributes<UserRole>, InferCreationAttributes<UserRole>> {
  declare userId: number;
  declare role: Role;
}

User.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: true },
    units: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "metric" },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "users", underscored: true },
);

UserRole.init(
  {
    userId: { type: DataTypes.INTEGER, primaryKey: true },
    role: { type: DataTypes.STRING(20), primaryKey: true },
  },
  { sequelize, tableName: "user_roles", underscored: true, timestamps: false },
);

User.hasMany(UserRole, { foreignKey: "userId", as: "userRoles" });
UserRole.belongsTo(User, { foreignKey: "userId" });
User.belongsTo(Organisation, { foreignKey: "organisationId", as: "organisation" });
Organisation.hasMany(User, { foreignKey: "organisationId" });

/** What the rest of the app knows of a signed-in user. */
export type SessionUser = {
  id: number;
  organisationId: number;
  organisationName: string;
  email: string;
  name: string;
  units: Units;
  roles: Role[];
};

// Tests use cheap hashes; everywhere else 10 rounds.
const BCRYPT_ROUNDS = env.appEnv === "test" ? 4 : 10;
let dummyHash: string | undefined;

export function normaliseEmail(email: string) {
  return email.trim().toLowerCase();
}

export async function hashPassword(password: string) {
  return bcrypt.hash(password, BCRYPT_ROUNDS);
}

function toSessionUser(user: User): SessionUser {
  const order = (r: Role) => ROLES.indexOf(r);
  return {
    id: user.id,
    organisationId: user.organisationId,
    organisationName: user.organisation?.name ?? "",
    email: user.email,
    name: user.name,
    units: user.units,
    roles: (user.userRoles ?? []).map((r) => r.role).sort((a, b) => order(a) - order(b)),
  };
}

const withRolesAndOrganisation = [
  { model: UserRole, as: "userRoles" },
  { model: Organisation, as: "organisation" },
];

/** The active user with this id, or null. */
export async function getActiveSessionUser(userId: number): Promise<SessionUser | null> {
  if (!Number.isSafeInteger(userId)) return null;
  const [row] = await sequelize.query<SessionUserRow>(
    `SELECT ${SESSION_USER_COLUMNS}
       FROM users u JOIN organisations o ON o.id = u.organisation_id
      WHERE u.id = $userId AND u.active = TRUE`,
    { bind: { userId }, type: QueryTypes.SELECT },
  );
  return row ? sessionUserFromRow(row) : null;
}

/** Checks an e-mail and password; null when they do not match an active user with a password. */
export async function verifyLogin(email: string, password: string): Promise<SessionUser | null> {
  const user = await User.findOne({ where: { email: normaliseEmail(email) }, include: withRolesAndOrganisation });
  // Compare against a dummy hash when there is no user, so the reply takes as long either way.
  const hash = user?.passwordHash ?? (dummyHash ??= await hashPassword("no such user"));
  const matches = await bcrypt.compare(password, hash);
  if (!user || !user.active || !user.passwordHash || !matches) return null;
  return toSessionUser(user);
}

export async function verifyPassword(userId: number, password: string): Promise<boolean> {
  const user = await User.findByPk(userId);
  if (!user?.passwordHash || !user.active) return false;
  return bcrypt.compare(password, user.passwordHash);
}

/** Sets a new password and ends every session of the user in one transaction; the caller signs this browser in again. */
export async function changePassword(userId: number, password: string) {
  const passwordHash = await hashPassword(password);
  await sequelize.transaction(async (transaction) => {
    await User.update({ passwordHash }, { where: { id: userId }, transaction });
    await endUserSessions(userId, { transaction });
  });
}

export async function setUnits(userId: number, units: Units) {
  await User.update({ units }, { where: { id: userId } });
}

export type UserRow = {
  id: number;
  name: string;
  email: string;
  roles: Role[];
  active: boolean;
  hasPassword: boolean;
  createdAt: string;
};

/** Active users first, then by name and id. */
export const USER_LIST_KEYS: SortKey[] = [
  { sql: "u.active", direction: "DESC" },
  { sql: "u.name", direction: "ASC" },
  { sql: "u.id", direction: "ASC" },
];
const USER_KEYSET = keysetSql(USER_LIST_KEYS);

type UserListSqlRow = {
  id: number;
  name: string;
  email: string;
  roles: string | null;
  active: number | boolean;
  hasPassword: number | boolean;
  createdAt: string | Date;
};

function toUserRow(r: UserListSqlRow): UserRow {
  const order = (role: Role) => ROLES.indexOf(role);
  return {
    id: r.id,
    name: r.name,
    email: r.email,
    roles: ((r.roles ? r.roles.split(",") : []) as Role[]).sort((a, b) => order(a) - order(b)),
    active: !!r.active,
    hasPassword: !!r.hasPassword,
    createdAt: isoTimeOf(r.createdAt),
  };
}

const USER_LIST_COLUMNS = `u.id AS id, u.name AS name, u.email AS email, u.active AS active,
  u.password_hash IS NOT NULL AS "hasPassword", u.created_at AS "createdAt",
  ${ROLES_OF_USER} AS roles`;

/** One page of the organisation's users, active first, by name. */
export async function listUsersPage(organisationId: number, request: PageRequest): Promise<Page<UserRow>> {
  const way = keysetWay(request);
  const rows = await sequelize.query<UserListSqlRow>(
    `SELECT ${USER_LIST_COLUMNS} FROM users u
      WHERE u.organisation_id = $organisationId AND ${USER_KEYSET[way].where}
      ORDER BY ${USER_KEYSET[way].order} LIMIT $limit`,
    { bind: { organisationId, ...keysetBind(request) }, type: QueryTypes.SELECT },
  );
  return pageOf(rows.map(toUserRow), request, (u) => [u.active ? 1 : 0, u.name, u.id]);
}

/** Up to `limit` active users who were invited and have not set a password yet, by name. */
export async function listPendingInvitations(organisationId: number, limit: number) {
  return sequelize.query<{ id: number; name: string; email: string }>(
    `SELECT u.id AS id, u.name AS name, u.email AS email FROM users u
      WHERE u.organisation_id = $organisationId AND u.active = TRUE AND u.password_hash IS NULL
      ORDER BY u.name, u.id LIMIT $limit`,
    { bind: { organisationId, limit }, type: QueryTypes.SELECT },
  );
}

export async function findUserByEmail(email: string) {
  return User.findOne({ where: { email: normaliseEmail(email) } });
}

export async function getOrganisationUser(organisationId: number, userId: number) {
  return User.findOne({ where: { id: userId, organisationId }, include: [{ model: UserRole, as: "userRoles" }] });
}

/** The active users of an organisation holding `role`, e.g. to notify every appointed person. */
export async function listUsersWithRole(organisationId: number, role: Role) {
  return User.findAll({
    where: { organisationId, active: true },
    include: [{ model: UserRole, as: "userRoles", where: { role }, required: true }],
    order: [["name", "ASC"]],
  });
}

/** The names of the organisation's users with these ids (any user the plan names, active or not). */
export async function userNames(organisationId: number, ids: readonly number[], transaction?: Transaction) {
  const unique = [...new Set(ids)];
  if (unique.length === 0) return new Map<number, string>();
  const rows = await User.findAll({
    where: { organisationId, id: unique },
    attributes: ["id", "name"],
    raw: true,
    transaction,
  });
  return new Map(rows.map((u) => [u.id, u.name]));
}

/** The organisation's active users with these ids (for mail). */
export async function listActiveUsersByIds(organisationId: number, ids: readonly number[]) {
  const unique = [...new Set(ids)];
  if (unique.length === 0) return [];
  return User.findAll({ where: { organisationId, id: unique, active: true }, order: [["name", "ASC"]] });
}

export async function createUser(
  input: { organisationId: number; email: string; name: string; roles: Role[]; password?: string },
  actorId: number | null,
) {
  return sequelize.transaction(async (transaction) => {
    const user = await User.create(
      {
        organisationId: input.organisationId,
        email: normaliseEmail(input.email),
        name: input.name.trim(),
        passwordHash: input.password ? await hashPassword(input.password) : null,
      },
      { transaction },
    );
    await UserRole.bulkCreate(
      [...new Set(input.roles)].map((role) => ({ userId: user.id, role })),
      { transaction },
    );
    await recordAudit(
      {
        organisationId: input.organisationId,
        userId: actorId,
        entity: "user",
        entityId: user.id,
        action: "created",
        details: { roles: input.roles },
      },
      transaction,
    );
    return user;
  });
}

export async function updateUserRoles(organisationId: number, userId: number, roles: Role[], actorId: number) {
  await sequelize.transaction(async (transaction) => {
    await UserRole.destroy({ where: { userId }, transaction });
    await UserRole.bulkCreate(
      [...new Set(roles)].map((role) => ({ userId, role })),
      { transaction },
    );
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "user",
        entityId: userId,
        action: "roles changed",
        details: { roles },
      },
      transaction,
    );
  });
}

export async function setUserActive(organisationId: number, userId: number, active: boolean, actorId: number) {
  await sequelize.transaction(async (transaction) => {
    await User.update({ active }, { where: { id: userId, organisationId }, transaction });
    if (!active) await endUserSessions(userId, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "user",
        entityId: userId,
        action: active ? "reactivated" : "deactivated",
      },
      transaction,
    );
  });
}

/** How many active admins an organisation has besides `exceptUserId` (an organisation never loses its last admin). */
export async function countOtherActiveAdmins(organisationId: number, exceptUserId: number) {
  return User.count({
    where: { organisationId, active: true, id: { [Op.ne]: exceptUserId } },
    include: [{ model: UserRole, as: "userRoles", where: { role: "admin" }, required: true }],
  });
}
