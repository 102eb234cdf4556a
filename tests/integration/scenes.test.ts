/**
 * Scenes API (contract "Scenes"): list, create, duplicate, read, optimistic-concurrency PATCH,
 * history and restore, delete, thumbnail, activity. Each check value's source is the API contract
 * (/work/shared/api-contract.md) unless said otherwise.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';

let s: TestServer;
const as: Record<string, ApiClient> = {};
let teamId = '';
let otherTeamId = '';

// A 1×1 PNG (PNG signature per RFC 2083 / ISO 15948).
const PNG_1x1 =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

const site = { name: 'Test site', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' };
const newScene = (extra: Record<string, unknown> = {}) => ({ teamId, title: 'Test scene', site, time: '2026-03-20T19:30:00Z', ...extra });

beforeAll(async () => {
  s = await startServer();
  for (const who of ['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
  }
  as.anon = new ApiClient(s.url);
  const me = await as.editor.get('/api/me');
  teamId = me.data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  otherTeamId = (await as.outsider.get('/api/me')).data.teams[0].id;
});
afterAll(() => s?.stop());

async function create(extra: Record<string, unknown> = {}, who = 'editor') {
  const r = await as[who].post('/api/scenes', newScene(extra));
  expect(r.status, JSON.stringify(r.data)).toBe(201);
  return r.data.scene;
}

describe('GET /api/scenes', () => {
  test('401 without a session', async () => {
    expect((await as.anon.get('/api/scenes')).status).toBe(401);
  });

  test('lists the demo scenes of the caller’s teams with the contract’s fields', async () => {
    const r = await as.viewer.get('/api/scenes');
    expect(r.status).toBe(200);
    const titles = r.data.scenes.map((x: { title: string }) => x.title);
    expect(titles).toEqual(expect.arrayContaining(['Equinox evening briefing', '0.6 m pointing review', 'Moon and planets evening']));
    for (const x of r.data.scenes) {
      expect(x).toMatchObject({ id: expect.any(String), teamId, title: expect.any(String), updatedAt: expect.any(String), version: expect.any(Number) });
    }
  });

  test('another team sees none of them', async () => {
    const r = await as.outsider.get('/api/scenes');
    expect(r.status).toBe(200);
    expect(r.data.scenes.filter((x: { teamId: string }) => x.teamId === teamId)).toEqual([]);
  });

  test('?teamId filters; a bad query value is a 400 naming the field', async () => {
    const r = await as.editor.get(`/api/scenes?teamId=${teamId}`);
    expect(r.data.scenes.every((x: { teamId: string }) => x.teamId === teamId)).toBe(true);
    const bad = await as.editor.get(`/api/scenes?teamId=${'x'.repeat(100)}`);
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('teamId');
  });
});

describe('POST /api/scenes', () => {
  test('201 with id and version 1; defaults filled; GET returns the same scene', async () => {
    const r = await as.editor.post('/api/scenes', newScene({ description: 'x', steps: [{ id: 's1', time: '2026-03-20T20:00:00Z', caption: '**bold** <script>alert(1)</script>' }] }));
    expect(r.status).toBe(201);
    const sc = r.data.scene;
    expect(sc).toMatchObject({ teamId, title: 'Test scene', version: 1, site, time: '2026-03-20T19:30:00Z', envelope: null, envelopeId: null, targets: [], pins: [] });
    expect(sc.id).toEqual(expect.any(String));
    expect(sc.layers.horizon).toBe(true);
    expect(sc.camera).toEqual({ mode: 'observer', azDeg: 180, altDeg: 20, fovDeg: 90 });
    const g = await as.viewer.get(`/api/scenes/${sc.id}`);
    expect(g.status).toBe(200);
    expect(g.headers.get('content-type')).toMatch(/application\/json/);
    for (const k of ['id', 'teamId', 'title', 'site', 'time', 'layers', 'camera', 'envelope', 'targets', 'pins', 'steps', 'version']) expect(g.data.scene).toHaveProperty(k);
    expect(g.data.scene).toEqual(sc);
    // Markdown is stored and returned as text, never rendered to HTML.
    expect(g.data.scene.steps[0].caption).toBe('**bold** <script>alert(1)</script>');
    expect(g.data.role).toBe('viewer');
  });

  test.each([
    [{ title: undefined }, 'title'],
    [{ title: '   ' }, 'title'],
    [{ site: undefined }, 'site'],
    [{ site: { ...site, lat: 91 } }, 'site.lat'],
    [{ site: { ...site, lon: -181 } }, 'site.lon'],
    [{ site: { ...site, timeZone: 'Mars/Olympus_Mons' } }, 'site.timeZone'],
    [{ time: undefined }, 'time'],
    [{ time: '2026-03-20T19:30:00' }, 'time'], // no zone: ambiguous (domain facts, "Frames and formats")
    [{ time: '2026-02-30T19:30:00Z' }, 'time'],
    [{ camera: { mode: 'orbit' } }, 'camera.mode'],
    [{ layers: { horizon: 'yes' } }, 'layers.horizon'],
    [{ targets: [{ id: 'a', kind: 'custom', name: 'A', ra: 360, dec: 0 }] }, 'targets.0.ra'],
    [{ targets: [{ id: 'a', kind: 'star', name: 'A', hr: 7001 }, { id: 'a', kind: 'star', name: 'B', hr: 5340 }] }, 'targets.1.id'],
    [{ pins: [{ id: 'p', kind: 'label', frame: 'galactic', points: [[1, 2]] }] }, 'pins.0.frame'],
    [{ steps: [{ id: 's', time: 'tomorrow' }] }, 'steps.0.time'],
    [{ envelope: { name: 'e', minAltitude: 100 } }, 'envelope.minAltitude'],
    [{ envelope: { name: 'e' }, envelopeId: 'abc' }, 'envelope'],
    [{ colour: 'red' }, 'colour'],
    [{ teamId: undefined }, 'teamId'],
  ])('400 naming the field, nothing written: %j', async (patch, field) => {
    const before = (await as.editor.get('/api/scenes')).data.scenes.length;
    const r = await as.editor.post('/api/scenes', newScene(patch));
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect(r.data.error.code).toEqual(expect.any(String));
    expect(r.data.error.message).toEqual(expect.any(String));
    expect((await as.editor.get('/api/scenes')).data.scenes.length).toBe(before);
  });

  test('400 malformed JSON', async () => {
    const r = await as.editor.json('POST', '/api/scenes', '{"teamId":', { 'content-type': 'application/json' });
    expect(r.status).toBe(400);
    expect(r.data.error.code).toBe('malformed_json');
  });

  test('401 anonymous, 403 viewer and reviewer, 404 for a team the caller is not in', async () => {
    expect((await as.anon.post('/api/scenes', newScene())).status).toBe(401);
    expect((await as.viewer.post('/api/scenes', newScene())).status).toBe(403);
    expect((await as.reviewer.post('/api/scenes', newScene())).status).toBe(403);
    expect((await as.outsider.post('/api/scenes', newScene())).status).toBe(404);
    expect((await as.editor.post('/api/scenes', newScene({ teamId: otherTeamId }))).status).toBe(404);
  });

  test('owner may create too', async () => {
    expect((await as.owner.post('/api/scenes', newScene())).status).toBe(201);
  });

  test('siteId takes a team site; another team’s site is 404', async () => {
    const sites = (await as.editor.get(`/api/teams/${teamId}/sites`)).data.sites;
    const summit = sites.find((x: { name: string }) => x.name === 'Larkspur Ridge summit');
    const r = await as.editor.post('/api/scenes', { teamId, title: 'From site', siteId: summit.id, time: '2026-03-20T19:30:00Z' });
    expect(r.status).toBe(201);
    expect(r.data.scene.site).toEqual({ name: summit.name, lat: summit.lat, lon: summit.lon, height: summit.height, timeZone: summit.timeZone });
    const theirs = await as.outsider.post(`/api/teams/${otherTeamId}/sites`, { ...site, name: 'Theirs' });
    expect(theirs.status).toBe(201);
    const bad = await as.editor.post('/api/scenes', { teamId, title: 'x', siteId: theirs.data.site.id, time: '2026-03-20T19:30:00Z' });
    expect(bad.status).toBe(404);
    expect(bad.data.error.field).toBe('siteId');
  });

  test('envelopeId of another team is 404; of the team resolves to its JSON', async () => {
    const theirs = await as.outsider.post(`/api/teams/${otherTeamId}/envelopes`, { name: 'Theirs', minAltitude: 10 });
    expect(theirs.status).toBe(201);
    const bad = await as.editor.post('/api/scenes', newScene({ envelopeId: theirs.data.envelope.id }));
    expect(bad.status).toBe(404);
    expect(bad.data.error.field).toBe('envelopeId');
    const ours = (await as.editor.get(`/api/teams/${teamId}/envelopes`)).data.envelopes[0];
    const sc = await create({ envelopeId: ours.id });
    expect(sc.envelopeId).toBe(ours.id);
    expect(sc.envelope).toMatchObject({ name: '0.6 m alt-az limits', minAltitude: 20, maxAltitude: 87 });
  });

  test('fromSceneId duplicates a scene (version 1, "(copy)"); another team’s scene is 404', async () => {
    const list = (await as.editor.get('/api/scenes')).data.scenes;
    const review = list.find((x: { title: string }) => x.title === '0.6 m pointing review');
    const orig = (await as.editor.get(`/api/scenes/${review.id}`)).data.scene;
    const r = await as.editor.post('/api/scenes', { teamId, fromSceneId: review.id });
    expect(r.status).toBe(201);
    expect(r.data.scene).toMatchObject({ title: '0.6 m pointing review (copy)', version: 1, targets: orig.targets, envelopeId: orig.envelopeId, site: orig.site });
    expect(r.data.scene.id).not.toBe(review.id);
    const renamed = await as.editor.post('/api/scenes', { teamId, fromSceneId: review.id, title: 'June plan v2' });
    expect(renamed.data.scene.title).toBe('June plan v2');
    const theirs = await as.outsider.post('/api/scenes', { teamId: otherTeamId, title: 'Theirs', site, time: '2026-03-20T19:30:00Z' });
    const bad = await as.editor.post('/api/scenes', { teamId, fromSceneId: theirs.data.scene.id });
    expect(bad.status).toBe(404);
  });
});

describe('GET /api/scenes/:id', () => {
  test('401 anonymous; 404 unknown; 404 for another team (never revealing it exists)', async () => {
    const sc = await create();
    expect((await as.anon.get(`/api/scenes/${sc.id}`)).status).toBe(401);
    expect((await as.editor.get('/api/scenes/does-not-exist')).status).toBe(404);
    const r = await as.outsider.get(`/api/scenes/${sc.id}`);
    expect(r.status).toBe(404);
    expect(r.data.error.code).toBe('not_found');
  });
});

describe('PATCH /api/scenes/:id', () => {
  test('200 with version + 1 and the fields changed', async () => {
    const sc = await create();
    const r = await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'Renamed', camera: { mode: 'sphere', azDeg: 10, altDeg: 30, fovDeg: 60 } });
    expect(r.status).toBe(200);
    expect(r.data.scene).toMatchObject({ version: 2, title: 'Renamed', camera: { mode: 'sphere' }, site });
    expect(Date.parse(r.data.scene.updatedAt)).toBeGreaterThan(Date.parse(sc.updatedAt));
    // the fetched scene may be sent back whole: server-kept fields are ignored
    const back = await as.owner.patch(`/api/scenes/${sc.id}`, { ...r.data.scene, description: 'round trip' });
    expect(back.status).toBe(200);
    expect(back.data.scene.version).toBe(3);
    expect(back.data.scene.updatedBy).not.toBe(r.data.scene.updatedBy);
  });

  test('409 version_conflict with the current scene when the version is stale', async () => {
    const sc = await create();
    await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'First' });
    const r = await as.owner.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'Second' });
    expect(r.status).toBe(409);
    expect(r.data.error.code).toBe('version_conflict');
    expect(r.data.scene).toMatchObject({ id: sc.id, version: 2, title: 'First' });
    expect((await as.editor.get(`/api/scenes/${sc.id}`)).data.scene.title).toBe('First');
  });

  test('10 simultaneous PATCHes of one version: exactly one 200 and nine 409', async () => {
    const sc = await create();
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: `Writer ${i}` })),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409, 409, 409, 409, 409, 409, 409, 409, 409]);
    const winner = results.find((r) => r.status === 200)!;
    const now = (await as.editor.get(`/api/scenes/${sc.id}`)).data.scene;
    expect(now.version).toBe(2);
    expect(now.title).toBe(winner.data.scene.title);
    for (const r of results.filter((x) => x.status === 409)) expect(r.data.scene.version).toBe(2);
    const versions = (await as.editor.get(`/api/scenes/${sc.id}/versions`)).data.versions;
    expect(versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
  });

  test.each([
    [{ title: 'x' }, 'version'],
    [{ version: 'one', title: 'x' }, 'version'],
    [{ version: 1, time: '20 March' }, 'time'],
    [{ version: 1, site: { ...site, lat: -95 } }, 'site.lat'],
    [{ version: 1, steps: [{ id: 'a', time: '2026-03-20T19:30:00Z' }, { id: 'a', time: '2026-03-20T19:30:00Z' }] }, 'steps.1.id'],
    [{ version: 1, thumbnail: 'data:image/jpeg;base64,AAAA' }, 'thumbnail'],
    [{ version: 1, bogus: true }, 'bogus'],
  ])('400 naming the field and nothing written: %j', async (body, field) => {
    const sc = await create();
    const r = await as.editor.patch(`/api/scenes/${sc.id}`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.editor.get(`/api/scenes/${sc.id}`)).data.scene).toEqual(sc);
  });

  test('401 anonymous, 403 viewer and reviewer, 404 other team and unknown id', async () => {
    const sc = await create();
    expect((await as.anon.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'x' })).status).toBe(401);
    expect((await as.viewer.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'x' })).status).toBe(403);
    expect((await as.reviewer.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'x' })).status).toBe(403);
    expect((await as.outsider.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'x' })).status).toBe(404);
    expect((await as.editor.patch('/api/scenes/nope', { version: 1, title: 'x' })).status).toBe(404);
    expect((await as.editor.get(`/api/scenes/${sc.id}`)).data.scene.version).toBe(1);
  });

  test('choosing a team envelope drops an inline one and back', async () => {
    const env = (await as.editor.get(`/api/teams/${teamId}/envelopes`)).data.envelopes[0];
    const sc = await create({ envelope: { name: 'Inline', minAltitude: 15 } });
    expect(sc.envelope).toEqual({ name: 'Inline', minAltitude: 15 });
    const a = await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, envelopeId: env.id });
    expect(a.data.scene).toMatchObject({ envelopeId: env.id, envelope: { name: '0.6 m alt-az limits' } });
    const b = await as.editor.patch(`/api/scenes/${sc.id}`, { version: 2, envelope: { name: 'Inline 2', maxAltitude: 80 } });
    expect(b.data.scene).toMatchObject({ envelopeId: null, envelope: { name: 'Inline 2', maxAltitude: 80 } });
  });

  test('thumbnail: made from the sky until a PNG data URL is stored, then that is served as image/png', async () => {
    const sc = await create();
    expect(sc.hasThumbnail).toBe(false);
    // Before any upload, the server makes one from the scene's sky: a 160 × 160 PNG (IHDR width/height,
    // PNG spec §11.2.2), revalidated by ETag, a new one when the scene changes.
    const made = await as.editor.request('GET', `/api/scenes/${sc.id}/thumbnail.png`);
    expect(made.status).toBe(200);
    expect(made.headers.get('content-type')).toBe('image/png');
    const madeBytes = new Uint8Array(await made.arrayBuffer());
    const dv = new DataView(madeBytes.buffer);
    expect([...madeBytes.slice(12, 16)].map((c) => String.fromCharCode(c)).join('')).toBe('IHDR');
    expect([dv.getUint32(16), dv.getUint32(20)]).toEqual([160, 160]);
    const etag = made.headers.get('etag')!;
    expect((await as.editor.request('GET', `/api/scenes/${sc.id}/thumbnail.png`, undefined, { 'if-none-match': etag })).status).toBe(304);
    const moved = await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, time: '2026-03-21T04:00:00Z' });
    expect(moved.status).toBe(200);
    const again = await as.editor.request('GET', `/api/scenes/${sc.id}/thumbnail.png`, undefined, { 'if-none-match': etag });
    expect(again.status).toBe(200);
    expect(again.headers.get('etag')).not.toBe(etag);
    expect(Buffer.from(await again.arrayBuffer()).equals(Buffer.from(madeBytes))).toBe(false);
    const r = await as.editor.patch(`/api/scenes/${sc.id}`, { version: 2, thumbnail: PNG_1x1 });
    expect(r.status).toBe(200);
    expect(r.data.scene.hasThumbnail).toBe(true);
    const img = await as.viewer.request('GET', `/api/scenes/${sc.id}/thumbnail`);
    expect(img.status).toBe(200);
    expect(img.headers.get('content-type')).toBe('image/png');
    const bytes = new Uint8Array(await img.arrayBuffer());
    expect([...bytes.slice(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(new DataView(bytes.buffer).getUint32(16)).toBe(1); // the uploaded 1 × 1 snapshot wins over the made one
    expect((await as.outsider.get(`/api/scenes/${sc.id}/thumbnail`)).status).toBe(404);
  });
});

describe('history and restore', () => {
  test('each version is kept; restore makes a new version with the old content', async () => {
    const sc = await create({ title: 'v1 title' });
    await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'v2 title', time: '2026-03-21T01:00:00Z' });
    await as.editor.patch(`/api/scenes/${sc.id}`, { version: 2, title: 'v3 title' });
    const h = await as.viewer.get(`/api/scenes/${sc.id}/versions`);
    expect(h.status).toBe(200);
    expect(h.data.versions.map((v: { version: number; title: string }) => [v.version, v.title])).toEqual([
      [3, 'v3 title'],
      [2, 'v2 title'],
      [1, 'v1 title'],
    ]);
    expect(h.data.versions[0]).toMatchObject({ authorId: expect.any(String), createdAt: expect.any(String) });
    const r = await as.editor.post(`/api/scenes/${sc.id}/versions/1/restore`);
    expect(r.status).toBe(200);
    expect(r.data.scene).toMatchObject({ version: 4, title: 'v1 title', time: '2026-03-20T19:30:00Z' });
    expect((await as.viewer.get(`/api/scenes/${sc.id}/versions`)).data.versions).toHaveLength(4);
  });

  test('restore errors: 404 unknown version, 400 bad n, 409 stale version, 403 viewer, 404 other team, 401 anonymous', async () => {
    const sc = await create();
    await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'two' });
    expect((await as.editor.post(`/api/scenes/${sc.id}/versions/9/restore`)).status).toBe(404);
    const bad = await as.editor.post(`/api/scenes/${sc.id}/versions/abc/restore`);
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('n');
    const stale = await as.editor.post(`/api/scenes/${sc.id}/versions/1/restore`, { version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.data.error.code).toBe('version_conflict');
    expect(stale.data.scene.version).toBe(2);
    expect((await as.viewer.post(`/api/scenes/${sc.id}/versions/1/restore`)).status).toBe(403);
    expect((await as.outsider.post(`/api/scenes/${sc.id}/versions/1/restore`)).status).toBe(404);
    expect((await as.outsider.get(`/api/scenes/${sc.id}/versions`)).status).toBe(404);
    expect((await as.anon.post(`/api/scenes/${sc.id}/versions/1/restore`)).status).toBe(401);
  });
});

describe('DELETE /api/scenes/:id', () => {
  test('401, 403 viewer/reviewer, 404 other team, then 204 for an editor and gone', async () => {
    const sc = await create();
    expect((await as.anon.del(`/api/scenes/${sc.id}`)).status).toBe(401);
    expect((await as.viewer.del(`/api/scenes/${sc.id}`)).status).toBe(403);
    expect((await as.reviewer.del(`/api/scenes/${sc.id}`)).status).toBe(403);
    expect((await as.outsider.del(`/api/scenes/${sc.id}`)).status).toBe(404);
    const r = await as.editor.del(`/api/scenes/${sc.id}`);
    expect(r.status).toBe(204);
    expect((await as.editor.get(`/api/scenes/${sc.id}`)).status).toBe(404);
    expect((await as.editor.del(`/api/scenes/${sc.id}`)).status).toBe(404);
  });
});

describe('GET /api/teams/:teamId/activity', () => {
  test('lists scene changes from the audit log, newest first; 401/404 outside the team', async () => {
    const sc = await create({ title: 'Audited' });
    await as.editor.patch(`/api/scenes/${sc.id}`, { version: 1, title: 'Audited 2' });
    await as.editor.del(`/api/scenes/${sc.id}`);
    const r = await as.viewer.get(`/api/teams/${teamId}/activity?limit=20`);
    expect(r.status).toBe(200);
    const mine = r.data.activity.filter((a: { subjectId: string }) => a.subjectId === sc.id).map((a: { action: string }) => a.action);
    expect(mine).toEqual(['scene.delete', 'scene.update', 'scene.create']);
    const first = r.data.activity.find((a: { subjectId: string }) => a.subjectId === sc.id);
    expect(first.user.name).toEqual(expect.any(String));
    expect((await as.outsider.get(`/api/teams/${teamId}/activity`)).status).toBe(404);
    expect((await as.anon.get(`/api/teams/${teamId}/activity`)).status).toBe(401);
    const bad = await as.viewer.get(`/api/teams/${teamId}/activity?limit=0`);
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('limit');
  });
});
