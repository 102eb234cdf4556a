/**
 * Team calendar subscriptions: a secret URL per team (256 random bits, only the SHA-256 stored) that a
 * calendar program polls. Making a new one replaces the old (its URL stops working), deleting revokes it.
 */
import { createHash, randomBytes } from 'node:crypto';
import { and, asc, eq, gte } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import { writeTx, type DbOrTx } from '../db/client';
import { calendarFeeds, scenes, teams } from '../db/schema';
import { audit } from '../audit';
import { notFound } from '../http';
import { teamFeedCalendar, type FeedScene } from './scene-calendar';

const hash = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');
const TOKEN_RE = /^[A-Za-z0-9_-]{43}$/;
/** Scenes listed: from a day ago on, at most this many. */
export const FEED_MAX_SCENES = 200;

export const feedUrl = (origin: string, token: string) => `${origin.replace(/\/+$/, '')}/api/calendars/${token}.ics`;

export async function currentFeed(db: DbOrTx, teamId: string) {
  const r = (await db.select().from(calendarFeeds).where(eq(calendarFeeds.teamId, teamId)).limit(1))[0];
  return r ? { id: r.id, createdAt: r.createdAt.toISOString(), lastUsedAt: r.lastUsedAt?.toISOString() ?? null } : null;
}

export async function createFeed(db: DbOrTx, teamId: string, userId: string, origin: string) {
  const token = randomBytes(32).toString('base64url');
  const id = nanoid();
  const now = new Date();
  await writeTx(db, async (tx) => {
    await tx.delete(calendarFeeds).where(eq(calendarFeeds.teamId, teamId));
    await tx.insert(calendarFeeds).values({ id, teamId, tokenHash: hash(token), createdBy: userId, createdAt: now });
    await audit(tx, { teamId, userId, action: 'calendar.create', subjectType: 'calendar', subjectId: id });
  });
  return { id, token, url: feedUrl(origin, token), createdAt: now.toISOString() };
}

export async function revokeFeed(db: DbOrTx, teamId: string, userId: string) {
  await writeTx(db, async (tx) => {
    const gone = await tx.delete(calendarFeeds).where(eq(calendarFeeds.teamId, teamId)).returning({ id: calendarFeeds.id });
    if (!gone.length) throw notFound('Calendar subscription');
    await audit(tx, { teamId, userId, action: 'calendar.revoke', subjectType: 'calendar', subjectId: gone[0]!.id });
  });
}

/** The feed's file for a token; 404 for an unknown or revoked one. */
export async function feedCalendar(db: DbOrTx, token: string, sceneUrl: (id: string) => string, now = Date.now()): Promise<string> {
  if (!TOKEN_RE.test(token)) throw notFound('Calendar');
  const feed = (
    await db
      .select({ id: calendarFeeds.id, teamId: calendarFeeds.teamId, lastUsedAt: calendarFeeds.lastUsedAt, teamName: teams.name })
      .from(calendarFeeds)
      .innerJoin(teams, eq(teams.id, calendarFeeds.teamId))
      .where(eq(calendarFeeds.tokenHash, hash(token)))
      .limit(1)
  )[0];
  if (!feed) throw notFound('Calendar');
  const since = new Date(now - 86400000).toISOString();
  const rows = await db
    .select({ id: scenes.id, title: scenes.title, time: scenes.time, site: scenes.site, version: scenes.version, updatedAt: scenes.updatedAt })
    .from(scenes)
    .where(and(eq(scenes.teamId, feed.teamId), gte(scenes.time, since)))
    .orderBy(asc(scenes.time))
    .limit(FEED_MAX_SCENES);
  if (!feed.lastUsedAt || now - feed.lastUsedAt.getTime() > 3600000) {
    await writeTx(db, (tx) => tx.update(calendarFeeds).set({ lastUsedAt: new Date(now) }).where(eq(calendarFeeds.id, feed.id)));
  }
  return teamFeedCalendar(feed.teamName, rows as FeedScene[], sceneUrl);
}
