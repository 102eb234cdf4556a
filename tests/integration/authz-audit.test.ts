/**
 * Authorisation audit. Walks src/pages/api, reads the HTTP methods each route file exports, and for
 * every (route, method) × caller (anonymous, viewer, reviewer, editor, owner of the demo team, and an
 * outsider who owns another team) checks the status against the table below. A route or method with
 * no entry in the table fails the first test: a new route needs a row here (see DEVELOPERS.md).
 *
 * Statuses follow the API contract: 401 not signed in, 403 signed in but the role is too low, 404 for a
 * resource of another team (never reveal it exists). Requests are valid apart from who sends them, so
 * the status says what the caller may do. Cells that destroy something get a fresh fixture each.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { CALLERS, cloneClient, discoverRoutes, sceneBody, signInCast, type ApiRoute, type Caller, type Cast } from './helpers/hardening';

// ---------- the route files ----------

const ROUTES = discoverRoutes();
type Method = ApiRoute['method'];

// ---------- fixtures ----------

interface Fixtures {
  cast: Cast;
  teamId: string;
  sceneId: string;
  commentId: string;
  envelopeId: string;
  siteId: string;
  linkId: string;
  viewerToken: string;
  reviewerToken: string;
  invitationId: string;
  invitationToken: string;
  sceneFile: unknown;
}

let s: TestServer;
let fx: Fixtures;
let seq = 0;
const unique = (what: string) => `${what}-${Date.now().toString(36)}-${++seq}`;

const ok = (r: { status: number; data: unknown }, want: number, what: string) => {
  if (r.status !== want) throw new Error(`fixture ${what}: ${r.status} ${JSON.stringify(r.data)}`);
  return r.data as any;
};

/** The invitation token, read from the mail the server logs when SMTP_URL is unset. */
function tokenFromLog(email: string): string {
  const log = s.log();
  const at = log.lastIndexOf(`To: ${email}`);
  const m = at >= 0 ? /\/invitations\/([A-Za-z0-9_-]{20,})/.exec(log.slice(at)) : null;
  if (!m) throw new Error(`no invitation mail to ${email} in the server log`);
  return m[1];
}

/** Opens the address-confirmation link the server logged for `email` (the mail is sent after the answer). */
async function verifyFromLog(email: string): Promise<void> {
  for (let i = 0; i < 50; i++) {
    const log = s.log();
    const at = log.lastIndexOf(`To: ${email}`);
    const m = at >= 0 ? /\/verify\/([A-Za-z0-9_-]{20,})/.exec(log.slice(at)) : null;
    if (m) {
      ok(await new ApiClient(s.url).json('GET', `/verify/${m[1]}`).then((r) => ({ ...r, data: {} })), 200, 'verify');
      return;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no confirmation mail to ${email} in the server log`);
}

const editor = () => fx.cast.clients.editor;
const owner = () => fx.cast.clients.owner;

const fresh = {
  scene: async () => ok(await editor().post('/api/scenes', sceneBody(fx.teamId, unique('Audit delete'))), 201, 'scene').scene.id as string,
  link: async () => ok(await editor().post(`/api/scenes/${fx.sceneId}/links`, { role: 'viewer' }), 201, 'link').id as string,
  envelope: async () => ok(await editor().post(`/api/teams/${fx.teamId}/envelopes`, { name: unique('Audit envelope') }), 201, 'envelope').envelope.id as string,
  site: async () =>
    ok(await editor().post(`/api/teams/${fx.teamId}/sites`, { name: unique('Audit site'), lat: 41, lon: -4, height: 700, timeZone: 'Europe/Madrid' }), 201, 'site').site
      .id as string,
  invitation: async () => {
    const email = `${unique('invitee')}@larkspur.example`;
    return ok(await owner().post(`/api/teams/${fx.teamId}/invitations`, { email, role: 'viewer' }), 201, 'invitation').invitation.id as string;
  },
  /** A new account that joined the demo team as a viewer (sign-up, invitation, accept). */
  member: async () => {
    const email = `${unique('member')}@larkspur.example`;
    const c = new ApiClient(s.url);
    ok(await c.post('/api/auth/sign-up', { email, password: 'audit-password-1', name: 'Audit member' }), 201, 'sign-up');
    await verifyFromLog(email);
    ok(await owner().post(`/api/teams/${fx.teamId}/invitations`, { email, role: 'viewer' }), 201, 'invite');
    ok(await c.post(`/api/invitations/${tokenFromLog(email)}/accept`), 200, 'accept');
    return ok(await c.get('/api/me'), 200, 'me').user.id as string;
  },
};

/** A 1×1 PNG (signature + IHDR + IDAT + IEND), the smallest valid image. */
const PNG_1x1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');

beforeAll(async () => {
  s = await startServer();
  const cast = await signInCast(s.url);
  const ed = cast.clients.editor;
  const teamId = cast.teamId;
  // a copy of a demo scene with targets (exports and windows have rows to compute)
  const list = ok(await ed.get(`/api/scenes?teamId=${teamId}`), 200, 'scenes').scenes as Array<{ id: string }>;
  let source = list[0]!.id;
  for (const x of list) {
    const full = ok(await ed.get(`/api/scenes/${x.id}`), 200, 'scene');
    if (full.scene.targets?.length) {
      source = x.id;
      break;
    }
  }
  const scene = ok(await ed.post('/api/scenes', { teamId, fromSceneId: source, title: 'Authorisation audit' }), 201, 'scene copy').scene;
  const thumb = await fetch(`${s.url}/api/scenes/${scene.id}/thumbnail`, {
    method: 'PUT',
    headers: { cookie: cookieOf(ed), 'content-type': 'image/png' },
    body: PNG_1x1,
  });
  if (thumb.status !== 204) throw new Error(`fixture thumbnail: ${thumb.status} ${await thumb.text()}`);
  const comment = ok(await cast.clients.reviewer.post(`/api/scenes/${scene.id}/comments`, { body: 'Audit comment' }), 201, 'comment').comment;
  const viewerLink = ok(await ed.post(`/api/scenes/${scene.id}/links`, { role: 'viewer' }), 201, 'viewer link');
  const reviewerLink = ok(await ed.post(`/api/scenes/${scene.id}/links`, { role: 'reviewer' }), 201, 'reviewer link');
  const envelope = ok(await ed.post(`/api/teams/${teamId}/envelopes`, { name: 'Audit envelope', minAltitude: 15 }), 201, 'envelope').envelope;
  const site = ok(await ed.post(`/api/teams/${teamId}/sites`, { name: 'Audit site', lat: 41, lon: -4, height: 700, timeZone: 'Europe/Madrid' }), 201, 'site').site;
  const inviteeEmail = 'invitee-audit@larkspur.example';
  const invitation = ok(await cast.clients.owner.post(`/api/teams/${teamId}/invitations`, { email: inviteeEmail, role: 'viewer' }), 201, 'invitation').invitation;
  const exported = await ed.get(`/api/scenes/${scene.id}/export.json`);
  fx = {
    cast,
    teamId,
    sceneId: scene.id,
    commentId: comment.id,
    envelopeId: envelope.id,
    siteId: site.id,
    linkId: viewerLink.id,
    viewerToken: viewerLink.token,
    reviewerToken: reviewerLink.token,
    invitationId: invitation.id,
    invitationToken: tokenFromLog(inviteeEmail),
    sceneFile: ok(exported, 200, 'export.json'),
  };
});
afterAll(() => s?.stop());

function cookieOf(c: ApiClient): string {
  return [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
}

/** `/api/scenes/[id]/links/[linkId]` → concrete ids, by the segment each parameter follows. */
function concretePath(pattern: string): string {
  const segs = pattern.split('/');
  return segs
    .map((seg, i) => {
      if (!/^\[.+\]$/.test(seg)) return seg;
      const ctx = `${segs[i - 1]}/${seg}`;
      const v: Record<string, string> = {
        'scenes/[id]': fx.sceneId,
        'comments/[id]': fx.commentId,
        'envelopes/[id]': fx.envelopeId,
        'sites/[id]': fx.siteId,
        'teams/[teamId]': fx.teamId,
        'members/[userId]': fx.cast.userIds.viewer,
        'invitations/[invitationId]': fx.invitationId,
        'links/[linkId]': fx.linkId,
        'versions/[n]': '1',
        'shared/[token]': fx.viewerToken,
        'invitations/[token]': fx.invitationToken,
        'tokens/[id]': 'not-a-token-id',
      };
      if (!(ctx in v)) throw new Error(`no fixture for ${ctx} in ${pattern}: add one to concretePath()`);
      return v[ctx];
    })
    .join('/');
}

// ---------- the table ----------

type Status = number | readonly number[];
type Row = Record<Caller, Status>;

interface Req {
  path?: string;
  json?: unknown;
  form?: FormData;
  raw?: { body: BodyInit; type: string };
}
interface Cell {
  caller: Caller;
  /** The default concrete path of the route. */
  path: string;
}
interface Entry {
  expect: Row;
  req?: (cell: Cell) => Promise<Req> | Req;
  /** The request ends or replaces the caller's session: send it from a session of its own. */
  ownSession?: boolean;
  /** A server-sent-events stream: only the status is read. */
  stream?: boolean;
}

const ALL = (st: Status): Row => ({ anonymous: st, viewer: st, reviewer: st, editor: st, owner: st, outsider: st });
/** Any signed-in account. */
const signedIn = (st: Status): Row => ({ ...ALL(st), anonymous: 401 });
const RANK = { viewer: 0, reviewer: 1, editor: 2, owner: 3 } as const;
/** A demo-team resource: 401 anonymous, 403 below `min`, `st` from `min` up, 404 for the outsider. */
const team = (min: keyof typeof RANK, st: Status): Row => ({
  anonymous: 401,
  viewer: RANK.viewer >= RANK[min] ? st : 403,
  reviewer: RANK.reviewer >= RANK[min] ? st : 403,
  editor: RANK.editor >= RANK[min] ? st : 403,
  owner: st,
  outsider: 404,
});

const csvForm = (name: string, text: string, type = 'text/csv') => {
  const f = new FormData();
  f.append('file', new Blob([text], { type }), name);
  return f;
};
const currentVersion = async () => ok(await editor().get(`/api/scenes/${fx.sceneId}`), 200, 'scene').scene.version as number;

const TABLE: Record<string, Entry> = {
  'GET /api/health': { expect: ALL(200) },
  'GET /api/openapi.json': { expect: ALL(200) },

  // accounts
  'POST /api/auth/sign-up': {
    expect: ALL(201),
    ownSession: true,
    req: ({ caller }) => ({ json: { email: `${unique(`signup-${caller}`)}@elsewhere.example`, password: 'audit-password-1', name: 'Audit sign-up' } }),
  },
  'POST /api/auth/sign-in': { expect: ALL(200), ownSession: true, req: () => ({ json: { email: DEMO.viewer, password: DEMO.password } }) },
  'POST /api/auth/sign-out': { expect: ALL(204), ownSession: true },
  'POST /api/auth/password-reset': { expect: ALL(202), req: ({ caller }) => ({ json: { email: `nobody-${caller}@elsewhere.example` } }) },
  // a made-up token: public route, the answer is the same for everyone
  'POST /api/auth/password-reset/confirm': { expect: ALL(400), req: () => ({ json: { token: 'x'.repeat(43), password: 'audit-password-2' } }) },
  // wrong current password: nothing changes, but only a signed-in caller gets that far
  'POST /api/auth/password': { expect: signedIn(400), req: () => ({ json: { currentPassword: 'not-the-password', newPassword: 'audit-password-2' } }) },
  'POST /api/auth/verify-email': { expect: signedIn(409) },
  'GET /api/me': { expect: signedIn(200) },
  'PATCH /api/me': { expect: signedIn(200), req: ({ caller }) => ({ json: { name: `Audit ${caller}` } }) },

  // teams
  'GET /api/teams': { expect: signedIn(200) },
  'POST /api/teams': { expect: signedIn(201), req: () => ({ json: { name: unique('Audit team') } }) },
  // the invitation was sent to another address: every account is refused, only the invitee may accept
  'POST /api/invitations/[token]/accept': { expect: signedIn(403) },
  'GET /api/teams/[teamId]/members': { expect: team('viewer', 200) },
  'PATCH /api/teams/[teamId]/members/[userId]': { expect: team('owner', 200), req: ({ path }) => ({ path, json: { role: 'viewer' } }) },
  'DELETE /api/teams/[teamId]/members/[userId]': {
    expect: team('owner', 204),
    req: async () => ({ path: `/api/teams/${fx.teamId}/members/${await fresh.member()}` }),
  },
  'GET /api/teams/[teamId]/invitations': { expect: team('owner', 200) },
  'POST /api/teams/[teamId]/invitations': {
    expect: team('owner', 201),
    req: ({ path }) => ({ path, json: { email: `${unique('invitee')}@larkspur.example`, role: 'reviewer' } }),
  },
  'DELETE /api/teams/[teamId]/invitations/[invitationId]': {
    expect: team('owner', 204),
    req: async () => ({ path: `/api/teams/${fx.teamId}/invitations/${await fresh.invitation()}` }),
  },
  'GET /api/teams/[teamId]/activity': { expect: team('viewer', 200) },

  // sites and envelopes
  'GET /api/teams/[teamId]/sites': { expect: team('viewer', 200) },
  'POST /api/teams/[teamId]/sites': {
    expect: team('editor', 201),
    req: ({ path }) => ({ path, json: { name: unique('Audit site'), lat: 41, lon: -4, height: 700, timeZone: 'Europe/Madrid' } }),
  },
  'GET /api/sites/[id]': { expect: team('viewer', 200) },
  'PATCH /api/sites/[id]': { expect: team('editor', 200), req: ({ path }) => ({ path, json: { name: 'Audit site (renamed)' } }) },
  'DELETE /api/sites/[id]': { expect: team('editor', 204), req: async () => ({ path: `/api/sites/${await fresh.site()}` }) },
  'GET /api/teams/[teamId]/envelopes': { expect: team('viewer', 200) },
  'POST /api/teams/[teamId]/envelopes': { expect: team('editor', 201), req: ({ path }) => ({ path, json: { name: unique('Audit envelope'), minAltitude: 10 } }) },
  'GET /api/envelopes/[id]': { expect: team('viewer', 200) },
  'PATCH /api/envelopes/[id]': { expect: team('editor', 200), req: ({ path }) => ({ path, json: { maxAltitude: 85 } }) },
  'DELETE /api/envelopes/[id]': { expect: team('editor', 204), req: async () => ({ path: `/api/envelopes/${await fresh.envelope()}` }) },
  'POST /api/envelopes/[id]/horizon': {
    expect: team('editor', 200),
    req: ({ path }) => ({ path, form: csvForm('horizon.csv', 'azimuth,elevation\n0,5\n90,8\n180,5\n270,8\n') }),
  },

  // scenes
  'GET /api/scenes': { expect: signedIn(200) },
  'POST /api/scenes': { expect: team('editor', 201), req: () => ({ json: sceneBody(fx.teamId, unique('Audit create')) }) },
  'POST /api/scenes/import': { expect: team('editor', 201), req: () => ({ json: { teamId: fx.teamId, file: fx.sceneFile } }) },
  'GET /api/scenes/[id]': { expect: team('viewer', 200) },
  'PATCH /api/scenes/[id]': { expect: team('editor', 200), req: async ({ path }) => ({ path, json: { version: await currentVersion(), title: 'Authorisation audit' } }) },
  'DELETE /api/scenes/[id]': { expect: team('editor', 204), req: async () => ({ path: `/api/scenes/${await fresh.scene()}` }) },
  'GET /api/scenes/[id]/versions': { expect: team('viewer', 200) },
  'POST /api/scenes/[id]/versions/[n]/restore': { expect: team('editor', 200), req: ({ path }) => ({ path, json: {} }) },
  'GET /api/scenes/[id]/comments': { expect: team('viewer', 200) },
  'POST /api/scenes/[id]/comments': { expect: team('reviewer', 201), req: ({ path }) => ({ path, json: { body: 'Audit comment', anchor: { azimuth: 180, altitude: 30 } } }) },
  'PATCH /api/comments/[id]': { expect: team('reviewer', 200), req: ({ path }) => ({ path, json: { resolved: true } }) },
  'GET /api/scenes/[id]/links': { expect: team('editor', 200) },
  'POST /api/scenes/[id]/links': { expect: team('editor', 201), req: ({ path }) => ({ path, json: { role: 'reviewer' } }) },
  'DELETE /api/scenes/[id]/links/[linkId]': { expect: team('editor', 204), req: async () => ({ path: `/api/scenes/${fx.sceneId}/links/${await fresh.link()}` }) },
  'GET /api/scenes/[id]/presenter': { expect: team('viewer', 200) },
  'POST /api/scenes/[id]/presenter': { expect: team('editor', 200), req: ({ path }) => ({ path, json: { stepIndex: 0 } }) },
  'GET /api/scenes/[id]/presenter/stream': { expect: team('viewer', 200), stream: true },
  'GET /api/scenes/[id]/thumbnail': { expect: team('viewer', 200) },
  'PUT /api/scenes/[id]/thumbnail': { expect: team('editor', 204), req: ({ path }) => ({ path, raw: { body: PNG_1x1, type: 'image/png' } }) },
  'GET /api/scenes/[id]/thumbnail.png': { expect: team('viewer', 200) },
  'POST /api/scenes/[id]/targets/import': {
    expect: team('editor', 200),
    req: ({ path }) => ({ path, form: csvForm('targets.csv', `name,ra,dec\n${unique('Audit target')},10.684708,41.26875\n`) }),
  },
  'POST /api/scenes/[id]/targets/preview': { expect: team('editor', 200), req: ({ path }) => ({ path, form: csvForm('targets.csv', 'name,ra,dec\nPreview,10.684708,41.26875\n') }) },
  'GET /api/scenes/[id]/export.csv': { expect: team('viewer', 200) },
  'GET /api/scenes/[id]/export.json': { expect: team('viewer', 200) },
  'GET /api/scenes/[id]/targets.vot': { expect: team('viewer', 200) },
  'GET /api/scenes/[id]/windows.csv': { expect: team('viewer', 200) },
  'GET /api/scenes/[id]/night': { expect: team('viewer', 200) },
  'GET /api/scenes/[id]/night.svg': { expect: team('viewer', 200) },

  // share links: the token is the credential, whoever holds it (account or not) gets the link's role
  'GET /api/shared/[token]': { expect: ALL(200) },
  'PATCH /api/shared/[token]': { expect: ALL(403), req: ({ path }) => ({ path, json: { title: 'Not allowed' } }) },
  'PUT /api/shared/[token]': { expect: ALL(403), req: ({ path }) => ({ path, json: { title: 'Not allowed' } }) },
  'DELETE /api/shared/[token]': { expect: ALL(403) },
  'POST /api/shared/[token]/links': { expect: ALL(403), req: ({ path }) => ({ path, json: { role: 'viewer' } }) },
  'GET /api/shared/[token]/comments': { expect: ALL(200), req: () => ({ path: `/api/shared/${fx.reviewerToken}/comments` }) },
  // chart comments are shown on the chart for every link holder, viewer links included
  'GET /api/shared/[token]/chart-comments': { expect: ALL(200) },
  'POST /api/shared/[token]/comments': {
    expect: ALL(201),
    req: ({ caller }) => ({ path: `/api/shared/${fx.reviewerToken}/comments`, json: { body: 'Guest audit comment', authorName: `Guest ${caller}` } }),
  },
  'GET /api/shared/[token]/presenter/stream': { expect: ALL(200), stream: true },
  'GET /api/shared/[token]/export.csv': { expect: ALL(200) },
  'GET /api/shared/[token]/export.json': { expect: ALL(200) },
  'GET /api/shared/[token]/export.vot': { expect: ALL(200) },
  'GET /api/shared/[token]/export-windows.csv': { expect: ALL(200) },
  'GET /api/shared/[token]/night': { expect: ALL(200) },
  'GET /api/shared/[token]/night.svg': { expect: ALL(200) },

  // calendars: the scene's night for members and link holders; the team's secret subscription URL (editor+)
  'GET /api/scenes/[id]/calendar.ics': { expect: team('viewer', 200) },
  'GET /api/shared/[token]/calendar.ics': { expect: ALL(200) },
  'GET /api/teams/[teamId]/calendar-feed': { expect: team('editor', 200) },
  'POST /api/teams/[teamId]/calendar-feed': { expect: team('editor', 201) },
  'DELETE /api/teams/[teamId]/calendar-feed': {
    expect: team('editor', 204),
    req: async ({ path }) => {
      ok(await editor().post(path), 201, 'calendar feed');
      return { path };
    },
  },
  // the secret URL is the credential: whoever holds it reads the feed
  'GET /api/calendars/[token].ics': {
    expect: ALL(200),
    req: async () => ({ path: new URL(ok(await editor().post(`/api/teams/${fx.teamId}/calendar-feed`), 201, 'calendar feed').url).pathname }),
  },

  // personal API tokens: each account manages its own (another member's token id answers 404)
  'GET /api/tokens': { expect: signedIn(200) },
  'POST /api/tokens': { expect: signedIn(201), req: ({ caller }) => ({ json: { name: `Audit ${caller}`, scope: 'read' } }) },
  'DELETE /api/tokens/[id]': {
    expect: signedIn(204),
    req: async ({ caller }) => {
      const by = caller === 'anonymous' ? editor() : fx.cast.clients[caller];
      return { path: `/api/tokens/${ok(await by.post('/api/tokens', { name: unique('Audit revoke'), scope: 'read' }), 201, 'token').id}` };
    },
  },

  // place search and time-zone lookup: no account needed
  'GET /api/places': { expect: ALL(200), req: () => ({ path: '/api/places?q=tucson&limit=3' }) },
  'GET /api/places/zone': { expect: ALL(200), req: () => ({ path: '/api/places/zone?lat=32.22&lon=-110.93' }) },

  // sky computation: no account needed
  'GET /api/sky/observe': { expect: ALL(200), req: () => ({ path: '/api/sky/observe?lat=40.4&lon=-3.7&height=650&time=2026-03-20T19:30:00Z&body=moon' }) },
  'GET /api/sky/events': {
    expect: ALL(200),
    req: () => ({ path: '/api/sky/events?lat=40.4&lon=-3.7&height=650&body=sun&from=2026-03-20T00:00:00Z&to=2026-03-21T00:00:00Z' }),
  },
  'POST /api/sky/windows': {
    expect: ALL(200),
    req: () => ({
      json: {
        site: { lat: 40.4, lon: -3.7, height: 650 },
        envelope: { name: 'Audit', minAltitude: 20 },
        targets: [{ name: 'Vega', ra: 279.23473, dec: 38.78369 }],
        from: '2026-03-20T12:00:00Z',
        to: '2026-03-21T12:00:00Z',
      },
    }),
  },
};

// ---------- running a cell ----------

async function clientFor(caller: Caller, ownSession: boolean): Promise<ApiClient> {
  if (caller === 'anonymous') return new ApiClient(s.url);
  if (!ownSession) return cloneClient(fx.cast.clients[caller]);
  const c = new ApiClient(s.url);
  await c.signIn(DEMO[caller]);
  return c;
}

async function send(c: ApiClient, method: Method, r: Req, stream: boolean): Promise<{ status: number; body: string }> {
  const headers: Record<string, string> = {};
  const cookie = cookieOf(c);
  if (cookie) headers.cookie = cookie;
  let body: BodyInit | undefined;
  if (r.form) body = r.form;
  else if (r.raw) {
    body = r.raw.body;
    headers['content-type'] = r.raw.type;
  } else if (r.json !== undefined) {
    body = JSON.stringify(r.json);
    headers['content-type'] = 'application/json';
  }
  const ac = new AbortController();
  const res = await fetch(s.url + r.path, { method, headers, body, redirect: 'manual', signal: ac.signal });
  if (stream) {
    ac.abort();
    return { status: res.status, body: '' };
  }
  return { status: res.status, body: await res.text() };
}

test('every route file and method under src/pages/api has an entry in the authorisation table', () => {
  expect(ROUTES.length).toBeGreaterThan(0);
  const missing = ROUTES.filter((r) => !(r.key in TABLE)).map((r) => `${r.key}  (${r.file})`);
  expect(missing, 'add these to TABLE in tests/integration/authz-audit.test.ts').toEqual([]);
});

const built = new Set(ROUTES.map((r) => r.key));
test('every row of the authorisation table has a route file (a promised route that is missing fails here)', () => {
  expect(Object.keys(TABLE).filter((k) => !built.has(k))).toEqual([]);
});

for (const route of ROUTES) {
  const entry = TABLE[route.key];
  if (!entry) continue;
  describe(route.key, () => {
    for (const caller of CALLERS) {
      const want = entry.expect[caller];
      test(`as ${caller} → ${Array.isArray(want) ? want.join('|') : want}`, async () => {
        const path = concretePath(route.pattern);
        const r = { path, ...(entry.req ? await entry.req({ caller, path }) : {}) };
        const c = await clientFor(caller, entry.ownSession ?? false);
        const res = await send(c, route.method, r, entry.stream ?? false);
        const allowed = (Array.isArray(want) ? want : [want]) as number[];
        expect(allowed, `${route.method} ${r.path} as ${caller} → ${res.status} ${res.body.slice(0, 300)}`).toContain(res.status);
      });
    }
  });
}

describe('links carry their own role', () => {
  test('a viewer link cannot read or post comments (403); a revoked link is gone (404)', async () => {
    const anon = new ApiClient(s.url);
    expect((await anon.get(`/api/shared/${fx.viewerToken}/comments`)).status).toBe(403);
    expect((await anon.post(`/api/shared/${fx.viewerToken}/comments`, { body: 'x', authorName: 'Guest' })).status).toBe(403);
    const link = ok(await editor().post(`/api/scenes/${fx.sceneId}/links`, { role: 'reviewer' }), 201, 'link');
    expect((await anon.get(`/api/shared/${link.token}`)).status).toBe(200);
    expect((await editor().del(`/api/scenes/${fx.sceneId}/links/${link.id}`)).status).toBe(204);
    expect((await anon.get(`/api/shared/${link.token}`)).status).toBe(404);
    expect((await anon.get(`/api/shared/${link.token}/comments`)).status).toBe(404);
  });

  test('an unknown token answers 404, like a revoked one', async () => {
    const anon = new ApiClient(s.url);
    expect((await anon.get(`/api/shared/${'A'.repeat(32)}`)).status).toBe(404);
  });
});
