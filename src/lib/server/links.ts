/**
 * Share links. The token (nanoid(24): 24 × 6 = 144 random bits) is shown once; only its SHA-256 is
 * stored, and a request's token is found by hashing it and looking the hash up (no string compare
 * of secrets, nothing usable in a database leak).
 */
import { createHash } from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import type { DbOrTx } from './db/client';
import { scenes, shareLinks, type ShareRole } from './db/schema';
import { audit } from './audit';
import { badRequest, notFound } from './http';
import { writeTx } from './scenes.server';

type LinkRow = typeof shareLinks.$inferSelect;
type SceneRow = typeof scenes.$inferSelect;

export const newToken = () => nanoid(24);
export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');
export const shareUrl = (origin: string, token: string) => `${origin.replace(/\/+$/, '')}/s/${token}`;

export function linkState(l: LinkRow, now = Date.now()) {
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
  const token = newToken();
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

/**
 * The live link and scene behind a token; 404 for unknown, revoked or expired tokens alike.
 * `touch` records the use (at most once a minute per link, to spare the writer).
 */
export async function resolveToken(db: DbOrTx, token: string, touch = false) {
  if (typeof token !== 'string' || token.length < 10 || token.length > 64) throw notFound('Link');
  const rows = await db
    .select({ link: shareLinks, scene: scenes })
    .from(shareLinks)
    .innerJoin(scenes, eq(scenes.id, shareLinks.sceneId))
    .where(eq(shareLinks.tokenHash, hashToken(token)))
    .limit(1);
  const hit = rows[0];
  if (!hit || !linkState(hit.link).active) throw notFound('Link');
  if (touch && (!hit.link.lastUsedAt || Date.now() - hit.link.lastUsedAt.getTime() > LAST_USED_GRANULARITY_MS)) {
    await writeTx(db, (tx) => tx.update(shareLinks).set({ lastUsedAt: new Date() }).where(eq(shareLinks.id, hit.link.id)));
  }
  return hit;
}

/** Origin for links handed out: PUBLIC_ORIGIN from the environment at start-up, else the request's own origin. */
export const publicOrigin = (requestUrl: URL) => (process.env.PUBLIC_ORIGIN || requestUrl.origin).replace(/\/+$/, '');
