/**
 * Share links, the shared (no-account) routes, review comments and their e-mail notifications.
 * Expected statuses and fields: the API contract (/work/shared/api-contract.md).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { startMailFake, type MailFake } from './helpers/mail';

let s: TestServer;
let mail: MailFake;
const as: Record<string, ApiClient> = {};
let teamId = '';
let otherTeamId = '';

const site = { name: 'Test site', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' };
const steps = [
  { id: 'one', time: '2026-03-21T01:10:00Z', caption: 'first' },
  { id: 'two', time: '2026-03-21T01:40:00Z', caption: 'second' },
];
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  mail = await startMailFake();
  s = await startServer({ env: { SMTP_URL: mail.smtpUrl } });
  for (const who of ['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
  }
  as.anon = new ApiClient(s.url);
  teamId = (await as.editor.get('/api/me')).data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  otherTeamId = (await as.outsider.get('/api/me')).data.teams[0].id;
});
afterAll(async () => {
  await s?.stop();
  await mail?.stop();
});

async function scene(extra: Record<string, unknown> = {}) {
  const r = await as.editor.post('/api/scenes', { teamId, title: 'Shared scene', site, time: '2026-03-20T19:30:00Z', steps, ...extra });
  expect(r.status).toBe(201);
  return r.data.scene as { id: string; version: number };
}
async function link(sceneId: string, role: 'viewer' | 'reviewer', extra: Record<string, unknown> = {}) {
  const r = await as.editor.post(`/api/scenes/${sceneId}/links`, { role, ...extra });
  expect(r.status, JSON.stringify(r.data)).toBe(201);
  return r.data as { id: string; token: string; url: string };
}

describe('POST /api/scenes/:id/links', () => {
  test('201 {id, token, url}; the token is 24 URL-safe characters (144 bits ≥ 120) and the url is PUBLIC_ORIGIN/s/<token>', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer');
    const b = await link(sc.id, 'reviewer');
    // nanoid's alphabet has 64 symbols: 24 × log2(64) = 144 bits (nanoid README).
    expect(a.token).toMatch(/^[A-Za-z0-9_-]{24}$/);
    expect(a.token).not.toBe(b.token);
    expect(a.url).toBe(`${s.url}/s/${a.token}`);
    expect(a.id).toEqual(expect.any(String));
  });

  test.each([
    [{}, 'role'],
    [{ role: 'editor' }, 'role'],
    [{ role: 'viewer', expiresAt: '2020-01-01T00:00:00Z' }, 'expiresAt'],
    [{ role: 'viewer', expiresAt: '2030-01-01T00:00:00' }, 'expiresAt'],
    [{ role: 'viewer', forever: true }, 'forever'],
  ])('400 naming the field: %j', async (body, field) => {
    const sc = await scene();
    const r = await as.editor.post(`/api/scenes/${sc.id}/links`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.editor.get(`/api/scenes/${sc.id}/links`)).data.links).toEqual([]);
  });

  test('401 anonymous, 403 viewer and reviewer, 404 other team; owner may share', async () => {
    const sc = await scene();
    expect((await as.anon.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).status).toBe(401);
    expect((await as.viewer.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).status).toBe(403);
    expect((await as.reviewer.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).status).toBe(403);
    expect((await as.outsider.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).status).toBe(404);
    expect((await as.owner.post(`/api/scenes/${sc.id}/links`, { role: 'reviewer' })).status).toBe(201);
  });
});

describe('GET /api/scenes/:id/links', () => {
  test('lists links with createdAt, lastUsedAt, expiresAt, revoked, never the token', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer', { expiresAt: '2099-01-01T00:00:00Z' });
    const r = await as.editor.get(`/api/scenes/${sc.id}/links`);
    expect(r.status).toBe(200);
    expect(r.data.links).toHaveLength(1);
    expect(r.data.links[0]).toMatchObject({ id: a.id, role: 'viewer', createdAt: expect.any(String), lastUsedAt: null, expiresAt: '2099-01-01T00:00:00.000Z', revoked: false });
    expect(JSON.stringify(r.data)).not.toContain(a.token);
    // lastUsedAt is recorded by a use of the link
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(200);
    const after = (await as.editor.get(`/api/scenes/${sc.id}/links`)).data.links[0];
    expect(after.lastUsedAt).toEqual(expect.any(String));
    expect(Date.now() - Date.parse(after.lastUsedAt)).toBeLessThan(60_000);
  });

  test('401, 403 below editor, 404 other team', async () => {
    const sc = await scene();
    expect((await as.anon.get(`/api/scenes/${sc.id}/links`)).status).toBe(401);
    expect((await as.reviewer.get(`/api/scenes/${sc.id}/links`)).status).toBe(403);
    expect((await as.outsider.get(`/api/scenes/${sc.id}/links`)).status).toBe(404);
  });

  test('the demo has share links of both roles', async () => {
    const list = (await as.editor.get('/api/scenes')).data.scenes;
    const roles = new Set<string>();
    for (const x of list) for (const l of (await as.editor.get(`/api/scenes/${x.id}/links`)).data.links) roles.add(l.role);
    expect([...roles].sort()).toEqual(['reviewer', 'viewer']);
  });
});

describe('GET /api/shared/:token', () => {
  test('no account needed: {scene, role}, read-only, without account ids', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer');
    const r = await as.anon.get(`/api/shared/${a.token}`);
    expect(r.status).toBe(200);
    expect(r.data.role).toBe('viewer');
    expect(r.data.scene).toMatchObject({ id: sc.id, title: 'Shared scene', site, version: 1 });
    expect(r.data.scene).not.toHaveProperty('createdBy');
    const b = await link(sc.id, 'reviewer');
    expect((await as.anon.get(`/api/shared/${b.token}`)).data.role).toBe('reviewer');
  });

  test('404 for an unknown token', async () => {
    expect((await as.anon.get('/api/shared/AAAAAAAAAAAAAAAAAAAAAAAA')).status).toBe(404);
    expect((await as.anon.get('/api/shared/x')).status).toBe(404);
  });

  test('DELETE /api/scenes/:id/links/:linkId → 204 and the token is dead at once', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'reviewer');
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(200);
    expect((await as.viewer.del(`/api/scenes/${sc.id}/links/${a.id}`)).status).toBe(403);
    expect((await as.outsider.del(`/api/scenes/${sc.id}/links/${a.id}`)).status).toBe(404);
    expect((await as.anon.del(`/api/scenes/${sc.id}/links/${a.id}`)).status).toBe(401);
    expect((await as.editor.del(`/api/scenes/${sc.id}/links/${a.id}`)).status).toBe(204);
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(404);
    expect((await as.anon.post(`/api/shared/${a.token}/comments`, { body: 'x', authorName: 'G' })).status).toBe(404);
    expect((await as.anon.get(`/api/shared/${a.token}/comments`)).status).toBe(404);
    const listed = (await as.editor.get(`/api/scenes/${sc.id}/links`)).data.links[0];
    expect(listed).toMatchObject({ id: a.id, revoked: true, revokedAt: expect.any(String) });
    // idempotent; another scene's link id is not found
    expect((await as.editor.del(`/api/scenes/${sc.id}/links/${a.id}`)).status).toBe(204);
    const other = await scene();
    expect((await as.editor.del(`/api/scenes/${other.id}/links/${a.id}`)).status).toBe(404);
  });

  test('an expired link is 404', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer', { expiresAt: new Date(Date.now() + 1500).toISOString() });
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(200);
    await sleep(2000);
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(404);
    expect((await as.editor.get(`/api/scenes/${sc.id}/links`)).data.links[0]).toMatchObject({ expired: true, active: false });
  });

  test('a deleted scene takes its links with it', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer');
    expect((await as.editor.del(`/api/scenes/${sc.id}`)).status).toBe(204);
    expect((await as.anon.get(`/api/shared/${a.token}`)).status).toBe(404);
  });

  // The answer is served from a cache keyed by the scene's state (scene-service.ts publicSceneJson):
  // every change must show at once, also when it is made through another instance on the same file.
  test('the answer follows every change at once: edit, thumbnail, team envelope edited and deleted, revocation', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, { name: 'Cache limits', minAltitude: 15 })).data.envelope;
    const sc = await scene({ envelopeId: env.id });
    const l = await link(sc.id, 'viewer');
    const shared = async () => {
      const r = await as.anon.get(`/api/shared/${l.token}`);
      expect(r.status).toBe(200);
      return r.data.scene;
    };
    // the body is what the member's GET answers, without account ids
    const member = (await as.editor.get(`/api/scenes/${sc.id}`)).data.scene;
    const { createdBy: _c, updatedBy: _u, ...expected } = member;
    expect(await shared()).toEqual(expected);
    expect((await shared()).envelope.minAltitude).toBe(15);

    const b = await startServer({ dbUrl: s.dbUrl });
    try {
      const editorB = new ApiClient(b.url);
      await editorB.signIn(DEMO.editor);
      // an edit made through instance B
      expect((await editorB.patch(`/api/scenes/${sc.id}`, { version: sc.version, title: 'Edited on B' })).status).toBe(200);
      expect(await shared()).toMatchObject({ title: 'Edited on B', version: sc.version + 1 });
      // the team envelope edited in place (no scene version)
      expect((await editorB.patch(`/api/envelopes/${env.id}`, { minAltitude: 22 })).status).toBe(200);
      expect(await shared()).toMatchObject({ version: sc.version + 1, envelopeId: env.id, envelope: { minAltitude: 22 } });
      // a thumbnail uploaded (no scene version)
      const thumb = await fetch(`${b.url}/api/scenes/${sc.id}/thumbnail`, {
        method: 'PUT',
        headers: { cookie: [...editorB.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'content-type': 'image/png' },
        body: Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64'),
      });
      expect(thumb.status).toBe(204);
      expect((await shared()).hasThumbnail).toBe(true);
      // the team envelope deleted: its limits stay inline (no scene version)
      expect((await editorB.del(`/api/envelopes/${env.id}`)).status).toBe(204);
      expect(await shared()).toMatchObject({ version: sc.version + 1, envelopeId: null, envelope: { minAltitude: 22 } });
      // revoked on B: dead at once on A
      expect((await editorB.del(`/api/scenes/${sc.id}/links/${l.id}`)).status).toBe(204);
      expect((await as.anon.get(`/api/shared/${l.token}`)).status).toBe(404);
    } finally {
      await b.stop();
    }
  });

  test('a link never edits: PATCH/DELETE on the token are 403', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'reviewer');
    expect((await as.anon.patch(`/api/shared/${a.token}`, { title: 'x' })).status).toBe(403);
    expect((await as.anon.del(`/api/shared/${a.token}`)).status).toBe(403);
    expect((await as.anon.post(`/api/shared/${a.token}/links`, { role: 'viewer' })).status).toBe(403);
    expect((await as.editor.get(`/api/scenes/${sc.id}`)).data.scene.title).toBe('Shared scene');
  });
});

describe('comments by members', () => {
  test('reviewer+ posts {body, anchor?, stepId?}; both anchor forms; Markdown kept as text', async () => {
    const sc = await scene();
    const a = await as.reviewer.post(`/api/scenes/${sc.id}/comments`, { body: 'Check **this** <b>now</b>', anchor: { ra: 279.2347, dec: 38.7837 } });
    expect(a.status).toBe(201);
    expect(a.data.comment).toMatchObject({ body: 'Check **this** <b>now</b>', anchor: { ra: 279.2347, dec: 38.7837 }, resolved: false, author: { guest: false } });
    const b = await as.editor.post(`/api/scenes/${sc.id}/comments`, { body: 'Horizon here', anchor: { azimuth: 260, altitude: 26 }, stepId: 'two' });
    expect(b.status).toBe(201);
    expect(b.data.comment).toMatchObject({ anchor: { azimuth: 260, altitude: 26 }, stepId: 'two' });
    const reply = await as.owner.post(`/api/scenes/${sc.id}/comments`, { body: 'Agreed', parentId: a.data.comment.id });
    expect(reply.status).toBe(201);
    expect(reply.data.comment.parentId).toBe(a.data.comment.id);
    const list = await as.viewer.get(`/api/scenes/${sc.id}/comments`);
    expect(list.status).toBe(200);
    expect(list.data.comments.map((c: { id: string }) => c.id)).toEqual([a.data.comment.id, b.data.comment.id, reply.data.comment.id]);
    expect(list.data.comments[0].author.name).toEqual(expect.any(String));
  });

  test.each([
    [{}, 'body'],
    [{ body: '   ' }, 'body'],
    [{ body: 'x', anchor: { ra: 400, dec: 0 } }, 'anchor.ra'],
    [{ body: 'x', anchor: { azimuth: 10 } }, 'anchor'],
    [{ body: 'x', stepId: 'nope' }, 'stepId'],
    [{ body: 'x', parentId: 'nope' }, 'parentId'],
    [{ body: 'x', html: '<p>' }, 'html'],
  ])('400 naming the field, nothing written: %j', async (body, field) => {
    const sc = await scene();
    const r = await as.reviewer.post(`/api/scenes/${sc.id}/comments`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.reviewer.get(`/api/scenes/${sc.id}/comments`)).data.comments).toEqual([]);
  });

  test('a reply must be to a comment of the same scene', async () => {
    const a = await scene();
    const b = await scene();
    const c = await as.reviewer.post(`/api/scenes/${a.id}/comments`, { body: 'on a' });
    const r = await as.reviewer.post(`/api/scenes/${b.id}/comments`, { body: 'reply', parentId: c.data.comment.id });
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('parentId');
  });

  test('401 anonymous, 403 viewer, 404 other team', async () => {
    const sc = await scene();
    expect((await as.anon.post(`/api/scenes/${sc.id}/comments`, { body: 'x' })).status).toBe(401);
    expect((await as.anon.get(`/api/scenes/${sc.id}/comments`)).status).toBe(401);
    expect((await as.viewer.post(`/api/scenes/${sc.id}/comments`, { body: 'x' })).status).toBe(403);
    expect((await as.outsider.post(`/api/scenes/${sc.id}/comments`, { body: 'x' })).status).toBe(404);
    expect((await as.outsider.get(`/api/scenes/${sc.id}/comments`)).status).toBe(404);
  });

  test('PATCH /api/comments/:id {resolved}: reviewer+; 400, 401, 403, 404', async () => {
    const sc = await scene();
    const c = (await as.reviewer.post(`/api/scenes/${sc.id}/comments`, { body: 'open' })).data.comment;
    const r = await as.reviewer.patch(`/api/comments/${c.id}`, { resolved: true });
    expect(r.status).toBe(200);
    expect(r.data.comment).toMatchObject({ id: c.id, resolved: true, resolvedAt: expect.any(String), resolvedBy: expect.any(String) });
    const reopened = await as.editor.patch(`/api/comments/${c.id}`, { resolved: false });
    expect(reopened.data.comment).toMatchObject({ resolved: false, resolvedAt: null });
    const bad = await as.reviewer.patch(`/api/comments/${c.id}`, { resolved: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('resolved');
    expect((await as.anon.patch(`/api/comments/${c.id}`, { resolved: true })).status).toBe(401);
    expect((await as.viewer.patch(`/api/comments/${c.id}`, { resolved: true })).status).toBe(403);
    expect((await as.outsider.patch(`/api/comments/${c.id}`, { resolved: true })).status).toBe(404);
    expect((await as.reviewer.patch('/api/comments/nope', { resolved: true })).status).toBe(404);
  });

  test('the demo review scene has open and resolved comments anchored to the sky', async () => {
    const list = (await as.reviewer.get('/api/scenes')).data.scenes;
    const review = list.find((x: { title: string }) => x.title === '0.6 m pointing review');
    const cs = (await as.reviewer.get(`/api/scenes/${review.id}/comments`)).data.comments;
    expect(cs.some((c: { resolved: boolean; anchor: unknown }) => !c.resolved && c.anchor)).toBe(true);
    expect(cs.some((c: { resolved: boolean; anchor: unknown }) => c.resolved && c.anchor)).toBe(true);
  });
});

describe('comments through links', () => {
  test('a reviewer link posts {body, authorName, anchor?} and reads the thread; a viewer link gets 403', async () => {
    const sc = await scene();
    const rv = await link(sc.id, 'reviewer');
    const vw = await link(sc.id, 'viewer');
    const r = await as.anon.post(`/api/shared/${rv.token}/comments`, { body: 'Guest note', authorName: 'Ada Guest', anchor: { ra: 10, dec: 20 }, stepId: 'one' });
    expect(r.status).toBe(201);
    expect(r.data.comment).toMatchObject({ body: 'Guest note', author: { name: 'Ada Guest', guest: true, userId: null }, anchor: { ra: 10, dec: 20 }, stepId: 'one' });
    const list = await as.anon.get(`/api/shared/${rv.token}/comments`);
    expect(list.status).toBe(200);
    expect(list.data.comments).toHaveLength(1);
    expect((await as.anon.post(`/api/shared/${vw.token}/comments`, { body: 'x', authorName: 'V' })).status).toBe(403);
    expect((await as.anon.get(`/api/shared/${vw.token}/comments`)).status).toBe(403);
    // members see the guest's comment too
    const members = (await as.viewer.get(`/api/scenes/${sc.id}/comments`)).data.comments;
    expect(members[0].author).toMatchObject({ name: 'Ada Guest', guest: true });
  });

  test.each([
    [{ body: 'x' }, 'authorName'],
    [{ body: 'x', authorName: '' }, 'authorName'],
    [{ authorName: 'A' }, 'body'],
    [{ body: 'x', authorName: 'A', anchor: { dec: 5 } }, 'anchor'],
  ])('400 naming the field: %j', async (body, field) => {
    const sc = await scene();
    const rv = await link(sc.id, 'reviewer');
    const r = await as.anon.post(`/api/shared/${rv.token}/comments`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
  });

  test('rate limited per link and address: 429 with Retry-After after 20 in ten minutes', async () => {
    const sc = await scene();
    const rv = await link(sc.id, 'reviewer');
    // Bad bodies count as attempts too (and write nothing), so this floods without writing.
    for (let i = 0; i < 20; i++) expect((await as.anon.post(`/api/shared/${rv.token}/comments`, {})).status).toBe(400);
    const r = await as.anon.post(`/api/shared/${rv.token}/comments`, { body: 'one more', authorName: 'G' });
    expect(r.status).toBe(429);
    expect(r.data.error.code).toBe('rate_limited');
    expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
    // another link is counted apart
    const other = await link(sc.id, 'reviewer');
    expect((await as.anon.post(`/api/shared/${other.token}/comments`, { body: 'fine', authorName: 'G' })).status).toBe(201);
  });
});

describe('comment notifications', () => {
  test('owners and editors (not the author) get an e-mail linking to the comment', async () => {
    const sc = await scene({ title: 'Mail scene' });
    const c = (await as.reviewer.post(`/api/scenes/${sc.id}/comments`, { body: 'Please look at the keyhole.' })).data.comment;
    const url = `${s.url}/scenes/${sc.id}#comment-${c.id}`;
    for (const who of [DEMO.owner, DEMO.editor]) {
      const m = await mail.waitFor(who, /Mail scene/);
      expect(m.text).toContain(url);
      expect(m.text).toContain('Please look at the keyhole.');
    }
    const all = await mail.all();
    expect(all.filter((m) => m.subject.includes('Mail scene') && (m.to.includes(DEMO.reviewer) || m.to.includes(DEMO.viewer)))).toEqual([]);
  });

  test('a guest comment on a reviewer link notifies too', async () => {
    const sc = await scene({ title: 'Guest mail scene' });
    const rv = await link(sc.id, 'reviewer');
    const c = (await as.anon.post(`/api/shared/${rv.token}/comments`, { body: 'From outside', authorName: 'Visiting Reviewer' })).data.comment;
    const m = await mail.waitFor(DEMO.owner, /Guest mail scene/);
    expect(m.text).toContain(`${s.url}/scenes/${sc.id}#comment-${c.id}`);
    expect(m.text).toContain('Visiting Reviewer');
  });
});

describe('activity', () => {
  test('link and comment changes are in the team’s activity', async () => {
    const sc = await scene();
    const a = await link(sc.id, 'viewer');
    await as.editor.del(`/api/scenes/${sc.id}/links/${a.id}`);
    await as.reviewer.post(`/api/scenes/${sc.id}/comments`, { body: 'logged' });
    const acts = (await as.viewer.get(`/api/teams/${teamId}/activity?limit=50`)).data.activity.map((x: { action: string }) => x.action);
    expect(acts).toEqual(expect.arrayContaining(['link.create', 'link.revoke', 'comment.create']));
    expect(otherTeamId).not.toBe(teamId);
  });
});
