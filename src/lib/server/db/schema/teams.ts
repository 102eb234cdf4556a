import { sqliteTable, text, integer, index, primaryKey } from 'drizzle-orm/sqlite-core';
import { users } from './accounts';

import { ROLES, type Role } from '../../../contracts/roles';

export { ROLES, type Role };

export const teams = sqliteTable('teams', {
  id: text().primaryKey(),
  name: text().notNull(),
  createdAt: integer({ mode: 'timestamp_ms' }).notNull(),
});

export const memberships = sqliteTable(
  'memberships',
  {
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text({ enum: ROLES }).notNull(),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);

export const invitations = sqliteTable(
  'invitations',
  {
    id: text().primaryKey(),
    /** SHA-256 of the token sent by e-mail. */
    tokenHash: text().notNull().unique(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    email: text().notNull(),
    role: text({ enum: ROLES }).notNull(),
    invitedBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
    acceptedAt: integer({ mode: 'timestamp_ms' }),
    acceptedBy: text().references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('invitations_team_idx').on(t.teamId)],
);
