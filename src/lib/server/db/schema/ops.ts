import { sqliteTable, text, integer, index, primaryKey } from 'drizzle-orm/sqlite-core';
import { instant, refSetNull } from './columns';
import { users } from './accounts';
import { teams } from './teams';

/** Who did what, when: read by the dashboard's activity list. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: text().primaryKey(),
    at: instant().notNull(),
    teamId: text().references(() => teams.id, { onDelete: 'cascade' }),
    userId: refSetNull(() => users.id),
    action: text().notNull(),
    subjectType: text(),
    subjectId: text(),
    detail: text({ mode: 'json' }).$type<Record<string, unknown>>(),
  },
  (t) => [index('audit_team_at_idx').on(t.teamId, t.at)],
);

/**
 * Fixed-window counters. They live in the database, not in process memory, so several app
 * instances on one database enforce one limit.
 */
export const rateLimits = sqliteTable(
  'rate_limits',
  {
    key: text().notNull(),
    windowStart: integer().notNull(),
    count: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.key, t.windowStart] })],
);
