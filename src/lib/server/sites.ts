/** A team's saved sites (server-only; services take `Db | Tx`). */
import { asc, eq } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import type { User } from 'lucia';
import { writeTx, type DbOrTx } from './db/client';
import { sites } from './db/schema';
import { audit } from './audit';
import { notFound } from './http';
import { authorize, type Action } from './policy';
import { siteSchema, type Site } from '../contracts/scene-doc';

type SiteRow = typeof sites.$inferSelect;

export const siteOut = (r: SiteRow) => ({
  id: r.id,
  teamId: r.teamId,
  name: r.name,
  lat: r.lat,
  lon: r.lon,
  height: r.height,
  timeZone: r.timeZone,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
});

export async function listSites(db: DbOrTx, teamId: string) {
  const rows = await db.select().from(sites).where(eq(sites.teamId, teamId)).orderBy(asc(sites.name));
  return rows.map(siteOut);
}

export async function siteFor(db: DbOrTx, user: User, id: string, action: Action) {
  const rows = await db.select().from(sites).where(eq(sites.id, id)).limit(1);
  if (!rows[0]) throw notFound('Site');
  await authorize(db, user, rows[0].teamId, action, 'Site');
  return rows[0];
}

export async function createSite(db: DbOrTx, teamId: string, site: Site, userId: string | null, id = nanoid()) {
  const s = siteSchema.parse(site);
  const at = new Date();
  await writeTx(db, async (tx) => {
    await tx.insert(sites).values({ id, teamId, ...s, createdBy: userId, createdAt: at, updatedAt: at });
    await audit(tx, { teamId, userId, action: 'site.create', subjectType: 'site', subjectId: id, detail: { name: s.name } });
  });
  const rows = await db.select().from(sites).where(eq(sites.id, id));
  return siteOut(rows[0]);
}

export async function updateSite(db: DbOrTx, row: SiteRow, patch: Partial<Site>, userId: string) {
  const next = siteSchema.parse({
    name: patch.name ?? row.name,
    lat: patch.lat ?? row.lat,
    lon: patch.lon ?? row.lon,
    height: patch.height ?? row.height,
    timeZone: patch.timeZone ?? row.timeZone,
  });
  await writeTx(db, async (tx) => {
    await tx.update(sites).set({ ...next, updatedAt: new Date() }).where(eq(sites.id, row.id));
    await audit(tx, { teamId: row.teamId, userId, action: 'site.update', subjectType: 'site', subjectId: row.id, detail: { fields: Object.keys(patch) } });
  });
  const rows = await db.select().from(sites).where(eq(sites.id, row.id));
  return siteOut(rows[0]);
}

/** Scenes keep their own copy of the site, so deleting a saved site changes no scene. */
export async function deleteSite(db: DbOrTx, row: SiteRow, userId: string) {
  await writeTx(db, async (tx) => {
    await tx.delete(sites).where(eq(sites.id, row.id));
    await audit(tx, { teamId: row.teamId, userId, action: 'site.delete', subjectType: 'site', subjectId: row.id, detail: { name: row.name } });
  });
}
