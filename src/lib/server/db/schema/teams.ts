import { sqliteTable, text, index, primaryKey } from 'drizzle-orm/sqlite-core';
import { instant, refCascade, refSetNull } from './columns';
import { users } from './accounts';

import { ROLES, type Role } from '../../../contracts/roles';

export { ROLES, type Role };

export const teams = sqliteTable('teams', {
  id: text().primaryKey(),
  name: text().notNull(),
  createdAt: instant().notNull(),
});

export const memberships = sqliteTable(
  'memberships',
  {
    teamId: refCascade(() => teams.id),
    userId: refCascade(() => users.id),
    role: text({ enum: ROLES }).notNull(),
    createdAt: instant().notNull(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);

export const invitations = sqliteTable(
  'invitations',
  {
    id: text().primaryKey(),
    /** SHA-256 of the token sent by e-mail. */
    tokenHash: text().notNull().unique(),
    teamId: refCascade(() => teams.id),
    email: text().notNull(),
    role: text({ enum: ROLES }).notNull(),
    invitedBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    expiresAt: instant().notNull(),
    acceptedAt: instant(),
    acceptedBy: refSetNull(() => users.id),
  },
  (t) => [index('invitations_team_idx').on(t.teamId)],
);
