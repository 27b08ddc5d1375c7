import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type WhereOptions,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { normaliseEmail } from "~/models/user.server";

export type AttemptScope = "sign-in" | "password-reset";

/** Attempts count for this long; older rows are pruned. */
export const ATTEMPT_WINDOW_MS = 15 * 60 * 1000;
/** Failed sign-ins one account may take per window; the next attempt, right password or not, is refused. */
export const ACCOUNT_FAILURE_LIMIT = 5;
/** Failed sign-ins (or reset requests) one client address may make per window. */
export const ADDRESS_LIMIT = 20;
/**
 * The same limit for the shared key "direct" that every client falls under when addresses are not known
 * (no trusted proxy): it is all clients together, so it is a ceiling for the process rather than one client's share.
 */
export const SHARED_ADDRESS_LIMIT = 100;
/** Reset mails one account receives per window; requests past it get the usual answer but send nothing. */
export const ACCOUNT_RESET_MAIL_LIMIT = 3;
/** The address key used when the client's own address cannot be trusted. */
export const SHARED_ADDRESS_KEY = "direct";

export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<number>;
  declare scope: AttemptScope;
  declare accountKey: string | null;
  declare addressKey: string;
  declare attemptedAt: Date;
}

SignInAttempt.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    scope: { type: DataTypes.STRING(20), allowNull: false },
    accountKey: { type: DataTypes.STRING(320), allowNull: true },
    addressKey: { type: DataTypes.STRING(64), allowNull: false },
    attemptedAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: "sign_in_attempts", underscored: true, timestamps: false },
);

export type AttemptRefusal = { ok: false; message: string; retryAfterSeconds: number };

function accountKeyOf(email: string | null | undefined) {
  const key = normaliseEmail(email ?? "").slice(0, 320);
  return key === "" ? null : key;
}

function addressLimit(addressKey: string) {
  return addressKey === SHARED_ADDRESS_KEY ? SHARED_ADDRESS_LIMIT : ADDRESS_LIMIT;
}

function refusal(what: string, retryAt: Date, now: Date): AttemptRefusal {
  const retryAfterSeconds = Math.max(1, Math.ceil((retryAt.getTime() - now.getTime()) / 1000));
  const minutes = Math.ceil(retryAfterSeconds / 60);
  return {
    ok: false,
    message: `${what}; try again in ${minutes} ${minutes === 1 ? "minute" : "minutes"}.`,
    retryAfterSeconds,
  };
}

/**
 * When the attempt `beforeId` may go ahead: null if fewer than `limit` earlier attempts matching `where` fall in
 * the window, else the moment the oldest of the last `limit` of them leaves it.
 */
async function blockedUntil(
  where: WhereOptions<SignInAttempt>,
  beforeId: number,
  limit: number,
  now: Date,
): Promise<Date | null> {
  const since = new Date(now.getTime() - ATTEMPT_WINDOW_MS);
  const limiting = await SignInAttempt.findOne({
    where: { ...where, id: { [Op.lt]: beforeId }, attemptedAt: { [Op.gt]: since } } as WhereOptions<SignInAttempt>,
    order: [
      ["attemptedAt", "DESC"],
      ["id", "DESC"],
    ],
    offset: limit - 1,
    attributes: ["attemptedAt"],
  });
  return limiting ? new Date(limiting.attemptedAt.getTime() + ATTEMPT_WINDOW_MS) : null;
}

/** Deletes attempts that have left the window. */
export async function pruneSignInAttempts(now = new Date()) {
  return SignInAttempt.destroy({ where: { attemptedAt: { [Op.lte]: new Date(now.getTime() - ATTEMPT_WINDOW_MS) } } });
}

/**
 * Records a sign-in attempt before the password is checked, so attempts made at the same moment count against
 * each other. Refused (and not recorded) when the account or the address has used up its failures; otherwise the
 * row stands as a failure until `clearSignInFailures` runs after a success.
 */
export async function startSignInAttempt(
  input: { email: string | null | undefined; addressKey: string },
  now = new Date(),
): Promise<{ ok: true } | AttemptRefusal> {
  await pruneSignInAttempts(now);
  const accountKey = accountKeyOf(input.email);
  const row = await SignInAttempt.create({
    scope: "sign-in",
    accountKey,
    addressKey: input.addressKey,
    attemptedAt: now,
  });
  const account = accountKey
    ? await blockedUntil({ scope: "sign-in", accountKey }, row.id, ACCOUNT_FAILURE_LIMIT, now)
    : null;
  const address = account
    ? null
    : await blockedUntil(
        { scope: "sign-in", addressKey: input.addressKey },
        row.id,
        addressLimit(input.addressKey),
        now,
      );
  if (!account && !address) return { ok: true };
  await row.destroy();
  return account
    ? refusal("Too many sign-in attempts for this account", account, now)
    : refusal("Too many sign-in attempts from this address", address!, now);
}

/** A successful sign-in clears the account's failures (and so takes them off its address's count too). */
export async function clearSignInFailures(email: string) {
  const accountKey = accountKeyOf(email);
  if (accountKey) await SignInAttempt.destroy({ where: { scope: "sign-in", accountKey } });
}

/**
 * Records a password-reset request; refused when the address has made too many. `sendMail` is false once the
 * account has had its reset mails for the window: the form answers the same either way, so it reveals nothing.
 */
export async function startPasswordResetRequest(
  input: { email: string; addressKey: string },
  now = new Date(),
): Promise<{ ok: true; sendMail: boolean } | AttemptRefusal> {
  await pruneSignInAttempts(now);
  const accountKey = accountKeyOf(input.email);
  const row = await SignInAttempt.create({
    scope: "password-reset",
    accountKey,
    addressKey: input.addressKey,
    attemptedAt: now,
  });
  const address = await blockedUntil(
    { scope: "password-reset", addressKey: input.addressKey },
    row.id,
    addressLimit(input.addressKey),
    now,
  );
  if (address) {
    await row.destroy();
    return refusal("Too many password reset requests from this address", address, now);
  }
  const account = accountKey
    ? await blockedUntil({ scope: "password-reset", accountKey }, row.id, ACCOUNT_RESET_MAIL_LIMIT, now)
    : null;
  return { ok: true, sendMail: !account };
}
