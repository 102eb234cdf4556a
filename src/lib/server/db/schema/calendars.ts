import { sqliteTable, text, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { instant, refCascade, refSetNull } from './columns';
import { users } from './accounts';
import { teams } from './teams';

/**
 * A team's secret calendar subscription URL (`/api/calendars/<token>.ics`). Only the SHA-256 of the token
 * is stored; a team has at most one live feed (making a new one replaces it), deleting it revokes the URL.
 */
export const calendarFeeds = sqliteTable(
  'calendar_feeds',
  {
    id: text().primaryKey(),
    teamId: refCascade(() => teams.id),
    tokenHash: text().notNull(),
    createdBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    lastUsedAt: instant(),
  },
  (t) => [uniqueIndex('calendar_feeds_hash_uq').on(t.tokenHash), index('calendar_feeds_team_idx').on(t.teamId)],
);
