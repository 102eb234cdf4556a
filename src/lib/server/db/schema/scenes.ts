import { sqliteTable, text, integer, real, blob, index, uniqueIndex, primaryKey, type AnySQLiteColumn } from 'drizzle-orm/sqlite-core';
import { instant, refCascade, refSetNull } from './columns';
import { users } from './accounts';
import { teams } from './teams';

/**
 * Scenes and what hangs off them. JSON columns are typed loosely here (`unknown`) on purpose:
 * src/lib/server/scene-service.ts validates every one with zod on the way in and on the way out.
 */

import { LINK_ROLES as SHARE_ROLES, type LinkRole as ShareRole } from '../../../contracts/roles';

export { SHARE_ROLES, type ShareRole };

/** A team's named places; a scene copies the site it was made from (so editing a site never moves old scenes). */
export const sites = sqliteTable(
  'sites',
  {
    id: text().primaryKey(),
    teamId: refCascade(() => teams.id),
    name: text().notNull(),
    lat: real().notNull(),
    lon: real().notNull(),
    height: real().notNull(),
    timeZone: text().notNull(),
    createdBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    updatedAt: instant().notNull(),
  },
  (t) => [index('sites_team_idx').on(t.teamId)],
);

/** An instrument's pointing limits; scenes refer to it so a change shows in every scene that uses it. */
export const envelopes = sqliteTable(
  'envelopes',
  {
    id: text().primaryKey(),
    teamId: refCascade(() => teams.id),
    name: text().notNull(),
    /** The envelope JSON of the API contract (name included). */
    data: text({ mode: 'json' }).notNull().$type<unknown>(),
    createdBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    updatedAt: instant().notNull(),
  },
  (t) => [index('envelopes_team_idx').on(t.teamId)],
);

export const scenes = sqliteTable(
  'scenes',
  {
    id: text().primaryKey(),
    teamId: refCascade(() => teams.id),
    title: text().notNull(),
    description: text().notNull().default(''),
    site: text({ mode: 'json' }).notNull().$type<unknown>(),
    /** ISO 8601 UTC. */
    time: text().notNull(),
    layers: text({ mode: 'json' }).notNull().$type<unknown>(),
    camera: text({ mode: 'json' }).notNull().$type<unknown>(),
    /** A team envelope (resolved on read) … */
    envelopeId: refSetNull(() => envelopes.id),
    /** … or an inline one; never both. */
    envelope: text({ mode: 'json' }).$type<unknown>(),
    targets: text({ mode: 'json' }).notNull().$type<unknown>(),
    pins: text({ mode: 'json' }).notNull().$type<unknown>(),
    steps: text({ mode: 'json' }).notNull().$type<unknown>(),
    /** Optimistic concurrency: every accepted write bumps it by one. */
    version: integer().notNull().default(1),
    createdBy: refSetNull(() => users.id),
    updatedBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    updatedAt: instant().notNull(),
    /** PNG bytes of a small preview, if the client sent one. */
    thumbnail: blob({ mode: 'buffer' }),
  },
  (t) => [index('scenes_team_updated_idx').on(t.teamId, t.updatedAt), index('scenes_envelope_idx').on(t.envelopeId)],
);

/** One full snapshot per version: history and restore. */
export const sceneVersions = sqliteTable(
  'scene_versions',
  {
    sceneId: refCascade(() => scenes.id),
    version: integer().notNull(),
    snapshot: text({ mode: 'json' }).notNull().$type<unknown>(),
    authorId: refSetNull(() => users.id),
    createdAt: instant().notNull(),
  },
  (t) => [primaryKey({ name: 'scene_versions_pk', columns: [t.sceneId, t.version] })],
);

export const shareLinks = sqliteTable(
  'share_links',
  {
    id: text().primaryKey(),
    sceneId: refCascade(() => scenes.id),
    role: text({ enum: SHARE_ROLES }).notNull(),
    /** SHA-256 (hex) of the token; the token itself is shown once and never stored. */
    tokenHash: text().notNull(),
    createdBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
    expiresAt: instant(),
    revokedAt: instant(),
    lastUsedAt: instant(),
  },
  (t) => [uniqueIndex('share_links_token_hash_uq').on(t.tokenHash), index('share_links_scene_idx').on(t.sceneId)],
);

export const comments = sqliteTable(
  'comments',
  {
    id: text().primaryKey(),
    sceneId: refCascade(() => scenes.id),
    parentId: text().references((): AnySQLiteColumn => comments.id, { onDelete: 'cascade' }),
    authorUserId: refSetNull(() => users.id),
    /** Name typed by a guest on a reviewer link (authorUserId is then null). */
    authorName: text(),
    linkId: refSetNull(() => shareLinks.id),
    /** Markdown, stored and returned as text. */
    body: text().notNull(),
    /** `{ra, dec}` or `{azimuth, altitude}`, degrees. */
    anchor: text({ mode: 'json' }).$type<unknown>(),
    stepId: text(),
    resolvedAt: instant(),
    resolvedBy: refSetNull(() => users.id),
    createdAt: instant().notNull(),
  },
  (t) => [index('comments_scene_created_idx').on(t.sceneId, t.createdAt), index('comments_parent_idx').on(t.parentId)],
);

/** The live presenter's position: in the database so every app instance streams the same state. */
export const presenterState = sqliteTable('presenter_state', {
  sceneId: text()
    .primaryKey()
    .references(() => scenes.id, { onDelete: 'cascade' }),
  stepIndex: integer().notNull(),
  /** ISO 8601 UTC, or null to use the step's own time. */
  time: text(),
  updatedBy: refSetNull(() => users.id),
  updatedAt: instant().notNull(),
});
