/**
 * Scene storage: create, read, optimistic-concurrency update, delete, history and restore.
 * Services take `Db | Tx`; they never import the app's db handle, so scripts (seed) can use them too.
 */
import { and, desc, eq, inArray } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import type { User } from 'lucia';
import type { Db, DbOrTx, Tx } from './db/client';
import { envelopes, memberships, scenes, sceneVersions, sites } from './db/schema';
import { audit } from './audit';
import { HttpError, notFound } from './http';
import { authorize, type Action } from './policy';
import {
  applyPatch,
  defaultCamera,
  sceneDocSchema,
  teamEnvelopeSchema,
  withDefaultLayers,
  type EnvelopeJson,
  type TeamEnvelopeJson,
  type SceneCreateBody,
  type SceneDoc,
  type SceneOut,
  type ScenePatchBody,
} from './scenes';

type SceneRow = typeof scenes.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Transactions

function isBusy(e: unknown): boolean {
  for (let x: unknown = e, i = 0; x && i < 5; x = (x as { cause?: unknown }).cause, i++) {
    const code = (x as { code?: unknown }).code;
    if (code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED') return true;
    if (x instanceof Error && /SQLITE_BUSY|database is locked/.test(x.message)) return true;
  }
  return false;
}

const isTx = (db: DbOrTx): db is Tx => typeof (db as Tx).rollback === 'function';

/**
 * A write transaction (BEGIN IMMEDIATE). Connections of the libSQL pool other than the first have no
 * busy timeout, so a writer that finds the file locked retries with a short jittered back-off instead
 * of failing; inside an outer transaction this is a savepoint.
 */
export async function writeTx<T>(db: DbOrTx, fn: (tx: Tx) => Promise<T>): Promise<T> {
  if (isTx(db)) return db.transaction(fn);
  const deadline = Date.now() + 10_000;
  for (let attempt = 0; ; attempt++) {
    try {
      return await (db as Db).transaction(fn);
    } catch (e) {
      if (!isBusy(e) || Date.now() > deadline) throw e;
      await new Promise((r) => setTimeout(r, Math.min(100, 5 + attempt * 5) * (0.5 + Math.random())));
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Reading

/**
 * Validated documents by `id:version:envelopeId`. Every edit of a scene raises its version; the one
 * write that changes a document without doing so — deleting a team envelope, which copies its limits
 * inline and clears `envelopeId` (envelopes.ts) — changes `envelopeId`, so the key changes with it.
 * A new write path that touches scene documents must raise the version (or extend this key).
 * The cache holds nothing another instance needs to see; it spares the hot read paths (shared links,
 * presenter streams) a full zod pass.
 */
const DOC_CACHE_MAX = 500;
const docCache = new Map<string, SceneDoc>();

/** The stored document of a row, validated on the way out (a bad row is a bug: it throws → 500). */
export function docOf(row: SceneRow): SceneDoc {
  const key = `${row.id}:${row.version}:${row.envelopeId ?? ''}`;
  const hit = docCache.get(key);
  if (hit) return structuredClone(hit);
  const doc = parseDoc(row);
  if (docCache.size >= DOC_CACHE_MAX) docCache.delete(docCache.keys().next().value!);
  docCache.set(key, doc);
  return structuredClone(doc);
}

function parseDoc(row: SceneRow): SceneDoc {
  return sceneDocSchema.parse({
    title: row.title,
    description: row.description,
    site: row.site,
    time: row.time,
    layers: row.layers,
    camera: row.camera,
    envelopeId: row.envelopeId,
    envelope: row.envelope ?? null,
    targets: row.targets,
    pins: row.pins,
    steps: row.steps,
  });
}

/** A stored team envelope, validated on the way out. */
export function envelopeOf(data: unknown): TeamEnvelopeJson {
  return teamEnvelopeSchema.parse(data);
}

async function resolveEnvelope(db: DbOrTx, row: SceneRow, doc: SceneDoc): Promise<EnvelopeJson | null> {
  if (row.envelopeId) {
    const e = await db.select({ data: envelopes.data }).from(envelopes).where(eq(envelopes.id, row.envelopeId)).limit(1);
    return e[0] ? envelopeOf(e[0].data) : null;
  }
  return doc.envelope;
}

export async function toSceneOut(db: DbOrTx, row: SceneRow): Promise<SceneOut> {
  const doc = docOf(row);
  return {
    id: row.id,
    teamId: row.teamId,
    title: doc.title,
    description: doc.description,
    site: doc.site,
    time: doc.time,
    layers: doc.layers,
    camera: doc.camera,
    envelopeId: row.envelopeId,
    envelope: await resolveEnvelope(db, row, doc),
    targets: doc.targets,
    pins: doc.pins,
    steps: doc.steps,
    version: row.version,
    createdBy: row.createdBy,
    updatedBy: row.updatedBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    hasThumbnail: row.thumbnail !== null && row.thumbnail !== undefined,
  };
}

/** For link guests: the same scene without account ids. */
export function publicScene(s: SceneOut): Omit<SceneOut, 'createdBy' | 'updatedBy'> {
  const { createdBy: _c, updatedBy: _u, ...rest } = s;
  return rest;
}

export async function sceneRow(db: DbOrTx, id: string): Promise<SceneRow | null> {
  const rows = await db.select().from(scenes).where(eq(scenes.id, id)).limit(1);
  return rows[0] ?? null;
}

/** Loads a scene and checks the caller's role in its team: 404 unknown or other team, 403 too low. */
export async function sceneFor(db: DbOrTx, user: User, id: string, action: Action) {
  const row = await sceneRow(db, id);
  if (!row) throw notFound('Scene');
  const role = await authorize(db, user, row.teamId, action, 'Scene');
  return { row, role };
}

export async function listScenes(db: DbOrTx, userId: string, teamId?: string) {
  const teamIds = (await db.select({ teamId: memberships.teamId }).from(memberships).where(eq(memberships.userId, userId))).map(
    (r) => r.teamId,
  );
  const wanted = teamId ? teamIds.filter((t) => t === teamId) : teamIds;
  if (!wanted.length) return [];
  const rows = await db
    .select({
      id: scenes.id,
      teamId: scenes.teamId,
      title: scenes.title,
      description: scenes.description,
      time: scenes.time,
      version: scenes.version,
      updatedAt: scenes.updatedAt,
      createdAt: scenes.createdAt,
      // For the dashboard's site and author filters (added by the scenes UI).
      site: scenes.site,
      createdBy: scenes.createdBy,
    })
    .from(scenes)
    .where(inArray(scenes.teamId, wanted))
    .orderBy(desc(scenes.updatedAt));
  return rows.map(({ site, ...r }) => ({
    ...r,
    siteName: (site as { name?: string } | null)?.name ?? '',
    updatedAt: r.updatedAt.toISOString(),
    createdAt: r.createdAt.toISOString(),
  }));
}

// ---------------------------------------------------------------------------------------------
// Writing

/** A team envelope chosen for a scene must belong to the scene's team (404 otherwise, never revealing it). */
async function checkEnvelopeInTeam(db: DbOrTx, envelopeId: string, teamId: string) {
  const e = await db.select({ teamId: envelopes.teamId }).from(envelopes).where(eq(envelopes.id, envelopeId)).limit(1);
  if (!e[0] || e[0].teamId !== teamId) throw new HttpError(404, 'not_found', 'Envelope not found.', 'envelopeId');
}

function columnsOf(doc: SceneDoc) {
  return {
    title: doc.title,
    description: doc.description,
    site: doc.site,
    time: doc.time,
    layers: doc.layers,
    camera: doc.camera,
    envelopeId: doc.envelopeId,
    envelope: doc.envelope,
    targets: doc.targets,
    pins: doc.pins,
    steps: doc.steps,
  };
}

async function snapshot(tx: DbOrTx, sceneId: string, version: number, doc: SceneDoc, authorId: string | null, at: Date) {
  await tx.insert(sceneVersions).values({ sceneId, version, snapshot: doc, authorId, createdAt: at });
}

export interface CreateOptions {
  /** Fixed id (seed); random otherwise. */
  id?: string;
  now?: Date;
}

/** Caller must have checked `scene.write` on body.teamId (createScene does it when given a user). */
export async function insertScene(tx: DbOrTx, teamId: string, doc: SceneDoc, userId: string | null, opts: CreateOptions = {}) {
  const checked = sceneDocSchema.parse(doc);
  if (checked.envelopeId) await checkEnvelopeInTeam(tx, checked.envelopeId, teamId);
  const id = opts.id ?? nanoid();
  const at = opts.now ?? new Date();
  await tx.insert(scenes).values({
    id,
    teamId,
    ...columnsOf(checked),
    version: 1,
    createdBy: userId,
    updatedBy: userId,
    createdAt: at,
    updatedAt: at,
  });
  await snapshot(tx, id, 1, checked, userId, at);
  await audit(tx, { teamId, userId, action: 'scene.create', subjectType: 'scene', subjectId: id, detail: { title: checked.title } });
  return id;
}

export async function createScene(db: DbOrTx, user: User, body: SceneCreateBody): Promise<SceneOut> {
  await authorize(db, user, body.teamId, 'scene.write', 'Team');
  let base: Partial<SceneDoc> = {};
  if (body.fromSceneId) {
    const { row } = await sceneFor(db, user, body.fromSceneId, 'scene.read');
    base = docOf(row);
    // A team envelope of another team cannot travel: take its current limits inline.
    if (row.teamId !== body.teamId && row.envelopeId) {
      base = { ...base, envelopeId: null, envelope: await resolveEnvelope(db, row, docOf(row)) };
    }
    if (body.title === undefined) base.title = `${base.title} (copy)`.slice(0, 200);
  }
  let site = body.site ?? base.site;
  if (body.siteId) {
    const s = await db.select().from(sites).where(eq(sites.id, body.siteId)).limit(1);
    if (!s[0] || s[0].teamId !== body.teamId) throw new HttpError(404, 'not_found', 'Site not found.', 'siteId');
    site = { name: s[0].name, lat: s[0].lat, lon: s[0].lon, height: s[0].height, timeZone: s[0].timeZone };
  }
  const doc: SceneDoc = {
    title: body.title ?? base.title ?? '',
    description: body.description ?? base.description ?? '',
    site: site!,
    time: body.time ?? base.time!,
    layers: body.layers ? withDefaultLayers(body.layers) : (base.layers ?? withDefaultLayers(undefined)),
    camera: body.camera ?? base.camera ?? defaultCamera(),
    envelopeId: body.envelopeId !== undefined ? body.envelopeId : (body.envelope ? null : (base.envelopeId ?? null)),
    envelope: body.envelope !== undefined ? body.envelope : (body.envelopeId ? null : (base.envelope ?? null)),
    targets: body.targets ?? base.targets ?? [],
    pins: body.pins ?? base.pins ?? [],
    steps: body.steps ?? base.steps ?? [],
  };
  const id = await writeTx(db, async (tx) => {
    const newId = await insertScene(tx, body.teamId, doc, user.id);
    if (body.fromSceneId) {
      await audit(tx, { teamId: body.teamId, userId: user.id, action: 'scene.duplicate', subjectType: 'scene', subjectId: newId, detail: { from: body.fromSceneId } });
    }
    return newId;
  });
  return toSceneOut(db, (await sceneRow(db, id))!);
}

class VersionConflict extends Error {}

async function conflict(db: DbOrTx, id: string): Promise<HttpError> {
  const row = await sceneRow(db, id);
  if (!row) return notFound('Scene');
  return new HttpError(
    409,
    'version_conflict',
    `The scene was changed by someone else (now version ${row.version}); reload it and apply your change again.`,
    'version',
    { scene: await toSceneOut(db, row) },
  );
}

/**
 * PATCH with optimistic concurrency: `UPDATE … WHERE id = ? AND version = ?` inside one transaction;
 * no row updated → 409 with the current scene. The caller has checked `scene.write`.
 */
export async function updateScene(
  db: DbOrTx,
  userId: string,
  id: string,
  body: ScenePatchBody,
  action = 'scene.update',
  extraDetail: Record<string, unknown> = {},
): Promise<SceneOut> {
  try {
    await writeTx(db, async (tx) => {
      const row = await sceneRow(tx, id);
      if (!row) throw notFound('Scene');
      if (row.version !== body.version) throw new VersionConflict();
      const next = sceneDocSchema.parse(applyPatch(docOf(row), body));
      if (next.envelopeId && next.envelopeId !== row.envelopeId) await checkEnvelopeInTeam(tx, next.envelopeId, row.teamId);
      const at = new Date(Math.max(Date.now(), row.updatedAt.getTime() + 1));
      const updated = await tx
        .update(scenes)
        .set({
          ...columnsOf(next),
          ...(body.thumbnail !== undefined ? { thumbnail: body.thumbnail } : {}),
          version: body.version + 1,
          updatedBy: userId,
          updatedAt: at,
        })
        .where(and(eq(scenes.id, id), eq(scenes.version, body.version)))
        .returning({ version: scenes.version });
      if (updated.length === 0) throw new VersionConflict();
      await snapshot(tx, id, body.version + 1, next, userId, at);
      const fields = Object.keys(body).filter((k) => k in next || k === 'thumbnail');
      await audit(tx, { teamId: row.teamId, userId, action, subjectType: 'scene', subjectId: id, detail: { version: body.version + 1, fields, ...extraDetail } });
    });
  } catch (e) {
    if (e instanceof VersionConflict) throw await conflict(db, id);
    throw e;
  }
  return toSceneOut(db, (await sceneRow(db, id))!);
}

export async function deleteScene(db: DbOrTx, userId: string, row: SceneRow): Promise<void> {
  await writeTx(db, async (tx) => {
    await tx.delete(scenes).where(eq(scenes.id, row.id));
    await audit(tx, { teamId: row.teamId, userId, action: 'scene.delete', subjectType: 'scene', subjectId: row.id, detail: { title: row.title } });
  });
}

export async function listVersions(db: DbOrTx, sceneId: string) {
  const rows = await db
    .select({ version: sceneVersions.version, authorId: sceneVersions.authorId, createdAt: sceneVersions.createdAt, snapshot: sceneVersions.snapshot })
    .from(sceneVersions)
    .where(eq(sceneVersions.sceneId, sceneId))
    .orderBy(desc(sceneVersions.version));
  return rows.map((r) => ({
    version: r.version,
    authorId: r.authorId,
    createdAt: r.createdAt.toISOString(),
    title: (r.snapshot as { title?: string } | null)?.title ?? '',
  }));
}

export async function versionSnapshot(db: DbOrTx, sceneId: string, version: number): Promise<SceneDoc | null> {
  const rows = await db
    .select({ snapshot: sceneVersions.snapshot })
    .from(sceneVersions)
    .where(and(eq(sceneVersions.sceneId, sceneId), eq(sceneVersions.version, version)))
    .limit(1);
  return rows[0] ? sceneDocSchema.parse(rows[0].snapshot) : null;
}

/** Restore = a new version whose content is that of version `n` (history is never rewritten). */
export async function restoreVersion(db: DbOrTx, userId: string, row: SceneRow, n: number, expectVersion?: number) {
  const snap = await versionSnapshot(db, row.id, n);
  if (!snap) throw notFound('Version');
  let envelopeId = snap.envelopeId;
  if (envelopeId) {
    const e = await db.select({ teamId: envelopes.teamId }).from(envelopes).where(eq(envelopes.id, envelopeId)).limit(1);
    if (!e[0] || e[0].teamId !== row.teamId) envelopeId = null;
  }
  return updateScene(
    db,
    userId,
    row.id,
    {
      version: expectVersion ?? row.version,
      title: snap.title,
      description: snap.description,
      site: snap.site,
      time: snap.time,
      layers: snap.layers,
      camera: snap.camera,
      envelopeId,
      envelope: envelopeId ? null : snap.envelope,
      targets: snap.targets,
      pins: snap.pins,
      steps: snap.steps,
    },
    'scene.restore',
    { restoredFrom: n },
  );
}
