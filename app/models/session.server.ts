import crypto from "node:crypto";
import {
  DataTypes,
  Model,
  QueryTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { bySqlDialect } from "~/utils/sql-dialect.server";
import type { SessionUser } from "~/models/user.server";
import { organisationSettingsFromRow, type OrganisationSettings } from "~/models/organisation.server";
import { ROLES, type Role } from "~/utils/roles";

/** A signed-in browser. The cookie holds a random token; the table holds only its SHA-256. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare id: CreationOptional<number>;
  declare tokenHash: string;
  declare userId: number;
  declare createdAtMs: number;
  declare lastSeenAtMs: number;
  declare expiresAtMs: number;
  declare address: string | null;
  declare userAgent: string | null;
}

Session.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    createdAtMs: { type: DataTypes.BIGINT, allowNull: false },
    lastSeenAtMs: { type: DataTypes.BIGINT, allowNull: false },
    expiresAtMs: { type: DataTypes.BIGINT, allowNull: false },
    address: { type: DataTypes.STRING(64), allowNull: true },
    userAgent: { type: DataTypes.STRING(200), allowNull: true },
  },
  { sequelize, tableName: "sessions", underscored: true, timestamps: false },
);

/** The user's roles as one comma-separated text (for a statement that names `users u`). */
const ROLE_LIST = bySqlDialect(sequelize, { sqlite: "group_concat(r.role)", postgres: "string_agg(r.role, ',')" });
export const ROLES_OF_USER = `(SELECT ${ROLE_LIST} FROM user_roles r WHERE r.user_id = u.id)`;

/** The columns of a session user, for a statement that joins `users u` and `organisations o`. */
export const SESSION_USER_COLUMNS = `u.id, u.organisation_id AS "organisationId", o.name AS "organisationName", u.email,
         u.name, u.units, ${ROLES_OF_USER} AS roles`;

export type SessionUserRow = Omit<SessionUser, "roles"> & { roles: string | null };

/** A row read with SESSION_USER_COLUMNS as a SessionUser (roles in their usual order). */
export function sessionUserFromRow(row: SessionUserRow): SessionUser {
  const order = (r: Role) => ROLES.indexOf(r);
  const roles = (row.roles ? row.roles.split(",") : [])
    .filter((r): r is Role => ROLES.includes(r as Role))
    .sort((a, b) => order(a) - order(b));
  return {
    id: row.id,
    organisationId: row.organisationId,
    organisationName: row.organisationName,
    email: row.email,
    name: row.name,
    units: row.units,
    roles,
  };
}

/** How long a session lasts: `idleMs` without a request, `absoluteMs` after sign-in whatever happens. */
export type SessionLifetimes = { idleMs: number; absoluteMs: number };

/** A session's last-seen time is written at most this often, so most requests only read. */
export const TOUCH_INTERVAL_MS = 5 * 60 * 1000;

export function hashSessionToken(token: string) {
  return crypto.createHash("sha256").update(token).digest("hex");
}

/** Deletes every session past its idle or absolute end. */
async function pruneSessions(lifetimes: SessionLifetimes, now: number, transaction?: Transaction) {
  await sequelize.query("DELETE FROM sessions WHERE expires_at_ms <= $now OR last_seen_at_ms <= $idleCutoff", {
    bind: { now, idleCutoff: now - lifetimes.idleMs },
    type: QueryTypes.BULKDELETE,
    transaction,
  });
}

/**
 * Starts a session for `userId` and returns its token (for the cookie only). Sessions that have run out are
 * removed on the way, so the table holds only live ones.
 */
export async function startSession(
  input: { userId: number; address: string | null; userAgent: string | null },
  lifetimes: SessionLifetimes,
  now = Date.now(),
): Promise<string> {
  const token = crypto.randomBytes(32).toString("base64url");
  await sequelize.transaction(async (transaction) => {
    await pruneSessions(lifetimes, now, transaction);
    await sequelize.query(
      `INSERT INTO sessions (token_hash, user_id, created_at_ms, last_seen_at_ms, expires_at_ms, address, user_agent)
       VALUES ($tokenHash, $userId, $now, $now, $expiresAt, $address, $userAgent)`,
      {
        bind: {
          tokenHash: hashSessionToken(token),
          userId: input.userId,
          now,
          expiresAt: now + lifetimes.absoluteMs,
          address: input.address?.slice(0, 64) ?? null,
          userAgent: input.userAgent?.slice(0, 200) ?? null,
        },
        type: QueryTypes.INSERT,
        transaction,
      },
    );
  });
  return token;
}

export type FoundSession = {
  sessionId: number;
  lastSeenAtMs: number;
  user: SessionUser;
  /** The user's organisation's settings, read in the same statement. */
  organisation: OrganisationSettings;
};

type FoundRow = SessionUserRow & {
  sessionId: number;
  lastSeenAtMs: number;
  allowSelfApproval: boolean | number;
  ruleSet: string;
  timeZone: string | null;
};

/**
 * The live session of `token` and its active user, in one statement through the token's unique index (every
 * signed-in request asks this). Null when the token is unknown, idle too long, past its absolute end, or its user
 * is deactivated.
 */
export async function findSession(token: string, lifetimes: SessionLifetimes, now = Date.now()) {
  const [row] = await sequelize.query<FoundRow>(
    `SELECT s.id AS "sessionId", s.last_seen_at_ms AS "lastSeenAtMs", ${SESSION_USER_COLUMNS},
            o.allow_self_approval AS "allowSelfApproval", o.rule_set AS "ruleSet", o.time_zone AS "timeZone"
       FROM sessions s
       JOIN users u ON u.id = s.user_id
       JOIN organisations o ON o.id = u.organisation_id
      WHERE s.token_hash = $tokenHash AND s.expires_at_ms > $now AND s.last_seen_at_ms > $idleCutoff
        AND u.active = TRUE`,
    {
      bind: { tokenHash: hashSessionToken(token), now, idleCutoff: now - lifetimes.idleMs },
      type: QueryTypes.SELECT,
    },
  );
  if (!row) return null;
  const user = sessionUserFromRow(row);
  return {
    sessionId: row.sessionId,
    lastSeenAtMs: Number(row.lastSeenAtMs),
    user,
    organisation: organisationSettingsFromRow({ ...row, id: user.organisationId, name: user.organisationName }),
  };
}

/** Records that the session was used now, if it was last recorded more than TOUCH_INTERVAL_MS ago. */
export async function touchSession(found: FoundSession, now = Date.now()) {
  if (now - found.lastSeenAtMs < TOUCH_INTERVAL_MS) return;
  await sequelize.query("UPDATE sessions SET last_seen_at_ms = $now WHERE id = $id", {
    bind: { now, id: found.sessionId },
    type: QueryTypes.UPDATE,
  });
}

/** Ends the session of `token` (signing out). */
export async function endSessionByToken(token: string) {
  await sequelize.query("DELETE FROM sessions WHERE token_hash = $tokenHash", {
    bind: { tokenHash: hashSessionToken(token) },
    type: QueryTypes.BULKDELETE,
  });
}

/** Ends one of the user's own sessions by its id; false when it is not theirs or already gone. */
export async function endUserSession(userId: number, sessionId: number): Promise<boolean> {
  const ended = await sequelize.query("DELETE FROM sessions WHERE id = $sessionId AND user_id = $userId", {
    bind: { sessionId, userId },
    type: QueryTypes.BULKDELETE,
  });
  return Number(ended) > 0;
}

/** Ends every session of the user, but `exceptSessionId` when given; returns how many ended. */
export async function endUserSessions(
  userId: number,
  options: { exceptSessionId?: number; transaction?: Transaction } = {},
): Promise<number> {
  const ended = await sequelize.query("DELETE FROM sessions WHERE user_id = $userId AND id <> $exceptSessionId", {
    bind: { userId, exceptSessionId: options.exceptSessionId ?? -1 },
    type: QueryTypes.BULKDELETE,
    transaction: options.transaction,
  });
  return Number(ended) || 0;
}

export type SessionRow = {
  id: number;
  createdAt: string;
  lastSeenAt: string;
  address: string | null;
  userAgent: string | null;
};

/** The user's live sessions, the most recently used first. */
export async function listUserSessions(userId: number, lifetimes: SessionLifetimes, now = Date.now()) {
  const rows = await sequelize.query<{
    id: number;
    createdAtMs: number;
    lastSeenAtMs: number;
    address: string | null;
    userAgent: string | null;
  }>(
    `SELECT id, created_at_ms AS "createdAtMs", last_seen_at_ms AS "lastSeenAtMs", address, user_agent AS "userAgent"
       FROM sessions
      WHERE user_id = $userId AND expires_at_ms > $now AND last_seen_at_ms > $idleCutoff
      ORDER BY last_seen_at_ms DESC, id DESC`,
    { bind: { userId, now, idleCutoff: now - lifetimes.idleMs }, type: QueryTypes.SELECT },
  );
  return rows.map((r): SessionRow => ({
    id: r.id,
    createdAt: new Date(Number(r.createdAtMs)).toISOString(),
    lastSeenAt: new Date(Number(r.lastSeenAtMs)).toISOString(),
    address: r.address,
    userAgent: r.userAgent,
  }));
}

/** How many live sessions the user has. */
export async function countUserSessions(userId: number, lifetimes: SessionLifetimes, now = Date.now()) {
  const [row] = await sequelize.query<{ n: number }>(
    `SELECT count(*) AS n FROM sessions
      WHERE user_id = $userId AND expires_at_ms > $now AND last_seen_at_ms > $idleCutoff`,
    { bind: { userId, now, idleCutoff: now - lifetimes.idleMs }, type: QueryTypes.SELECT },
  );
  return Number(row?.n ?? 0);
}
