import { sqliteTable, text, integer, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { instant, refCascade } from './columns';

export const users = sqliteTable(
  'users',
  {
    id: text().primaryKey(),
    email: text().notNull(),
    name: text().notNull(),
    passwordHash: text().notNull(),
    createdAt: instant().notNull(),
    /** When the owner proved the address by a mailed link; null until then (no invitations, no notices). */
    emailVerifiedAt: instant(),
  },
  (t) => [uniqueIndex('users_email_uq').on(t.email)],
);

export const sessions = sqliteTable(
  'sessions',
  {
    id: text().primaryKey(),
    userId: refCascade(() => users.id),
    expiresAt: integer().notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const passwordResets = sqliteTable(
  'password_resets',
  {
    /** SHA-256 of the token: a database leak does not hand out working links. */
    tokenHash: text().primaryKey(),
    userId: refCascade(() => users.id),
    expiresAt: instant().notNull(),
    usedAt: instant(),
  },
  (t) => [index('password_resets_user_idx').on(t.userId)],
);

/** Links that prove an address: only the token's SHA-256 is stored; bound to the address it was sent to. */
export const emailVerifications = sqliteTable(
  'email_verifications',
  {
    tokenHash: text().primaryKey(),
    userId: refCascade(() => users.id),
    email: text().notNull(),
    expiresAt: instant().notNull(),
    usedAt: instant(),
  },
  (t) => [index('email_verifications_user_idx').on(t.userId)],
);
