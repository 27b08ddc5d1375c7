import {
  DataTypes,
  Model,
  QueryTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { insertedIdOf } from "~/utils/sql-dialect.server";
import { normaliseEmail } from "~/models/user.server";

export type AttemptScope = "sign-in" | "password-reset";

/** Attempts count for this long; older rows are pruned. */
export const ATTEMPT_WINDOW_MS = 15 * 60 * 1000;
/** Failures an account takes in the window from browsers it does not know before each next try must wait. */
export const FREE_FAILURES = 5;
/** The wait doubles from 1 s with each failure past the free ones, up to this (so at most ~60 guesses an hour). */
export const MAX_DELAY_MS = 60 * 1000;
/** Failures one account may take in the window from one trusted address, or from one browser it knows. */
export const ACCOUNT_SOURCE_LIMIT = 10;
/** Failed sign-ins (or reset requests) one trusted client address may make in the window, across accounts. */
export const ADDRESS_LIMIT = 30;
/** At this many failures in the window the account's owner is told by e-mail (once as the count passes it). */
export const NOTICE_AFTER_FAILURES = 10;
/** Reset mails one account receives per window; requests past it get the usual answer but send nothing. */
export const ACCOUNT_RESET_MAIL_LIMIT = 3;
/** The address key of a client whose address cannot be trusted (no trusted proxy): every such client shares it. */
export const SHARED_ADDRESS_KEY = "direct";

export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<number>;
  declare scope: AttemptScope;
  declare accountKey: string | null;
  declare addressKey: string;
  declare deviceKey: string | null;
  declare attemptedAtMs: number;
}

SignInAttempt.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    scope: { type: DataTypes.STRING(20), allowNull: false },
    accountKey: { type: DataTypes.STRING(320), allowNull: true },
    addressKey: { type: DataTypes.STRING(64), allowNull: false },
    deviceKey: { type: DataTypes.STRING(64), allowNull: true },
    attemptedAtMs: { type: DataTypes.BIGINT, allowNull: false },
  },
  { sequelize, tableName: "sign_in_attempts", underscored: true, timestamps: false },
);

/** A refused attempt: a sentence for the form and the seconds for Retry-After. */
export type AttemptRefusal = { ok: false; message: string; retryAfterSeconds: number };

/** Where an attempt comes from: the address key, and the browser's device key when it knows this account. */
export type AttemptSource = { addressKey: string; deviceKey: string | null };

export function accountKeyOf(email: string | null | undefined) {
  const key = normaliseEmail(email ?? "").slice(0, 320);
  return key === "" ? null : key;
}

function waitText(seconds: number) {
  if (seconds <= 90) return `wait ${seconds} ${seconds === 1 ? "second" : "seconds"}`;
  const minutes = Math.ceil(seconds / 60);
  return `wait ${minutes} ${minutes === 1 ? "minute" : "minutes"}`;
}

function refusal(what: string, retryAtMs: number, nowMs: number): AttemptRefusal {
  const retryAfterSeconds = Math.max(1, Math.ceil((retryAtMs - nowMs) / 1000));
  return { ok: false, message: `${what}; ${waitText(retryAfterSeconds)} and try again.`, retryAfterSeconds };
}

async function insertAttempt(scope: AttemptScope, accountKey: string | null, source: AttemptSource, nowMs: number) {
  const [id] = await sequelize.query(
    `INSERT INTO sign_in_attempts (scope, account_key, address_key, device_key, attempted_at_ms)
     VALUES ($scope, $accountKey, $addressKey, $deviceKey, $now) RETURNING id`,
    {
      bind: { scope, accountKey, addressKey: source.addressKey, deviceKey: source.deviceKey, now: nowMs },
      type: QueryTypes.INSERT,
    },
  );
  return insertedIdOf(id);
}

async function deleteAttempt(id: number) {
  await sequelize.query("DELETE FROM sign_in_attempts WHERE id = $id", { bind: { id }, type: QueryTypes.BULKDELETE });
}

// The filters a limit counts over; each is fixed SQL, the values always bound.
const FILTERS = {
  accountUnknownBrowsers: "account_key = $accountKey AND device_key IS NULL",
  accountAddress: "account_key = $accountKey AND address_key = $addressKey AND device_key IS NULL",
  accountDevice: "account_key = $accountKey AND device_key = $deviceKey",
  address: "address_key = $addressKey AND device_key IS NULL",
  account: "account_key = $accountKey",
} as const;

type Filter = keyof typeof FILTERS;

/** The values `sql` names as $parameters (SQLite refuses a bound value the statement does not use). */
function bindFor(sql: string, values: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(values).filter(([name]) => new RegExp(`\\$${name}\\b`).test(sql)));
}
type FilterValues = { accountKey?: string | null; addressKey?: string; deviceKey?: string | null };

/**
 * When the attempt `beforeId` may go ahead under a hard limit: null if fewer than `limit` earlier attempts matching
 * `filter` fall in the window, else the moment the oldest of the last `limit` of them leaves it.
 */
async function blockedUntil(
  scope: AttemptScope,
  filter: Filter,
  values: FilterValues,
  beforeId: number,
  limit: number,
  nowMs: number,
): Promise<number | null> {
  const sql = `SELECT attempted_at_ms AS at FROM sign_in_attempts
      WHERE scope = $scope AND ${FILTERS[filter]} AND id < $beforeId AND attempted_at_ms > $since
      ORDER BY attempted_at_ms DESC, id DESC LIMIT 1 OFFSET $skip`;
  const [row] = await sequelize.query<{ at: number }>(sql, {
    bind: bindFor(sql, { scope, ...values, beforeId, since: nowMs - ATTEMPT_WINDOW_MS, skip: limit - 1 }),
    type: QueryTypes.SELECT,
  });
  return row ? Number(row.at) + ATTEMPT_WINDOW_MS : null;
}

/**
 * The growing delay: with n failures on the account from browsers it does not know (earlier than `beforeId`, in
 * the window), the next try must come 2^(n - FREE_FAILURES) seconds (at most MAX_DELAY_MS) after the latest.
 */
async function slowedUntil(accountKey: string, beforeId: number, nowMs: number): Promise<number | null> {
  const [row] = await sequelize.query<{ n: number; last: number | null }>(
    `SELECT count(*) AS n, max(attempted_at_ms) AS last FROM sign_in_attempts
      WHERE scope = 'sign-in' AND ${FILTERS.accountUnknownBrowsers} AND id < $beforeId AND attempted_at_ms > $since`,
    { bind: { accountKey, beforeId, since: nowMs - ATTEMPT_WINDOW_MS }, type: QueryTypes.SELECT },
  );
  const failures = Number(row?.n ?? 0);
  if (failures < FREE_FAILURES || row?.last == null) return null;
  const delay = Math.min(1000 * 2 ** (failures - FREE_FAILURES), MAX_DELAY_MS);
  const until = Number(row.last) + delay;
  return until > nowMs ? until : null;
}

/** Deletes attempts that have left the window. */
export async function pruneSignInAttempts(now = new Date()) {
  await sequelize.query("DELETE FROM sign_in_attempts WHERE attempted_at_ms <= $cutoff", {
    bind: { cutoff: now.getTime() - ATTEMPT_WINDOW_MS },
    type: QueryTypes.BULKDELETE,
  });
}

/**
 * Records a sign-in attempt before the password is checked, so attempts made at the same moment count against
 * each other, and decides whether it may go ahead. The limits throttle whoever guesses, not the account's owner:
 * - a trusted address (TRUST_PROXY) gets ADDRESS_LIMIT failures across accounts, then 429 until the window moves;
 * - one account from one trusted address, or from one browser that signed in to it before (device key), gets
 *   ACCOUNT_SOURCE_LIMIT failures; other addresses and browsers are not held up by them;
 * - from browsers the account does not know, failures past FREE_FAILURES make each next try wait a doubling
 *   delay (never a lock): a browser that knows the account is not slowed by them.
 * A refused attempt is not recorded; an accepted one stands as a failure until `recordSignInSuccess`.
 */
export async function startSignInAttempt(
  input: { email: string | null | undefined; addressKey: string; deviceKey?: string | null },
  now = new Date(),
): Promise<{ ok: true; attemptId: number } | AttemptRefusal> {
  const nowMs = now.getTime();
  await pruneSignInAttempts(now);
  const accountKey = accountKeyOf(input.email);
  const source: AttemptSource = { addressKey: input.addressKey, deviceKey: input.deviceKey ?? null };
  const trustedAddress = source.addressKey !== SHARED_ADDRESS_KEY;
  const id = await insertAttempt("sign-in", accountKey, source, nowMs);
  const refuse = async (refused: AttemptRefusal) => {
    await deleteAttempt(id);
    return refused;
  };

  if (trustedAddress && !source.deviceKey) {
    const until = await blockedUntil("sign-in", "address", source, id, ADDRESS_LIMIT, nowMs);
    if (until) return refuse(refusal("Too many failed sign-ins from this address", until, nowMs));
  }
  if (accountKey && (source.deviceKey || trustedAddress)) {
    const filter = source.deviceKey ? "accountDevice" : "accountAddress";
    const until = await blockedUntil("sign-in", filter, { accountKey, ...source }, id, ACCOUNT_SOURCE_LIMIT, nowMs);
    if (until) return refuse(refusal("Too many failed sign-ins to this account from here", until, nowMs));
  }
  if (accountKey && !source.deviceKey) {
    const until = await slowedUntil(accountKey, id, nowMs);
    if (until) return refuse(refusal("Several sign-ins to this account have failed", until, nowMs));
  }
  return { ok: true, attemptId: id };
}

/**
 * A successful sign-in: its own attempt and the earlier failures from the same source (this browser, or this
 * address for browsers the account does not know) are forgotten; failures from elsewhere still count.
 */
export async function recordSignInSuccess(attemptId: number, email: string, source: AttemptSource) {
  const accountKey = accountKeyOf(email);
  await deleteAttempt(attemptId);
  if (!accountKey) return;
  const sql = `DELETE FROM sign_in_attempts
    WHERE scope = 'sign-in' AND ${FILTERS[source.deviceKey ? "accountDevice" : "accountAddress"]}`;
  await sequelize.query(sql, {
    bind: bindFor(sql, { accountKey, addressKey: source.addressKey, deviceKey: source.deviceKey }),
    type: QueryTypes.BULKDELETE,
  });
}

/** How many failed sign-ins the account has had in the window, from anywhere. */
export async function countSignInFailures(email: string, now = new Date()) {
  const accountKey = accountKeyOf(email);
  if (!accountKey) return 0;
  const [row] = await sequelize.query<{ n: number }>(
    `SELECT count(*) AS n FROM sign_in_attempts
      WHERE scope = 'sign-in' AND ${FILTERS.account} AND attempted_at_ms > $since`,
    { bind: { accountKey, since: now.getTime() - ATTEMPT_WINDOW_MS }, type: QueryTypes.SELECT },
  );
  return Number(row?.n ?? 0);
}

/**
 * Records a password-reset request; refused when a trusted address has made too many. `sendMail` is false once the
 * account has had its reset mails for the window: the form answers the same either way, so it reveals nothing.
 */
export async function startPasswordResetRequest(
  input: { email: string; addressKey: string },
  now = new Date(),
): Promise<{ ok: true; sendMail: boolean } | AttemptRefusal> {
  const nowMs = now.getTime();
  await pruneSignInAttempts(now);
  const accountKey = accountKeyOf(input.email);
  const source: AttemptSource = { addressKey: input.addressKey, deviceKey: null };
  const id = await insertAttempt("password-reset", accountKey, source, nowMs);
  if (source.addressKey !== SHARED_ADDRESS_KEY) {
    const until = await blockedUntil("password-reset", "address", source, id, ADDRESS_LIMIT, nowMs);
    if (until) {
      await deleteAttempt(id);
      return refusal("Too many password reset requests from this address", until, nowMs);
    }
  }
  const account = accountKey
    ? await blockedUntil("password-reset", "account", { accountKey }, id, ACCOUNT_RESET_MAIL_LIMIT, nowMs)
    : null;
  return { ok: true, sendMail: !account };
}
