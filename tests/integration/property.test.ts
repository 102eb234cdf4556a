/**
 * Property: for every route that takes a request body (every POST, PATCH and PUT under src/pages/api),
 * random and malformed bodies sent by a caller who IS allowed to use the route never produce a 5xx
 * and never change the database.
 *
 * Bodies (fast-check): anything JSON can carry; a valid body with one field replaced by a value of
 * the wrong JSON type; text that is not JSON; strings past the 1 MB body limit; deep nesting. The
 * database is compared with a checksum of every table except sessions, rate-limit counters and the
 * activity log (a refused sign-in may count, a session may be extended) — before and after each
 * request. A body that happened to be valid may answer 2xx (only for the `anything` and `deep`
 * kinds); the checksum is then taken afresh and the change is not held against the route.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';
import { dbChecksum, discoverRoutes, sceneBody, signInCast, type Cast } from './helpers/hardening';

const RUNS = Number(process.env.PROPERTY_RUNS ?? 30);
/** Bookkeeping that a refused request may legitimately touch. */
const IGNORE_COLUMNS = { share_links: ['last_used_at'] };

let s: TestServer;
let cast: Cast;
let fx: {
  teamId: string;
  sceneId: string;
  commentId: string;
  envelopeId: string;
  siteId: string;
  viewerToken: string;
  reviewerToken: string;
};

// ---------- which routes, as whom, with which valid body ----------

type Who = 'anonymous' | 'editor' | 'owner';
interface Target {
  as: Who;
  path: () => string;
  /** A body the route accepts (or would, but for the caller's data); fields are broken one at a time. */
  valid: () => Promise<Record<string, unknown>> | Record<string, unknown>;
  /** Called every few runs (e.g. a guest comment limit per link): a fresh path. */
  rotate?: () => Promise<void>;
}

/** Routes that read no body: nothing to fuzz. */
const NO_BODY: Record<string, string> = {
  'POST /api/auth/sign-out': 'reads no body (ends the session)',
  'POST /api/auth/verify-email': 'reads no body (mails the signed-in user a new confirmation link)',
  'POST /api/invitations/[token]/accept': 'reads no body (the token is in the path)',
  'POST /api/shared/[token]/links': 'reads no body (always 403 or 404)',
  'POST /api/teams/[teamId]/calendar-feed': 'reads no body (makes a new secret URL)',
};

let guestToken = '';
const TARGETS: Record<string, Target> = {
  'POST /api/auth/sign-up': { as: 'anonymous', path: () => '/api/auth/sign-up', valid: () => ({ email: 'fuzz@elsewhere.example', password: 'fuzz-password-1', name: 'Fuzz' }) },
  'POST /api/auth/sign-in': { as: 'anonymous', path: () => '/api/auth/sign-in', valid: () => ({ email: 'fuzz@elsewhere.example', password: 'fuzz-password-1' }) },
  'POST /api/auth/password-reset': { as: 'anonymous', path: () => '/api/auth/password-reset', valid: () => ({ email: 'fuzz@elsewhere.example' }) },
  'POST /api/auth/password-reset/confirm': { as: 'anonymous', path: () => '/api/auth/password-reset/confirm', valid: () => ({ token: 'x'.repeat(43), password: 'fuzz-password-1' }) },
  'POST /api/auth/password': { as: 'editor', path: () => '/api/auth/password', valid: () => ({ currentPassword: 'not-the-password', newPassword: 'fuzz-password-2' }) },
  'PATCH /api/me': { as: 'editor', path: () => '/api/me', valid: () => ({ name: 'Tomas Reyland' }) },
  'POST /api/teams': { as: 'editor', path: () => '/api/teams', valid: () => ({ name: 'Fuzz team' }) },
  'POST /api/tokens': { as: 'owner', path: () => '/api/tokens', valid: () => ({ name: 'Fuzz token', scope: 'read' }) },
  'POST /api/teams/[teamId]/invitations': { as: 'owner', path: () => `/api/teams/${fx.teamId}/invitations`, valid: () => ({ email: 'fuzz@elsewhere.example', role: 'viewer' }) },
  'PATCH /api/teams/[teamId]/members/[userId]': { as: 'owner', path: () => `/api/teams/${fx.teamId}/members/${cast.userIds.viewer}`, valid: () => ({ role: 'viewer' }) },
  'POST /api/teams/[teamId]/sites': {
    as: 'editor',
    path: () => `/api/teams/${fx.teamId}/sites`,
    valid: () => ({ name: 'Fuzz site', lat: 41, lon: -4, height: 700, timeZone: 'Europe/Madrid' }),
  },
  'PATCH /api/sites/[id]': { as: 'editor', path: () => `/api/sites/${fx.siteId}`, valid: () => ({ name: 'Fuzz site', lat: 41, lon: -4 }) },
  'POST /api/teams/[teamId]/envelopes': { as: 'editor', path: () => `/api/teams/${fx.teamId}/envelopes`, valid: () => ({ name: 'Fuzz envelope', minAltitude: 10, azimuthRanges: [[300, 60]] }) },
  'PATCH /api/envelopes/[id]': { as: 'editor', path: () => `/api/envelopes/${fx.envelopeId}`, valid: () => ({ name: 'Fuzz envelope', minAltitude: 12, hourAngleLimits: [-4, 4] }) },
  'POST /api/envelopes/[id]/horizon': { as: 'editor', path: () => `/api/envelopes/${fx.envelopeId}/horizon`, valid: () => ({ file: 'azimuth,elevation\n0,5\n' }) },
  'POST /api/scenes': { as: 'editor', path: () => '/api/scenes', valid: () => sceneBody(fx.teamId, 'Fuzz scene') },
  'POST /api/scenes/import': { as: 'editor', path: () => '/api/scenes/import', valid: () => ({ teamId: fx.teamId, file: { format: 'armilla-scene', formatVersion: 1 } }) },
  'PATCH /api/scenes/[id]': {
    as: 'editor',
    path: () => `/api/scenes/${fx.sceneId}`,
    valid: async () => ({ version: await versionOf(fx.sceneId), title: 'Fuzz title', time: '2026-03-20T19:30:00Z', camera: { mode: 'sphere', azDeg: 10, altDeg: 20, fovDeg: 60 } }),
  },
  'POST /api/scenes/[id]/versions/[n]/restore': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/versions/1/restore`, valid: async () => ({ version: await versionOf(fx.sceneId) }) },
  'POST /api/scenes/[id]/comments': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/comments`, valid: () => ({ body: 'Fuzz', anchor: { ra: 10, dec: 20 } }) },
  'PATCH /api/comments/[id]': { as: 'editor', path: () => `/api/comments/${fx.commentId}`, valid: () => ({ resolved: true }) },
  'POST /api/scenes/[id]/links': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/links`, valid: () => ({ role: 'viewer', expiresAt: '2030-01-01T00:00:00Z' }) },
  'POST /api/scenes/[id]/presenter': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/presenter`, valid: () => ({ stepIndex: 0, time: '2026-03-20T19:30:00Z' }) },
  'POST /api/scenes/[id]/targets/import': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/targets/import`, valid: () => ({ file: 'name,ra,dec\nX,1,2\n' }) },
  'POST /api/scenes/[id]/targets/preview': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/targets/preview`, valid: () => ({ file: 'name,ra,dec\nX,1,2\n' }) },
  'PUT /api/scenes/[id]/thumbnail': { as: 'editor', path: () => `/api/scenes/${fx.sceneId}/thumbnail`, valid: () => ({ thumbnail: 'data:image/png;base64,AAAA' }) },
  'PATCH /api/shared/[token]': { as: 'anonymous', path: () => `/api/shared/${fx.viewerToken}`, valid: () => ({ title: 'Fuzz' }) },
  'PUT /api/shared/[token]': { as: 'anonymous', path: () => `/api/shared/${fx.viewerToken}`, valid: () => ({ title: 'Fuzz' }) },
  'POST /api/shared/[token]/comments': {
    as: 'anonymous',
    path: () => `/api/shared/${guestToken}/comments`,
    valid: () => ({ body: 'Fuzz', authorName: 'Guest' }),
    // guest comments are limited per link and address; a new link every few runs keeps the route in reach
    rotate: async () => {
      const r = await cast.clients.editor.post(`/api/scenes/${fx.sceneId}/links`, { role: 'reviewer' });
      if (r.status !== 201) throw new Error(`reviewer link → ${r.status}`);
      guestToken = r.data.token;
    },
  },
  'POST /api/sky/windows': {
    as: 'anonymous',
    path: () => '/api/sky/windows',
    valid: () => ({
      site: { lat: 40.4, lon: -3.7, height: 650 },
      envelope: { name: 'Fuzz', minAltitude: 20 },
      targets: [{ name: 'Vega', ra: 279.23473, dec: 38.78369 }],
      from: '2026-03-20T12:00:00Z',
      to: '2026-03-21T12:00:00Z',
    }),
  },
};

async function versionOf(sceneId: string): Promise<number> {
  const r = await cast.clients.editor.get(`/api/scenes/${sceneId}`);
  return r.data.scene.version;
}

// ---------- bodies ----------

type Recipe =
  | { kind: 'anything'; value: unknown }
  | { kind: 'broken'; keyIndex: number; value: unknown }
  | { kind: 'not-json'; text: string }
  | { kind: 'huge'; size: number }
  | { kind: 'deep'; depth: number; asArray: boolean };

const jsonType = (v: unknown) => (v === null ? 'null' : Array.isArray(v) ? 'array' : typeof v);

const wrongValue = fc.oneof(
  fc.integer(),
  fc.double({ noNaN: false }),
  fc.boolean(),
  fc.string({ maxLength: 40 }),
  fc.array(fc.anything({ maxDepth: 2 }), { maxLength: 4 }),
  fc.object({ maxDepth: 2 }),
  fc.integer({ min: 10_000, max: 300_000 }).map((n) => 'x'.repeat(n)),
);

const parsesAsJson = (text: string) => {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
};

const NOT_JSON = ['{', '{"a":', '[1,2', 'nul', 'undefined', "{'a':1}", '{"a":1}}', '\u0000', '{"a":1,}', 'NaN', '0x10', '"\\ud800', '<xml/>'];

const recipe: fc.Arbitrary<Recipe> = fc.oneof(
  { weight: 3, arbitrary: fc.anything({ maxDepth: 4 }).map((value): Recipe => ({ kind: 'anything', value })) },
  { weight: 4, arbitrary: fc.record({ keyIndex: fc.nat(), value: wrongValue }).map((r): Recipe => ({ kind: 'broken', ...r })) },
  {
    weight: 2,
    arbitrary: fc
      .oneof(fc.constantFrom(...NOT_JSON), fc.string({ maxLength: 60 }).map((t) => `{${t}`))
      // "{" and a random string can be JSON after all ("{}": CI failed once so, a restore accepted it)
      .filter((text) => !parsesAsJson(text))
      .map((text): Recipe => ({ kind: 'not-json', text })),
  },
  { weight: 1, arbitrary: fc.integer({ min: 1_000_001, max: 1_500_000 }).map((size): Recipe => ({ kind: 'huge', size })) },
  { weight: 1, arbitrary: fc.record({ depth: fc.integer({ min: 50, max: 20_000 }), asArray: fc.boolean() }).map((r): Recipe => ({ kind: 'deep', ...r })) },
);

/** The body text for a recipe; `broken` replaces one field of a valid body with a value of another JSON type. */
async function bodyOf(r: Recipe, t: Target): Promise<string> {
  switch (r.kind) {
    case 'anything':
      return JSON.stringify(r.value) ?? 'null';
    case 'not-json':
      return r.text;
    case 'huge':
      return JSON.stringify({ ...(await t.valid()), pad: 'x'.repeat(r.size) });
    case 'deep': {
      const open = r.asArray ? '['.repeat(r.depth) : '{"a":'.repeat(r.depth);
      const close = r.asArray ? ']'.repeat(r.depth) : '}'.repeat(r.depth);
      return `${open}${r.asArray ? '' : '1'}${close}`;
    }
    case 'broken': {
      const base = await t.valid();
      const keys = Object.keys(base);
      const key = keys[r.keyIndex % keys.length];
      // What the server receives is the JSON of the value: NaN and ±Infinity arrive as null, and null is a
      // legal value of the nullable fields (a presenter's time, a scene's envelope). A broken field must
      // therefore be of a wrong, non-null JSON type.
      let value: unknown = JSON.parse(JSON.stringify(r.value) ?? 'null');
      if (value === null || jsonType(value) === jsonType(base[key])) value = jsonType(base[key]) === 'number' ? 'not-a-number' : 42;
      return JSON.stringify({ ...base, [key]: value });
    }
  }
}

const describeRecipe = (r: Recipe, body: string) =>
  `${r.kind}: ${body.length > 200 ? `${body.slice(0, 200)}… (${body.length} chars)` : body}`;

// ---------- setup ----------

beforeAll(async () => {
  s = await startServer();
  cast = await signInCast(s.url);
  const ed = cast.clients.editor;
  const teamId = cast.teamId;
  const scene = await ed.post('/api/scenes', sceneBody(teamId, 'Property fixture'));
  const sceneId = scene.data.scene.id;
  const comment = await cast.clients.reviewer.post(`/api/scenes/${sceneId}/comments`, { body: 'Property fixture' });
  const envelope = await ed.post(`/api/teams/${teamId}/envelopes`, { name: 'Property envelope', minAltitude: 15 });
  const site = await ed.post(`/api/teams/${teamId}/sites`, { name: 'Property site', lat: 41, lon: -4, height: 700, timeZone: 'Europe/Madrid' });
  const viewerLink = await ed.post(`/api/scenes/${sceneId}/links`, { role: 'viewer' });
  const reviewerLink = await ed.post(`/api/scenes/${sceneId}/links`, { role: 'reviewer' });
  for (const [what, r, want] of [
    ['scene', scene, 201],
    ['comment', comment, 201],
    ['envelope', envelope, 201],
    ['site', site, 201],
    ['viewer link', viewerLink, 201],
    ['reviewer link', reviewerLink, 201],
  ] as const) {
    if (r.status !== want) throw new Error(`fixture ${what}: ${r.status} ${JSON.stringify(r.data)}`);
  }
  fx = {
    teamId,
    sceneId,
    commentId: comment.data.comment.id,
    envelopeId: envelope.data.envelope.id,
    siteId: site.data.site.id,
    viewerToken: viewerLink.data.token,
    reviewerToken: reviewerLink.data.token,
  };
  guestToken = fx.reviewerToken;
  // a first use of each link touches its last-used time; do it now, outside the measured requests
  await new ApiClient(s.url).get(`/api/shared/${fx.viewerToken}`);
});
afterAll(() => s?.stop());

// ---------- the properties ----------

const ROUTES = discoverRoutes().filter((r) => r.method === 'POST' || r.method === 'PATCH' || r.method === 'PUT');

test('every route that takes a body is fuzzed here (or listed as reading no body)', () => {
  const missing = ROUTES.filter((r) => !(r.key in TARGETS) && !(r.key in NO_BODY)).map((r) => `${r.key}  (${r.file})`);
  expect(missing, 'add these to TARGETS in tests/integration/property.test.ts').toEqual([]);
});

describe.each(ROUTES.filter((r) => r.key in TARGETS).map((r) => [r.key, r] as const))('%s', (key) => {
  test(`${RUNS} random and malformed bodies: no 5xx, no write`, async () => {
    const t = TARGETS[key]!;
    const client = t.as === 'anonymous' ? new ApiClient(s.url) : cast.clients[t.as];
    let before = await dbChecksum(s.dbUrl, undefined, IGNORE_COLUMNS);
    let run = 0;
    const accepted: string[] = [];
    const statuses: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(recipe, async (r) => {
        if (t.rotate && run % 15 === 0) {
          await t.rotate();
          before = await dbChecksum(s.dbUrl, undefined, IGNORE_COLUMNS);
        }
        run++;
        const body = await bodyOf(r, t);
        const res = await client.request(key.split(' ')[0]!, t.path(), body, { 'content-type': 'application/json' });
        const text = await res.text();
        statuses[res.status] = (statuses[res.status] ?? 0) + 1;
        const what = `${key} ${describeRecipe(r, body)} → ${res.status} ${text.slice(0, 300)}`;
        expect(res.status, what).toBeLessThan(500);
        expect(res.status, what).toBeGreaterThanOrEqual(200);
        if (res.status < 300) {
          // only a body that happened to be valid may pass, never a broken field, non-JSON or an oversize body
          expect(['anything', 'deep'], what).toContain(r.kind);
          accepted.push(what);
          before = await dbChecksum(s.dbUrl, undefined, IGNORE_COLUMNS);
          return;
        }
        expect(res.headers.get('content-type') ?? '', what).toMatch(/application\/json/);
        const after = await dbChecksum(s.dbUrl, undefined, IGNORE_COLUMNS);
        expect(after, `database changed after ${what}`).toBe(before);
      }),
      { numRuns: RUNS, endOnFailure: true },
    );
    // A route that only ever answered 401/403/404 was not exercised as an authorised caller.
    expect(Object.keys(statuses).some((st) => !['401', '403', '404'].includes(st)) || key.includes('/api/shared/[token]') && !key.endsWith('/comments'), `${key} statuses ${JSON.stringify(statuses)}`).toBe(true);
    console.log(`[property] ${key}: ${JSON.stringify(statuses)}`);
    // valid by chance: rare; listed so a reader can see them
    if (accepted.length) console.log(`[property] ${key}: ${accepted.length} random bodies were valid and accepted:\n  ${accepted.join('\n  ')}`);
  }, 180_000);
});
