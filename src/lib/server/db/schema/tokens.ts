import { sqliteTable, text, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { instant, refCascade } from './columns';
import { users } from './accounts';

export type TokenScope = 'read' | 'write';

/**
 * Personal API tokens. Only the SHA-256 of the secret is stored (looked up through a unique index, so no
 * comparison ever runs over the secret); `hint` is the secret's first characters after the prefix, shown
 * in the list so a member can tell tokens apart.
 */
export const apiTokens = sqliteTable(
  'api_tokens',
  {
    id: text().primaryKey(),
    userId: refCascade(() => users.id),
    name: text().notNull(),
    scope: text({ enum: ['read', 'write'] }).$type<TokenScope>().notNull(),
    tokenHash: text().notNull(),
    hint: text().notNull(),
    createdAt: instant().notNull(),
    lastUsedAt: instant(),
  },
  (t) => [uniqueIndex('api_tokens_hash_uq').on(t.tokenHash), index('api_tokens_user_idx').on(t.userId)],
);
