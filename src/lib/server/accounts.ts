/**
 * Accounts: sign-up, sign-in (with throttling), password reset and change, the caller's profile.
 * Routes parse and respond; the rules live here. Session cookies stay in ./auth.
 */
import { and, eq, gt, isNull, ne } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import { z } from 'zod';
import { audit } from './audit';
import { hashToken, newToken } from './auth/secret-token';
import { dummyHash, hashPassword, verifyPassword } from './auth/password';
import { writeTx, type DbOrTx } from './db/client';
import { emailVerifications, memberships, passwordResets, rateLimits, sessions, teams, users } from './db/schema';
import { HttpError } from './http';
import { rateCount, rateLimit, reserve } from './rate-limit';
import { linkOrigin, sendMail } from './mail';
import { passwordResetMail, verifyEmailMail } from './mail/templates';
import { listTeamsOf, type TeamSummary } from './teams';

// ---- input schemas (shared with the forms in src/components/account) ----

export const emailField = z.string({ required_error: 'is required' }).trim().toLowerCase().email('must be an e-mail address').max(254);
export const passwordField = z.string({ required_error: 'is required' }).min(10, 'must be at least 10 characters').max(256, 'must be at most 256 characters');
export const nameField = z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(100, 'must be at most 100 characters');

export const signUpInput = z.object({
  email: emailField,
  password: passwordField,
  name: nameField,
  /** Sign-up creates a personal team unless the person signs up to accept an invitation. */
  personalTeam: z.boolean().default(true),
});
export const signInInput = z.object({
  email: emailField,
  // No length rule here: a wrong pair must answer 401, never a 400 that tells the rules apart.
  password: z.string({ required_error: 'is required' }).min(1, 'is required').max(256),
});
export const resetRequestInput = z.object({ email: emailField });
export const resetConfirmInput = z.object({ token: z.string({ required_error: 'is required' }).min(1).max(200), password: passwordField });
export const changePasswordInput = z.object({
  currentPassword: z.string({ required_error: 'is required' }).min(1, 'is required').max(256),
  newPassword: passwordField,
});
export const profileInput = z.object({ name: nameField });

export interface PublicUser {
  id: string;
  email: string;
  name: string;
}

// ---- e-mail verification ----

export const VERIFY_VALID_HOURS = 48;
const VERIFY_MAIL_LIMIT = { perUser: 5, windowSec: 60 * 60 } as const;

/** Mails a link that proves the address (at most 5 an hour per account). Not awaited by callers' answers. */
export async function sendEmailVerification(db: DbOrTx, user: PublicUser, requestUrl: URL): Promise<void> {
  await rateLimit(`verify-mail:${user.id}`, VERIFY_MAIL_LIMIT.perUser, VERIFY_MAIL_LIMIT.windowSec);
  const token = newToken();
  await writeTx(db, (tx) =>
    tx.insert(emailVerifications).values({
      tokenHash: hashToken(token),
      userId: user.id,
      email: user.email,
      expiresAt: new Date(Date.now() + VERIFY_VALID_HOURS * 3600_000),
    }),
  );
  const mail = verifyEmailMail({ name: user.name, url: `${linkOrigin(requestUrl)}/verify/${token}`, validHours: VERIFY_VALID_HOURS });
  sendMail({ to: user.email, ...mail }).catch((e) => console.error('[mail] verification mail failed', e));
}

/** Spends a verification link: the account's address is verified if it is still the one the link was sent to. */
export async function confirmEmail(db: DbOrTx, token: string): Promise<PublicUser | null> {
  if (!token || token.length > 200) return null;
  return writeTx(db, async (tx) => {
    const now = new Date();
    const v = (
      await tx
        .select()
        .from(emailVerifications)
        .where(and(eq(emailVerifications.tokenHash, hashToken(token)), isNull(emailVerifications.usedAt), gt(emailVerifications.expiresAt, now)))
        .limit(1)
    )[0];
    if (!v) return null;
    const u = (await tx.select().from(users).where(eq(users.id, v.userId)).limit(1))[0];
    if (!u || u.email !== v.email) return null;
    await tx.update(emailVerifications).set({ usedAt: now }).where(eq(emailVerifications.tokenHash, v.tokenHash));
    if (!u.emailVerifiedAt) {
      await tx.update(users).set({ emailVerifiedAt: now }).where(eq(users.id, u.id));
      await audit(tx, { userId: u.id, action: 'account.email_verified', subjectType: 'user', subjectId: u.id });
    }
    return { id: u.id, email: u.email, name: u.name };
  });
}

export async function isEmailVerified(db: DbOrTx, userId: string): Promise<boolean> {
  const r = await db.select({ at: users.emailVerifiedAt }).from(users).where(eq(users.id, userId)).limit(1);
  return Boolean(r[0]?.at);
}

// ---- tokens: the mail carries the token, the database only its SHA-256 ----

/** 256 random bits, base64url. */

// ---- throttling ----

/** Failed sign-ins allowed per window, per e-mail address and per client address. */
/**
 * Sign-in limits (failures only; a success gives its attempt back). Hard limits only where the sender
 * meets them itself: 5 per (e-mail, address) and 30 per address in 15 minutes. Per e-mail from anywhere,
 * a back-off instead of a lock a stranger could trigger: 10 attempts a minute while the e-mail has fewer
 * than 10 failures in 15 minutes, then 3, and 1 a minute past 40 — the owner waits a minute at most.
 */
export const SIGN_IN_LIMITS = {
  perPair: 5,
  perAddress: 30,
  windowSec: 15 * 60,
  perEmailMinute: (failures15: number) => (failures15 < 10 ? 10 : failures15 < 40 ? 3 : 1),
} as const;
const RESET_LIMITS = { perEmail: 5, perAddress: 20, windowSec: 60 * 60 } as const;
const SIGN_UP_LIMITS = { perAddress: 50, windowSec: 60 * 60 } as const;

const INVALID_CREDENTIALS = () => new HttpError(401, 'invalid_credentials', 'The e-mail address or the password is wrong.');

// ---- services ----

export async function findUserByEmail(db: DbOrTx, email: string) {
  const rows = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).limit(1);
  return rows[0] ?? null;
}

const isUniqueViolation = (e: unknown): boolean => {
  const err = e as { message?: string; code?: string; cause?: unknown } | null;
  if (/UNIQUE constraint failed|SQLITE_CONSTRAINT/i.test(`${err?.code ?? ''} ${err?.message ?? e}`)) return true;
  return err?.cause !== undefined && err.cause !== e ? isUniqueViolation(err.cause) : false;
};

export async function signUp(
  db: DbOrTx,
  input: z.infer<typeof signUpInput>,
  clientAddr: string,
  requestUrl?: URL,
): Promise<{ user: PublicUser; teams: TeamSummary[] }> {
  await rateLimit(`signup:addr:${clientAddr}`, SIGN_UP_LIMITS.perAddress, SIGN_UP_LIMITS.windowSec);
  if (await findUserByEmail(db, input.email)) throw new HttpError(409, 'email_taken', 'An account with this e-mail address exists already.', 'email');
  const passwordHash = await hashPassword(input.password);
  const now = new Date();
  const user = { id: nanoid(), email: input.email, name: input.name };
  try {
    await writeTx(db, async (tx) => {
      await tx.insert(users).values({ ...user, passwordHash, createdAt: now });
      if (input.personalTeam) {
        const teamId = nanoid();
        await tx.insert(teams).values({ id: teamId, name: `${input.name}’s team`, createdAt: now });
        await tx.insert(memberships).values({ teamId, userId: user.id, role: 'owner', createdAt: now });
        await audit(tx, { teamId, userId: user.id, action: 'team.create', subjectType: 'team', subjectId: teamId });
      }
      await audit(tx, { userId: user.id, action: 'account.create', subjectType: 'user', subjectId: user.id });
    });
  } catch (e) {
    // Two sign-ups with one address at once: the loser meets the unique index (however the driver words it).
    if (isUniqueViolation(e) || (await findUserByEmail(db, input.email))) {
      throw new HttpError(409, 'email_taken', 'An account with this e-mail address exists already.', 'email');
    }
    throw e;
  }
  // The address is unproven until the mailed link is opened (invitations and comment notices wait for it).
  if (requestUrl) await sendEmailVerification(db, user, requestUrl).catch((e) => console.error('[mail] verification not sent', e));
  return { user, teams: await listTeamsOf(db, user.id) };
}

/** Sign-in attempts of this process in progress, per limit key (see `signIn`). */
const signInFlight = new Map<string, number>();

/**
 * Checks an e-mail/password pair. Unknown e-mails are compared against a dummy hash so that both
 * failures take the same time and answer the same message. Only failures count towards the limits.
 */
export async function signIn(db: DbOrTx, input: z.infer<typeof signInInput>, clientAddr: string): Promise<PublicUser> {
  const { perPair, perAddress, windowSec, perEmailMinute } = SIGN_IN_LIMITS;
  const email = input.email;
  const pairKey = `signin:pair:${email}:${clientAddr}`;
  const minuteKey = `signin:email-min:${email}`;
  const limits = [
    { key: pairKey, limit: perPair, windowSec },
    { key: `signin:addr:${clientAddr}`, limit: perAddress, windowSec },
    { key: minuteKey, limit: perEmailMinute(0), windowSec: 60 },
  ];
  // Cheap gates first, without writing (every write is an fsync on the event loop): this process's
  // attempts in progress, taken before anything is awaited so a burst is refused without touching the
  // database; then the counts so far.
  const refuse = (l: { windowSec: number }) =>
    new HttpError(429, 'rate_limited', 'Too many attempts; try again later.', undefined, undefined, {
      'retry-after': String(l.windowSec - (Math.floor(Date.now() / 1000) % l.windowSec) || 1),
    });
  for (const l of limits) if ((signInFlight.get(l.key) ?? 0) >= l.limit) throw refuse(l);
  for (const l of limits) signInFlight.set(l.key, (signInFlight.get(l.key) ?? 0) + 1);
  try {
    // The e-mail's back-off tier follows its failures in the last 15 minutes.
    limits[2]!.limit = perEmailMinute(await rateCount(`signin:email:${email}`, windowSec));
    for (const l of limits) {
      if ((signInFlight.get(l.key) ?? 1) - 1 + (await rateCount(l.key, l.windowSec)) >= l.limit) throw refuse(l);
    }
    // The authoritative check: reserved before scrypt, atomically in the database (other instances
    // included), so concurrent attempts cannot all pass a check of "4 so far".
    const attempt = await reserve([...limits, { key: `signin:email:${email}`, limit: Number.MAX_SAFE_INTEGER, windowSec }]);
    const user = await findUserByEmail(db, email);
    const ok = await verifyPassword(user?.passwordHash ?? (await dummyHash()), input.password);
    if (!user || !ok) throw INVALID_CREDENTIALS();
    // Only failures count: the attempt is given back, and this address's failures for the e-mail forgotten.
    await attempt.release();
    await writeTx(db, (tx) => tx.delete(rateLimits).where(eq(rateLimits.key, pairKey)));
    return { id: user.id, email: user.email, name: user.name };
  } finally {
    for (const l of limits) {
      const n = (signInFlight.get(l.key) ?? 1) - 1;
      if (n > 0) signInFlight.set(l.key, n);
      else signInFlight.delete(l.key);
    }
  }
}

export const RESET_VALID_MINUTES = 60;

/** Always succeeds from the caller's view (no account enumeration); mails a single-use link when the account exists. */
export async function requestPasswordReset(db: DbOrTx, email: string, clientAddr: string, requestUrl: URL): Promise<void> {
  await rateLimit(`reset:addr:${clientAddr}`, RESET_LIMITS.perAddress, RESET_LIMITS.windowSec);
  await rateLimit(`reset:email:${email}`, RESET_LIMITS.perEmail, RESET_LIMITS.windowSec);
  const user = await findUserByEmail(db, email);
  if (!user) return;
  const token = newToken();
  await writeTx(db, (tx) =>
    tx.insert(passwordResets).values({
      tokenHash: hashToken(token),
      userId: user.id,
      expiresAt: new Date(Date.now() + RESET_VALID_MINUTES * 60_000),
    }),
  );
  const mail = passwordResetMail({ name: user.name, url: `${linkOrigin(requestUrl)}/reset/${token}`, validMinutes: RESET_VALID_MINUTES });
  // Not awaited: the answer must not take longer for a known address than for an unknown one.
  sendMail({ to: user.email, ...mail }).catch((e) => console.error('[mail] password reset mail failed', e));
}

/** Sets the new password, spends every open reset token of the user and ends all of their sessions. */
export async function confirmPasswordReset(db: DbOrTx, input: z.infer<typeof resetConfirmInput>): Promise<PublicUser> {
  const passwordHash = await hashPassword(input.password);
  return writeTx(db, async (tx) => {
    const now = new Date();
    const rows = await tx
      .select({ userId: passwordResets.userId })
      .from(passwordResets)
      .where(and(eq(passwordResets.tokenHash, hashToken(input.token)), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, now)))
      .limit(1);
    const userId = rows[0]?.userId;
    if (!userId) throw new HttpError(400, 'invalid_token', 'This reset link is invalid, used or expired; ask for a new one.', 'token');
    await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
    await tx.update(passwordResets).set({ usedAt: now }).where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
    await tx.delete(sessions).where(eq(sessions.userId, userId));
    await audit(tx, { userId, action: 'account.password_reset', subjectType: 'user', subjectId: userId });
    const u = (await tx.select().from(users).where(eq(users.id, userId)).limit(1))[0]!;
    return { id: u.id, email: u.email, name: u.name };
  });
}

/** Changes the password of a signed-in user and ends their other sessions. */
export async function changePassword(db: DbOrTx, userId: string, currentSessionId: string, input: z.infer<typeof changePasswordInput>): Promise<void> {
  const u = (await db.select().from(users).where(eq(users.id, userId)).limit(1))[0];
  if (!u || !(await verifyPassword(u.passwordHash, input.currentPassword))) {
    throw new HttpError(400, 'wrong_password', 'The current password is wrong.', 'currentPassword');
  }
  const passwordHash = await hashPassword(input.newPassword);
  await writeTx(db, async (tx) => {
    await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
    await tx.delete(sessions).where(and(eq(sessions.userId, userId), ne(sessions.id, currentSessionId)));
    await audit(tx, { userId, action: 'account.password_change', subjectType: 'user', subjectId: userId });
  });
}

export async function updateProfile(db: DbOrTx, userId: string, input: z.infer<typeof profileInput>): Promise<PublicUser> {
  const u = await writeTx(db, async (tx) => {
    await tx.update(users).set({ name: input.name }).where(eq(users.id, userId));
    return (await tx.select().from(users).where(eq(users.id, userId)).limit(1))[0]!;
  });
  return { id: u.id, email: u.email, name: u.name };
}

export async function me(db: DbOrTx, user: PublicUser): Promise<{ user: PublicUser; teams: TeamSummary[]; emailVerified: boolean }> {
  return { user: { id: user.id, email: user.email, name: user.name }, teams: await listTeamsOf(db, user.id), emailVerified: await isEmailVerified(db, user.id) };
}

