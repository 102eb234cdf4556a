/**
 * Who may do what to a scene, cell by cell. Expected statuses from the API contract's roles and
 * error rules: viewer reads; reviewer reads and comments; editor writes and shares; owner as editor
 * (and manages members); another team's resources → 404; no session → 401; links act through the
 * shared routes with their own role; revoked and expired links are 404 everywhere.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { openDb } from '../../src/lib/server/db/client';
import { shareLinks } from '../../src/lib/server/db/schema';
import { eq } from 'drizzle-orm';

type Action = 'read' | 'edit' | 'comment' | 'share' | 'delete';
type Principal =
  | 'anonymous'
  | 'viewer'
  | 'reviewer'
  | 'editor'
  | 'owner'
  | 'other team owner'
  | 'viewer link'
  | 'reviewer link'
  | 'revoked link'
  | 'expired link';

const ACTIONS: Action[] = ['read', 'edit', 'comment', 'share', 'delete'];

/** Expected status of every cell. */
const MATRIX: Record<Principal, Record<Action, number>> = {
  anonymous: { read: 401, edit: 401, comment: 401, share: 401, delete: 401 },
  viewer: { read: 200, edit: 403, comment: 403, share: 403, delete: 403 },
  reviewer: { read: 200, edit: 403, comment: 201, share: 403, delete: 403 },
  editor: { read: 200, edit: 200, comment: 201, share: 201, delete: 204 },
  owner: { read: 200, edit: 200, comment: 201, share: 201, delete: 204 },
  'other team owner': { read: 404, edit: 404, comment: 404, share: 404, delete: 404 },
  'viewer link': { read: 200, edit: 403, comment: 403, share: 403, delete: 403 },
  'reviewer link': { read: 200, edit: 403, comment: 201, share: 403, delete: 403 },
  'revoked link': { read: 404, edit: 404, comment: 404, share: 404, delete: 404 },
  'expired link': { read: 404, edit: 404, comment: 404, share: 404, delete: 404 },
};

let s: TestServer;
const as: Record<string, ApiClient> = {};
let teamId = '';
const site = { name: 'Matrix site', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' };

beforeAll(async () => {
  s = await startServer();
  for (const who of ['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
  }
  as.anon = new ApiClient(s.url);
  teamId = (await as.editor.get('/api/me')).data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
});
afterAll(() => s?.stop());

interface World {
  sceneId: string;
  tokens: Record<'viewer' | 'reviewer' | 'revoked' | 'expired', string>;
}

/** A fresh scene with one link of each kind; the expired one is backdated in the database. */
async function world(): Promise<World> {
  const sc = (await as.editor.post('/api/scenes', { teamId, title: 'Matrix scene', site, time: '2026-03-20T19:30:00Z' })).data.scene;
  const mk = async (role: 'viewer' | 'reviewer') => (await as.editor.post(`/api/scenes/${sc.id}/links`, { role })).data;
  const viewer = await mk('viewer');
  const reviewer = await mk('reviewer');
  const revoked = await mk('reviewer');
  const expired = await mk('reviewer');
  expect((await as.editor.del(`/api/scenes/${sc.id}/links/${revoked.id}`)).status).toBe(204);
  const db = await openDb(s.dbUrl);
  await db.write((tx) => tx.update(shareLinks).set({ expiresAt: new Date(Date.now() - 60_000) }).where(eq(shareLinks.id, expired.id)));
  db.close();
  return { sceneId: sc.id, tokens: { viewer: viewer.token, reviewer: reviewer.token, revoked: revoked.token, expired: expired.token } };
}

async function perform(p: Principal, action: Action, w: World): Promise<number> {
  const member: Record<string, string> = { anonymous: 'anon', viewer: 'viewer', reviewer: 'reviewer', editor: 'editor', owner: 'owner', 'other team owner': 'outsider' };
  if (p in member) {
    const c = as[member[p]];
    const id = w.sceneId;
    switch (action) {
      case 'read':
        return (await c.get(`/api/scenes/${id}`)).status;
      case 'edit': {
        const v = (await as.editor.get(`/api/scenes/${id}`)).data.scene.version;
        return (await c.patch(`/api/scenes/${id}`, { version: v, title: `Edited by ${p}` })).status;
      }
      case 'comment':
        return (await c.post(`/api/scenes/${id}/comments`, { body: `Comment by ${p}`, anchor: { azimuth: 180, altitude: 45 } })).status;
      case 'share':
        return (await c.post(`/api/scenes/${id}/links`, { role: 'viewer' })).status;
      case 'delete':
        return (await c.del(`/api/scenes/${id}`)).status;
    }
  }
  const kind = p.split(' ')[0] as keyof World['tokens'];
  const t = w.tokens[kind];
  const c = as.anon;
  switch (action) {
    case 'read':
      return (await c.get(`/api/shared/${t}`)).status;
    case 'edit':
      return (await c.patch(`/api/shared/${t}`, { title: 'Edited through a link' })).status;
    case 'comment':
      return (await c.post(`/api/shared/${t}/comments`, { body: 'Guest comment', authorName: 'Guest', anchor: { ra: 83.6, dec: -5.4 } })).status;
    case 'share':
      return (await c.post(`/api/shared/${t}/links`, { role: 'viewer' })).status;
    case 'delete':
      return (await c.del(`/api/shared/${t}`)).status;
  }
}

describe.each(Object.keys(MATRIX) as Principal[])('%s', (p) => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });
  // In this order, so that "delete" runs last on the row's own scene.
  test.each(ACTIONS)(`%s`, async (action) => {
    const status = await perform(p, action, w);
    expect(status, `${p} × ${action}`).toBe(MATRIX[p][action]);
  });
  test('side effects match the statuses', async () => {
    const g = await as.editor.get(`/api/scenes/${w.sceneId}`);
    if (MATRIX[p].delete === 204) {
      expect(g.status).toBe(404);
      return;
    }
    expect(g.status).toBe(200);
    expect(g.data.scene.title).toBe(MATRIX[p].edit === 200 ? `Edited by ${p}` : 'Matrix scene');
    const comments = (await as.editor.get(`/api/scenes/${w.sceneId}/comments`)).data.comments;
    expect(comments.length).toBe(MATRIX[p].comment === 201 ? 1 : 0);
    const links = (await as.editor.get(`/api/scenes/${w.sceneId}/links`)).data.links;
    expect(links.length).toBe(MATRIX[p].share === 201 ? 5 : 4);
  });
});
