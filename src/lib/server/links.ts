/**
 * Share links. The token (nanoid(24): 24 × 6 = 144 random bits) is shown once; only its SHA-256 is
 * stored, and a request's token is found by hashing it and looking the hash up (no string compare
 * of secrets, nothing usable in a database leak).
 */
import { hashToken } from './auth/secret-token';
import { and, asc, eq, isNull, lt, or, sql, type Placeholder } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/libsql';
import { preparedReadsOf } from './db/prepared';
import { nanoid } from 'nanoid';
import { writeTx, type DbOrTx, type QueryBuilder } from './db/client';
import { envelopes, scenes, shareLinks, type ShareRole } from './db/schema';
import { audit } from './audit';
import { badRequest, notFound } from './http';
import { sceneStateColumns, type SceneState } from './scene-service';

type LinkRow = typeof shareLinks.$inferSelect;
type SceneRow = typeof scenes.$inferSelect;

/** Share-link tokens are shorter than e-mailed ones (they end up in URLs people copy): 24 nanoid characters, 143 bits. */
const newLinkToken = () => nanoid(24);
export const shareUrl = (origin: string, token: string) => `${origin.replace(/\/+$/, '')}/s/${token}`;

export function linkState(l: Pick<LinkRow, 'revokedAt' | 'expiresAt'>, now = Date.now()) {
  const revoked = l.revokedAt !== null;
  const expired = l.expiresAt !== null && l.expiresAt.getTime() <= now;
  return { revoked, expired, active: !revoked && !expired };
}

export const linkOut = (l: LinkRow) => ({
  id: l.id,
  sceneId: l.sceneId,
  role: l.role,
  createdBy: l.createdBy,
  createdAt: l.createdAt.toISOString(),
  expiresAt: l.expiresAt?.toISOString() ?? null,
  lastUsedAt: l.lastUsedAt?.toISOString() ?? null,
  revokedAt: l.revokedAt?.toISOString() ?? null,
  ...linkState(l),
});

export async function createLink(
  db: DbOrTx,
  userId: string | null,
  scene: Pick<SceneRow, 'id' | 'teamId'>,
  role: ShareRole,
  expiresAt: Date | null,
  origin: string,
  now = new Date(),
) {
  if (expiresAt && expiresAt.getTime() <= now.getTime()) throw badRequest('expiresAt: must be in the future', 'expiresAt');
  const token = newLinkToken();
  const id = nanoid();
  await writeTx(db, async (tx) => {
    await tx.insert(shareLinks).values({ id, sceneId: scene.id, role, tokenHash: hashToken(token), createdBy: userId, createdAt: now, expiresAt });
    await audit(tx, { teamId: scene.teamId, userId, action: 'link.create', subjectType: 'link', subjectId: id, detail: { sceneId: scene.id, role, expiresAt: expiresAt?.toISOString() ?? null } });
  });
  return { id, token, url: shareUrl(origin, token), role, expiresAt: expiresAt?.toISOString() ?? null, createdAt: now.toISOString() };
}

export async function listLinks(db: DbOrTx, sceneId: string) {
  const rows = await db.select().from(shareLinks).where(eq(shareLinks.sceneId, sceneId)).orderBy(asc(shareLinks.createdAt));
  return rows.map(linkOut);
}

/** Revoking keeps the row (for the list and the log); the token is dead from this commit on. */
export async function revokeLink(db: DbOrTx, userId: string, scene: Pick<SceneRow, 'id' | 'teamId'>, linkId: string) {
  const rows = await db.select().from(shareLinks).where(and(eq(shareLinks.id, linkId), eq(shareLinks.sceneId, scene.id))).limit(1);
  if (!rows[0]) throw notFound('Link');
  if (rows[0].revokedAt) return;
  await writeTx(db, async (tx) => {
    await tx.update(shareLinks).set({ revokedAt: new Date() }).where(eq(shareLinks.id, linkId));
    await audit(tx, { teamId: scene.teamId, userId, action: 'link.revoke', subjectType: 'link', subjectId: linkId, detail: { sceneId: scene.id, role: rows[0].role } });
  });
}

const LAST_USED_GRANULARITY_MS = 60_000;

const tokenHashOf = (token: string) => {
  if (typeof token !== 'string' || token.length < 10 || token.length > 64) throw notFound('Link');
  return hashToken(token);
};

/** Touches in flight, by link id: a burst of requests on one link writes once, not once per request. */
const touching = new Map<string, Promise<unknown>>();

/**
 * Records a use of the link, at most once a minute per link (to spare the writer). The condition is in
 * the UPDATE too, so instances sharing the database do not stack touches either.
 */
async function touchLink(db: DbOrTx, link: Pick<LinkRow, 'id' | 'lastUsedAt'>) {
  const now = Date.now();
  if (link.lastUsedAt && now - link.lastUsedAt.getTime() <= LAST_USED_GRANULARITY_MS) return;
  let p = touching.get(link.id);
  if (!p) {
    const stale = or(isNull(shareLinks.lastUsedAt), lt(shareLinks.lastUsedAt, new Date(now - LAST_USED_GRANULARITY_MS)));
    p = writeTx(db, (tx) => tx.update(shareLinks).set({ lastUsedAt: new Date(now) }).where(and(eq(shareLinks.id, link.id), stale))).then(
        () => touching.delete(link.id),
        (e) => {
          touching.delete(link.id);
          throw e;
        },
      );
    touching.set(link.id, p);
  }
  await p;
}

/**
 * The live link and scene behind a token; 404 for unknown, revoked or expired tokens alike.
 * `touch` records the use (at most once a minute per link, to spare the writer).
 */
export async function resolveToken(db: DbOrTx, token: string, touch = false) {
  const rows = await db
    .select({ link: shareLinks, scene: scenes })
    .from(shareLinks)
    .innerJoin(scenes, eq(scenes.id, shareLinks.sceneId))
    .where(eq(shareLinks.tokenHash, tokenHashOf(token)))
    .limit(1);
  const hit = rows[0];
  if (!hit || !linkState(hit.link).active) throw notFound('Link');
  if (touch) await touchLink(db, hit.link);
  return hit;
}

/**
 * The live link behind a token with the few scene columns that identify the scene's current state
 * (no JSON column, no thumbnail): for the hot paths that only check the link or serve a cached
 * answer. Same 404s and touch as resolveToken; the link's validity is read from the database every time.
 */
export async function resolveLink(db: DbOrTx, token: string, touch = false) {
  const hash = tokenHashOf(token);
  const reads = preparedReadsOf(db);
  const rows = reads ? await reads.all(LINK_LOOKUP_SQL, [hash]) : ((await db.values(linkLookup(db, hash))) as unknown[][]);
  const hit = rows[0] ? linkHeadOf(rows[0]) : null;
  if (!hit || !linkState(hit).active) throw notFound('Link');
  if (touch) await touchLink(db, hit);
  return hit;
}

/** resolveLink's query; the columns are read back by position in linkHeadOf. */
const linkLookup = (db: QueryBuilder, hash: string | Placeholder) =>
  db
    .select({
      id: shareLinks.id,
      role: shareLinks.role,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      lastUsedAt: shareLinks.lastUsedAt,
      scene: sceneStateColumns,
    })
    .from(shareLinks)
    .innerJoin(scenes, eq(scenes.id, shareLinks.sceneId))
    .leftJoin(envelopes, eq(envelopes.id, scenes.envelopeId))
    .where(eq(shareLinks.tokenHash, hash));

/** Built once with drizzle (names from the schema), run as a statement prepared once (db/prepared.ts). */
const LINK_LOOKUP_SQL = linkLookup(drizzle.mock({ casing: 'snake_case' }), sql.placeholder('hash')).toSQL().sql;

const date = (v: unknown) => (v === null || v === undefined ? null : new Date(Number(v)));

function linkHeadOf(r: unknown[]) {
  const scene: SceneState = {
    id: r[5] as string,
    teamId: r[6] as string,
    version: Number(r[7]),
    envelopeId: (r[8] as string | null) ?? null,
    createdAt: date(r[9])!,
    updatedAt: date(r[10])!,
    hasThumbnail: Number(r[11]),
    envelopeData: (r[12] as string | null) ?? null,
  };
  return {
    id: r[0] as string,
    role: r[1] as ShareRole,
    expiresAt: date(r[2]),
    revokedAt: date(r[3]),
    lastUsedAt: date(r[4]),
    scene,
  };
}

/** Origin for links handed out: PUBLIC_ORIGIN from the environment at start-up, else the request's own origin. */
export const publicOrigin = (requestUrl: URL) => (process.env.PUBLIC_ORIGIN || requestUrl.origin).replace(/\/+$/, '');
