/**
 * Personal API tokens against a real server (API contract: POST/GET /api/tokens, DELETE /api/tokens/:id,
 * `Authorization: Bearer`). A token acts as its owner and never beyond its scope or the owner's role:
 * checked across the demo team's role matrix (RFC 6750 for the bearer scheme and its 401/403 answers).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';
import { sceneBody, signInCast, type Cast, type TeamRole } from './helpers/hardening';

let s: TestServer;
let cast: Cast;
let sceneId: string;
let otherSceneId: string;
type Who = TeamRole | 'outsider';
const tokens = {} as Record<Who, { read: string; write: string }>;

async function bearer(token: string, method: string, path: string, body?: unknown, headers: Record<string, string> = {}) {
  const h: Record<string, string> = { authorization: `Bearer ${token}`, ...headers };
  if (body !== undefined) h['content-type'] = 'application/json';
  const r = await fetch(s.url + path, { method, headers: h, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await r.text();
  let data: any = null;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    data = text;
  }
  return { status: r.status, data, headers: r.headers, text };
}

beforeAll(async () => {
  s = await startServer();
  cast = await signInCast(s.url);
  const ed = cast.clients.editor;
  const created = await ed.post('/api/scenes', sceneBody(cast.teamId, 'Token matrix'));
  sceneId = created.data.scene.id;
  const other = await cast.clients.outsider.post('/api/scenes', sceneBody(cast.otherTeamId, 'Outsider scene'));
  otherSceneId = other.data.scene.id;
  for (const who of ['viewer', 'reviewer', 'editor', 'owner', 'outsider'] as const) {
    const read = await cast.clients[who].post('/api/tokens', { name: `${who} read`, scope: 'read' });
    const write = await cast.clients[who].post('/api/tokens', { name: `${who} write`, scope: 'write' });
    if (read.status !== 201 || write.status !== 201) throw new Error(`token for ${who}: ${read.status} ${write.status}`);
    tokens[who] = { read: read.data.token, write: write.data.token };
  }
});
afterAll(() => s?.stop());

describe('managing tokens (session only)', () => {
  test('create answers 201 {id, name, scope, token} once; the list carries no secret', async () => {
    const c = cast.clients.viewer;
    const r = await c.post('/api/tokens', { name: '  Nightly export  ', scope: 'read' });
    expect(r.status).toBe(201);
    expect(r.data).toMatchObject({ name: 'Nightly export', scope: 'read' });
    expect(r.data.token).toMatch(/^arm_[A-Za-z0-9_-]{43}$/);
    const list = await c.get('/api/tokens');
    expect(list.status).toBe(200);
    const mine = list.data.tokens.find((t: any) => t.id === r.data.id);
    expect(mine).toMatchObject({ name: 'Nightly export', scope: 'read', lastUsedAt: null });
    expect(mine.token).toBeUndefined();
    const secretPart = r.data.token.slice(4 + 6);
    expect(JSON.stringify(list.data)).not.toContain(secretPart);
    // another member's list does not show it
    const theirs = await cast.clients.editor.get('/api/tokens');
    expect(theirs.data.tokens.map((t: any) => t.id)).not.toContain(r.data.id);
  });

  test.each([
    [{ scope: 'read' }, 'name'],
    [{ name: '', scope: 'read' }, 'name'],
    [{ name: 'x'.repeat(101), scope: 'read' }, 'name'],
    [{ name: 'Bad scope', scope: 'admin' }, 'scope'],
    [{ name: 'No scope' }, 'scope'],
    [{ name: 'Extra', scope: 'read', role: 'owner' }, undefined],
  ])('bad body %j → 400 naming %s, nothing written', async (body, field) => {
    const before = (await cast.clients.reviewer.get('/api/tokens')).data.tokens.length;
    const r = await cast.clients.reviewer.post('/api/tokens', body);
    expect(r.status).toBe(400);
    if (field) expect(r.data.error.field).toBe(field);
    expect((await cast.clients.reviewer.get('/api/tokens')).data.tokens.length).toBe(before);
  });

  test('without a session: 401', async () => {
    const anon = new ApiClient(s.url);
    expect((await anon.get('/api/tokens')).status).toBe(401);
    expect((await anon.post('/api/tokens', { name: 'x', scope: 'read' })).status).toBe(401);
  });

  test('a token cannot mint, list or revoke tokens, nor change the password (403 session_required)', async () => {
    const t = tokens.owner.write;
    expect((await bearer(t, 'POST', '/api/tokens', { name: 'from a token', scope: 'write' })).data.error.code).toBe('session_required');
    expect((await bearer(t, 'GET', '/api/tokens')).status).toBe(403);
    expect((await bearer(t, 'POST', '/api/auth/password', { currentPassword: 'armilla-demo', newPassword: 'another-password-1' })).status).toBe(403);
  });

  test("revoking another member's token: 404, and it keeps working", async () => {
    const mine = await cast.clients.editor.post('/api/tokens', { name: 'Editor spare', scope: 'read' });
    expect((await cast.clients.viewer.del(`/api/tokens/${mine.data.id}`)).status).toBe(404);
    expect((await bearer(mine.data.token, 'GET', '/api/me')).status).toBe(200);
  });
});

describe('using a token', () => {
  test('acts as its owner on the routes a browser uses, with no cookie', async () => {
    const r = await bearer(tokens.editor.read, 'GET', '/api/me');
    expect(r.status).toBe(200);
    expect(r.data.user.email).toBe('editor@larkspur.example');
    expect(r.headers.get('set-cookie')).toBeNull();
    const scene = await bearer(tokens.viewer.read, 'GET', `/api/scenes/${sceneId}`);
    expect(scene.status).toBe(200);
    expect(scene.data.scene.title).toBe('Token matrix');
  });

  test('no origin check: a write token works with a foreign Origin header (a browser never adds the header itself)', async () => {
    const cur = await bearer(tokens.editor.write, 'GET', `/api/scenes/${sceneId}`);
    const r = await bearer(tokens.editor.write, 'PATCH', `/api/scenes/${sceneId}`, { version: cur.data.scene.version, title: 'Token matrix' }, { origin: 'https://elsewhere.example' });
    expect(r.status).toBe(200);
  });

  test('every use is recorded as last used (to the minute) in the list', async () => {
    const c = new ApiClient(s.url);
    await c.signIn('reviewer@larkspur.example');
    const t = await c.post('/api/tokens', { name: 'Last used', scope: 'read' });
    const t0 = Date.now();
    expect((await bearer(t.data.token, 'GET', '/api/scenes')).status).toBe(200);
    const row = (await c.get('/api/tokens')).data.tokens.find((x: any) => x.id === t.data.id);
    expect(row.lastUsedAt).not.toBeNull();
    expect(Math.abs(Date.parse(row.lastUsedAt) - t0)).toBeLessThan(60_000);
  });
});

describe('never beyond scope or role (role matrix)', () => {
  const RANK = { viewer: 0, reviewer: 1, editor: 2, owner: 3 } as const;
  type Act = { what: string; min: keyof typeof RANK; write: boolean; ok: number; send: (t: string) => Promise<{ status: number; data: any }> };
  const acts: Act[] = [
    { what: 'read the scene', min: 'viewer', write: false, ok: 200, send: (t) => bearer(t, 'GET', `/api/scenes/${sceneId}`) },
    { what: 'list the members', min: 'viewer', write: false, ok: 200, send: (t) => bearer(t, 'GET', `/api/teams/${cast.teamId}/members`) },
    { what: 'comment', min: 'reviewer', write: true, ok: 201, send: (t) => bearer(t, 'POST', `/api/scenes/${sceneId}/comments`, { body: 'From a script' }) },
    {
      what: 'PATCH the scene',
      min: 'editor',
      write: true,
      ok: 200,
      send: async (t) => {
        const v = (await cast.clients.editor.get(`/api/scenes/${sceneId}`)).data.scene.version;
        return bearer(t, 'PATCH', `/api/scenes/${sceneId}`, { version: v, title: 'Token matrix' });
      },
    },
    { what: 'make a share link', min: 'editor', write: true, ok: 201, send: (t) => bearer(t, 'POST', `/api/scenes/${sceneId}/links`, { role: 'viewer' }) },
    {
      what: 'invite a member (an owner’s action)',
      min: 'owner',
      write: true,
      ok: 201,
      send: (t) => bearer(t, 'POST', `/api/teams/${cast.teamId}/invitations`, { email: `script-${Math.random().toString(36).slice(2)}@larkspur.example`, role: 'viewer' }),
    },
  ];
  for (const who of ['viewer', 'reviewer', 'editor', 'owner'] as const) {
    for (const scope of ['read', 'write'] as const) {
      for (const a of acts) {
        const roleOk = RANK[who] >= RANK[a.min];
        const scopeOk = !a.write || scope === 'write';
        const want = !scopeOk ? 403 : roleOk ? a.ok : 403;
        test(`${who}'s ${scope} token: ${a.what} → ${want}`, async () => {
          const r = await a.send(tokens[who][scope]);
          expect(r.status, JSON.stringify(r.data)).toBe(want);
          if (!scopeOk) expect(r.data.error.code).toBe('insufficient_scope');
        });
      }
    }
  }

  test('a read token cannot PATCH: 403 and the scene is unchanged', async () => {
    const before = (await cast.clients.editor.get(`/api/scenes/${sceneId}`)).data.scene;
    const r = await bearer(tokens.owner.read, 'PATCH', `/api/scenes/${sceneId}`, { version: before.version, title: 'Changed by a read token' });
    expect(r.status).toBe(403);
    expect(r.headers.get('www-authenticate')).toContain('insufficient_scope');
    const after = (await cast.clients.editor.get(`/api/scenes/${sceneId}`)).data.scene;
    expect(after.version).toBe(before.version);
    expect(after.title).toBe(before.title);
  });

  test("a member of one team cannot read another team's scene with a token: 404 both ways", async () => {
    expect((await bearer(tokens.outsider.write, 'GET', `/api/scenes/${sceneId}`)).status).toBe(404);
    expect((await bearer(tokens.owner.write, 'GET', `/api/scenes/${otherSceneId}`)).status).toBe(404);
    const list = await bearer(tokens.outsider.read, 'GET', '/api/scenes');
    expect(list.data.scenes.map((x: any) => x.id)).not.toContain(sceneId);
  });
});

describe('bad tokens', () => {
  test('unknown, malformed and revoked tokens: the same 401, nothing leaked', async () => {
    const c = cast.clients.owner;
    const t = await c.post('/api/tokens', { name: 'To revoke', scope: 'write' });
    expect((await bearer(t.data.token, 'GET', '/api/me')).status).toBe(200);
    expect((await c.del(`/api/tokens/${t.data.id}`)).status).toBe(204);
    expect((await c.get('/api/tokens')).data.tokens.map((x: any) => x.id)).not.toContain(t.data.id);
    const answers = await Promise.all([
      bearer(t.data.token, 'GET', '/api/me'),
      bearer(`arm_${'A'.repeat(43)}`, 'GET', '/api/me'),
      bearer('not-a-token', 'GET', '/api/me'),
      bearer(t.data.token, 'GET', `/api/scenes/${sceneId}`),
    ]);
    for (const a of answers) {
      expect(a.status).toBe(401);
      expect(a.data).toEqual(answers[0]!.data);
      expect(a.headers.get('www-authenticate')).toBe('Bearer error="invalid_token"');
    }
    expect(answers[0]!.text).not.toMatch(/revoked|owner|editor@|To revoke/i);
  });

  test('a revoked token stops at once on a write too', async () => {
    const c = cast.clients.editor;
    const t = await c.post('/api/tokens', { name: 'Revoke then write', scope: 'write' });
    await c.del(`/api/tokens/${t.data.id}`);
    const v = (await c.get(`/api/scenes/${sceneId}`)).data.scene.version;
    const r = await bearer(t.data.token, 'PATCH', `/api/scenes/${sceneId}`, { version: v, title: 'Should not land' });
    expect(r.status).toBe(401);
    expect((await c.get(`/api/scenes/${sceneId}`)).data.scene.version).toBe(v);
  });

  // last: it spends this address's failure budget
  test('repeated bad tokens from one address: 429 with Retry-After', async () => {
    let last = 0;
    let retry: string | null = null;
    for (let i = 0; i < 40 && last !== 429; i++) {
      const r = await bearer(`arm_${String(i).padStart(43, 'x')}`, 'GET', '/api/me');
      last = r.status;
      retry = r.headers.get('retry-after');
    }
    expect(last).toBe(429);
    expect(Number(retry)).toBeGreaterThan(0);
  });
});
