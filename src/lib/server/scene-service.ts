/**
 * Scene storage: create, read, optimistic-concurrency update, delete, history and restore.
 * Services take `Db | Tx`; they never import the app's db handle, so scripts (seed) can use them too.
 */
import { and, desc, eq, inArray, sql, type Placeholder } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/libsql';
import { nanoid } from 'nanoid';
import { ByteCache, cacheBudgetBytes, stringBytes } from './caches';
import { checkPng } from './png-check';
import type { User } from 'lucia';
import { writeTx, type DbOrTx, type QueryBuilder, type Tx } from './db/client';
import { envelopes, memberships, scenes, sceneVersions, sites } from './db/schema';
import { audit } from './audit';
import { HttpError, notFound } from './http';
import { authorize, decide, type Action } from './policy';
import { preparedReadsOf } from './db/prepared';
import type { Role } from './db/schema';
import { applyPatch, defaultCamera, sceneDocSchema, withDefaultLayers, type SceneCreateBody, type SceneDoc, type SceneOut, type ScenePatchBody } from '../contracts/scene';
import { teamEnvelopeSchema, type EnvelopeJson, type TeamEnvelopeJson } from '../contracts/envelope';

type SceneRow = typeof scenes.$inferSelect;

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
const docCache = new ByteCache<string, SceneDoc>('scene documents', cacheBudgetBytes(), (doc) => estimateDocBytes(doc));

/**
 * Bytes a parsed document holds, estimated without serialising it: strings at two bytes a character,
 * a fixed cost per object (V8 headers, numbers, ids), the lists walked once.
 */
export function estimateDocBytes(doc: SceneDoc): number {
  let n = 4096 + stringBytes(doc.title) + stringBytes(doc.description);
  for (const t of doc.targets) n += 300 + stringBytes(t.name) + stringBytes(t.notes);
  for (const p of doc.pins) n += 300 + stringBytes(p.label) + p.points.length * 64;
  for (const st of doc.steps) n += 400 + stringBytes(st.title) + stringBytes(st.caption);
  const mask = (doc.envelope as { horizonMask?: unknown[] } | null)?.horizonMask;
  if (Array.isArray(mask)) n += mask.length * 64;
  return n;
}

const docKey = (row: Pick<SceneRow, 'id' | 'version' | 'envelopeId'>) => `${row.id}:${row.version}:${row.envelopeId ?? ''}`;

function remember(key: string, doc: SceneDoc) {
  docCache.set(key, doc);
}

/** The stored document of a row, validated on the way out (a bad row is a bug: it throws → 500). */
export function docOf(row: SceneRow): SceneDoc {
  const hit = docCache.get(docKey(row));
  if (hit) return structuredClone(hit);
  const doc = parseDoc(row);
  remember(docKey(row), doc);
  return structuredClone(doc);
}

/** The cached document of a scene state, if there is one: the cache's own object, never to be changed. */
function cachedDocReadOnly(state: Pick<SceneRow, 'id' | 'version' | 'envelopeId'>): Readonly<SceneDoc> | undefined {
  return docCache.peek(docKey(state));
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

type SceneMeta = Pick<SceneRow, 'id' | 'teamId' | 'envelopeId' | 'version' | 'createdBy' | 'updatedBy' | 'createdAt' | 'updatedAt'> & {
  hasThumbnail: boolean;
};
const hasThumbnailOf = (row: SceneRow) => row.thumbnail !== null && row.thumbnail !== undefined;

/** The API form of a scene whose team envelope (if any) is already resolved. */
function sceneOutOf(row: SceneMeta, doc: SceneDoc, envelope: EnvelopeJson | null): SceneOut {
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
    envelope,
    targets: doc.targets,
    pins: doc.pins,
    steps: doc.steps,
    version: row.version,
    createdBy: row.createdBy,
    updatedBy: row.updatedBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    hasThumbnail: row.hasThumbnail,
  };
}

export async function toSceneOut(db: DbOrTx, row: SceneRow): Promise<SceneOut> {
  const doc = docOf(row);
  return sceneOutOf({ ...row, hasThumbnail: hasThumbnailOf(row) }, doc, await resolveEnvelope(db, row, doc));
}

/** For link guests: the same scene without account ids. */
export function publicScene(s: SceneOut): Omit<SceneOut, 'createdBy' | 'updatedBy'> {
  const { createdBy: _c, updatedBy: _u, ...rest } = s;
  return rest;
}

/**
 * The columns that, together, determine a scene's public answer: every edit raises `version` (and
 * moves `updatedAt`); deleting a team envelope changes `envelopeId`; a thumbnail upload flips
 * `hasThumbnail`; a team envelope edited in place changes `envelopeData` (its stored JSON text, read
 * raw). Select them with `LEFT JOIN envelopes ON envelopes.id = scenes.envelope_id`.
 */
export const sceneStateColumns = {
  id: scenes.id,
  teamId: scenes.teamId,
  version: scenes.version,
  envelopeId: scenes.envelopeId,
  createdAt: scenes.createdAt,
  updatedAt: scenes.updatedAt,
  hasThumbnail: sql<number>`(${scenes.thumbnail} is not null)`,
  envelopeData: sql<string | null>`${envelopes.data}`,
};
export interface SceneState {
  id: string;
  teamId: string;
  version: number;
  envelopeId: string | null;
  createdAt: Date;
  updatedAt: Date;
  hasThumbnail: number;
  envelopeData: string | null;
}

const stateKey = (s: SceneState) =>
  `${s.teamId}:${s.version}:${s.envelopeId ?? ''}:${s.createdAt.getTime()}:${s.updatedAt.getTime()}:${s.hasThumbnail ? 1 : 0}`;

/**
 * Serialised public answers (`JSON.stringify(publicScene(toSceneOut(row)))`) by scene id, each with
 * the state it was built from. An entry is used only when the state just read from the database is
 * the same, so the cache is a pure function of the database: an edit made through another instance
 * on the same file shows at once. It holds nothing about links (validity is checked on every request).
 */
const publicJsonCache = new ByteCache<string, { key: string; envelopeData: string | null; json: string }>(
  'shared-scene answers',
  cacheBudgetBytes(),
  (e) => 256 + stringBytes(e.key) + stringBytes(e.envelopeData) + stringBytes(e.json),
);

/** The public answer for a scene in `state` (as read by `resolveLink`), from the cache when it is current. */
export async function publicSceneJson(db: DbOrTx, state: SceneState): Promise<string> {
  const hit = publicJsonCache.get(state.id);
  if (hit && hit.key === stateKey(state) && hit.envelopeData === state.envelopeData) return hit.json;
  // Row and envelope in one statement (one snapshot), so the entry matches the state it is stored with.
  const rows = await db
    .select({ row: scenes, state: sceneStateColumns })
    .from(scenes)
    .leftJoin(envelopes, eq(envelopes.id, scenes.envelopeId))
    .where(eq(scenes.id, state.id))
    .limit(1);
  if (!rows[0]) throw notFound('Link');
  const { row, state: now } = rows[0];
  const doc = docOf(row);
  const envelope = row.envelopeId ? (now.envelopeData === null ? null : envelopeOf(JSON.parse(now.envelopeData))) : doc.envelope;
  const json = JSON.stringify(publicScene(sceneOutOf({ ...row, hasThumbnail: hasThumbnailOf(row) }, doc, envelope)));
  publicJsonCache.set(row.id, { key: stateKey(now), envelopeData: now.envelopeData, json });
  return json;
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

/**
 * sceneFor without the document: the id and team of a scene the caller may `action`, and the caller's
 * role, read in one statement (prepared once when the handle has prepared reads). Same 404 / 403.
 */
export async function sceneAccess(db: DbOrTx, user: User, id: string, action: Action) {
  const reads = preparedReadsOf(db);
  const rows = reads
    ? await reads.all(SCENE_ACCESS_SQL, [user.id, id])
    : ((await db.values(sceneAccessQuery(db, user.id, id))) as unknown[][]);
  if (!rows[0]) throw notFound('Scene');
  const [sceneId, teamId, member] = rows[0] as [string, string, Role | null];
  const role = decide(member ?? null, action, 'Scene');
  return { id: sceneId, teamId, role };
}

const sceneAccessQuery = (db: QueryBuilder, userId: string | Placeholder, id: string | Placeholder) =>
  db
    .select({ id: scenes.id, teamId: scenes.teamId, role: memberships.role })
    .from(scenes)
    .leftJoin(memberships, and(eq(memberships.teamId, scenes.teamId), eq(memberships.userId, userId)))
    .where(eq(scenes.id, id));
const SCENE_ACCESS_SQL = sceneAccessQuery(drizzle.mock({ casing: 'snake_case' }), sql.placeholder('user'), sql.placeholder('id')).toSQL().sql;

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

async function snapshot(tx: Tx, sceneId: string, version: number, doc: SceneDoc, authorId: string | null, at: Date) {
  await tx.insert(sceneVersions).values({ sceneId, version, snapshot: doc, authorId, createdAt: at });
}

export interface CreateOptions {
  /** Fixed id (seed); random otherwise. */
  id?: string;
  now?: Date;
}

/** Caller must have checked `scene.write` on body.teamId (createScene does it when given a user). */
export async function insertScene(tx: Tx, teamId: string, doc: SceneDoc, userId: string | null, opts: CreateOptions = {}) {
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

/** A scene's columns other than the document and the thumbnail bytes. */
const sceneHeadColumns = {
  id: scenes.id,
  teamId: scenes.teamId,
  version: scenes.version,
  envelopeId: scenes.envelopeId,
  createdBy: scenes.createdBy,
  createdAt: scenes.createdAt,
  updatedAt: scenes.updatedAt,
  hasThumbnail: sql<number>`(${scenes.thumbnail} is not null)`,
};

/** Document fields a PATCH body may set, and the columns they live in. */
const DOC_KEYS = ['title', 'description', 'site', 'time', 'layers', 'camera', 'targets', 'pins', 'steps'] as const;

/** The document fields (= columns) a PATCH body changes; choosing an envelope touches both envelope columns. */
function patchedKeys(body: ScenePatchBody): Array<keyof SceneDoc> {
  const keys: Array<keyof SceneDoc> = DOC_KEYS.filter((k) => body[k] !== undefined);
  if (body.envelopeId !== undefined || body.envelope !== undefined) keys.push('envelopeId', 'envelope');
  return keys;
}

/**
 * PATCH with optimistic concurrency: `UPDATE … WHERE id = ? AND version = ?` inside one transaction;
 * no row updated → 409 with the current scene. The caller has checked `scene.write`.
 * The current document comes from the document cache when it holds this version (only the scene's
 * head is read then); the answer is built from the document just written, not read back.
 */
export async function updateScene(
  db: DbOrTx,
  userId: string,
  id: string,
  body: ScenePatchBody,
  action = 'scene.update',
  extraDetail: Record<string, unknown> = {},
): Promise<SceneOut> {
  if (body.thumbnail) {
    // Bounded in declared and decoded size (≤ 512 KiB in, inflated with a cap: milliseconds).
    const check = checkPng(body.thumbnail);
    if (!check.ok) throw new HttpError(400, 'invalid', `thumbnail: ${check.message}`, 'thumbnail');
  }
  let result: { meta: SceneMeta; doc: SceneDoc; envelope: EnvelopeJson | null };
  try {
    result = await writeTx(db, async (tx) => {
      const head = (await tx.select(sceneHeadColumns).from(scenes).where(eq(scenes.id, id)).limit(1))[0];
      if (!head) throw notFound('Scene');
      if (head.version !== body.version) throw new VersionConflict();
      const current = cachedDocReadOnly(head) ?? docOf((await sceneRow(tx, id))!);
      // applyPatch copies (it never changes `current`, which may be the cache's own object). Only the
      // fields the body sets are checked again: `current` is valid (checked on its way out of the
      // database, or in), and sceneDocSchema has no rule across fields, so the document is valid as a
      // whole without a zod pass over every target of a large scene for a change of title.
      const next = applyPatch(current as SceneDoc, body);
      // The row is updated where the body touches it; the snapshot below holds the whole document.
      const changed: Partial<SceneDoc> = {};
      for (const k of patchedKeys(body)) {
        const v = sceneDocSchema.shape[k].parse(next[k]);
        (next as Record<string, unknown>)[k] = (changed as Record<string, unknown>)[k] = v;
      }
      if (next.envelopeId && next.envelopeId !== head.envelopeId) await checkEnvelopeInTeam(tx, next.envelopeId, head.teamId);
      const at = new Date(Math.max(Date.now(), head.updatedAt.getTime() + 1));
      const updated = await tx
        .update(scenes)
        .set({
          ...changed,
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
      await audit(tx, { teamId: head.teamId, userId, action, subjectType: 'scene', subjectId: id, detail: { version: body.version + 1, fields, ...extraDetail } });
      let envelope = next.envelope;
      if (next.envelopeId) {
        const e = await tx.select({ data: envelopes.data }).from(envelopes).where(eq(envelopes.id, next.envelopeId)).limit(1);
        envelope = e[0] ? envelopeOf(e[0].data) : null;
      }
      const hasThumbnail = body.thumbnail !== undefined ? body.thumbnail !== null : head.hasThumbnail !== 0;
      const meta = { ...head, version: body.version + 1, envelopeId: next.envelopeId, updatedBy: userId, updatedAt: at, hasThumbnail };
      return { meta, doc: next, envelope };
    });
  } catch (e) {
    if (e instanceof VersionConflict) throw await conflict(db, id);
    throw e;
  }
  // Committed: the next save (or read) of this version finds its document without a zod pass. The
  // cached document shares unchanged parts with the previous version's (neither is ever changed);
  // the caller gets a copy of its own.
  remember(docKey(result.meta), result.doc);
  return sceneOutOf(result.meta, structuredClone(result.doc), result.envelope);
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
