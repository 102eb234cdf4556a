/**
 * Accounts against the built server, a temp-file SQLite database and an SMTP fake (maildev).
 * Expected behaviour is the API contract (/work/shared/api-contract.md, "Accounts").
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { startMailFake, type MailFake } from './helpers/mail';

let s: TestServer;
let mail: MailFake;

beforeAll(async () => {
  mail = await startMailFake();
  s = await startServer({ env: { SMTP_URL: mail.smtpUrl } });
});
afterAll(async () => {
  await s?.stop();
  await mail?.stop();
});

const client = () => new ApiClient(s.url);
let n = 0;
const uniqueEmail = (tag: string) => `${tag}-${Date.now().toString(36)}-${++n}@test.example`;

describe('sign-up', () => {
  test('201, a session cookie, and /api/me shows the user with a personal team; the e-mail is stored lower-cased', async () => {
    const c = client();
    const email = uniqueEmail('Mixed.Case').replace('mixed', 'Mixed');
    const r = await c.post('/api/auth/sign-up', { email: email.toUpperCase(), password: 'a long enough pw', name: 'Ada Lindqvist' });
    expect(r.status).toBe(201);
    expect(r.data.user).toMatchObject({ email: email.toLowerCase(), name: 'Ada Lindqvist' });
    expect(c.cookies.get('armilla_session')).toBeTruthy();
    const cookie = r.headers.get('set-cookie') ?? '';
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.data.user).toEqual({ id: r.data.user.id, email: email.toLowerCase(), name: 'Ada Lindqvist' });
    expect(me.data.teams).toEqual([{ id: expect.any(String), name: 'Ada Lindqvist’s team', role: 'owner' }]);
  });

  test('409 when the e-mail is taken, whatever its case', async () => {
    const r = await client().post('/api/auth/sign-up', { email: 'OWNER@Larkspur.example', password: 'another long pw', name: 'Copy Cat' });
    expect(r.status).toBe(409);
    expect(r.data.error).toMatchObject({ code: 'email_taken', field: 'email' });
  });

  test('personalTeam: false creates no team (used when signing up to accept an invitation)', async () => {
    const c = client();
    const r = await c.post('/api/auth/sign-up', { email: uniqueEmail('noteam'), password: 'a long enough pw', name: 'No Team', personalTeam: false });
    expect(r.status).toBe(201);
    expect((await c.get('/api/me')).data.teams).toEqual([]);
  });

  test.each([
    [{ email: 'short@test.example', password: 'nine char', name: 'Short' }, 'password'],
    [{ email: 'not-an-email', password: 'long enough pw', name: 'Bad Mail' }, 'email'],
    [{ password: 'long enough pw', name: 'No Mail' }, 'email'],
    [{ email: 'noname@test.example', password: 'long enough pw' }, 'name'],
    [{ email: 'blank@test.example', password: 'long enough pw', name: '   ' }, 'name'],
    [{ email: 'num@test.example', password: 12345678901, name: 'Num' }, 'password'],
  ])('400 naming the field for %j', async (body, field) => {
    const c = client();
    const r = await c.post('/api/auth/sign-up', body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect(r.data.error.message).toContain(field);
    expect(c.cookies.size).toBe(0);
  });

  test('nothing is written by a refused sign-up (the address stays free)', async () => {
    const email = uniqueEmail('refused');
    expect((await client().post('/api/auth/sign-up', { email, password: 'short', name: 'R' })).status).toBe(400);
    expect((await client().post('/api/auth/sign-up', { email, password: 'now long enough', name: 'R' })).status).toBe(201);
  });

  test('malformed JSON → 400 malformed_json', async () => {
    const r = await client().json('POST', '/api/auth/sign-up', '{"email": "x@test.example",', { 'content-type': 'application/json' });
    expect(r.status).toBe(400);
    expect(r.data.error.code).toBe('malformed_json');
  });
});

describe('sign-in, /api/me and sign-out', () => {
  test('the demo owner signs in: 200, a session cookie, and /api/me lists the team with the role', async () => {
    const c = client();
    const r = await c.post('/api/auth/sign-in', { email: DEMO.owner, password: DEMO.password });
    expect(r.status).toBe(200);
    expect(r.data.user.email).toBe(DEMO.owner);
    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    expect(Object.keys(me.data.user).sort()).toEqual(['email', 'id', 'name']);
    expect(me.data.teams).toEqual([{ id: expect.any(String), name: 'Larkspur Ridge Observatory', role: 'owner' }]);
  });

  test('e-mail matching is case-insensitive at sign-in', async () => {
    expect((await client().post('/api/auth/sign-in', { email: '  Editor@LARKSPUR.example ', password: DEMO.password })).status).toBe(200);
  });

  test('every sign-in starts a new session; the earlier session of the same browser ends', async () => {
    const c = client();
    await c.signIn(DEMO.reviewer);
    const first = c.cookies.get('armilla_session')!;
    await c.signIn(DEMO.reviewer);
    const second = c.cookies.get('armilla_session')!;
    expect(second).not.toBe(first);
    const old = client();
    old.cookies.set('armilla_session', first);
    expect((await old.get('/api/me')).status).toBe(401);
    expect((await c.get('/api/me')).status).toBe(200);
  });

  test('wrong password and unknown e-mail answer 401 with the same code and message', async () => {
    const wrong = await client().post('/api/auth/sign-in', { email: DEMO.viewer, password: 'not the password' });
    const unknown = await client().post('/api/auth/sign-in', { email: 'nobody@larkspur.example', password: 'not the password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.data).toEqual(wrong.data);
    expect(wrong.headers.get('set-cookie')).toBeNull();
  });

  test('/api/me without a session → 401; with a made-up cookie → 401 and the cookie is blanked', async () => {
    expect((await client().get('/api/me')).status).toBe(401);
    const c = client();
    c.cookies.set('armilla_session', 'made-up-session-id');
    const r = await c.get('/api/me');
    expect(r.status).toBe(401);
    expect(r.data.error.code).toBe('unauthorized');
    expect(c.cookies.has('armilla_session')).toBe(false);
  });

  test('sign-out → 204 and the old cookie no longer works (invalidated server-side)', async () => {
    const c = client();
    await c.signIn(DEMO.editor);
    const cookie = c.cookies.get('armilla_session')!;
    const r = await c.post('/api/auth/sign-out');
    expect(r.status).toBe(204);
    const replay = client();
    replay.cookies.set('armilla_session', cookie);
    expect((await replay.get('/api/me')).status).toBe(401);
  });

  test('a cross-origin POST is refused with 403', async () => {
    const r = await client().json('POST', '/api/auth/sign-in', { email: DEMO.owner, password: DEMO.password }, { origin: 'https://evil.example' });
    expect(r.status).toBe(403);
    expect(r.data.error.code).toBe('cross_origin');
  });

  test('sign-in field errors name the field', async () => {
    const r = await client().post('/api/auth/sign-in', { email: DEMO.owner });
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('password');
  });
});

describe('throttling', () => {
  test('after 5 failures for one e-mail: 429 with Retry-After, even for the right password', async () => {
    const email = uniqueEmail('throttle');
    expect((await client().post('/api/auth/sign-up', { email, password: 'the right password', name: 'T' })).status).toBe(201);
    for (let i = 0; i < 5; i++) {
      expect((await client().post('/api/auth/sign-in', { email, password: `wrong ${i}` })).status).toBe(401);
    }
    const blocked = await client().post('/api/auth/sign-in', { email, password: 'the right password' });
    expect(blocked.status).toBe(429);
    expect(blocked.data.error.code).toBe('rate_limited');
    const retry = Number(blocked.headers.get('retry-after'));
    expect(retry).toBeGreaterThan(0);
    expect(retry).toBeLessThanOrEqual(15 * 60);
    // Other accounts are not affected by this e-mail's failures.
    expect((await client().post('/api/auth/sign-in', { email: DEMO.viewer, password: DEMO.password })).status).toBe(200);
  });
});

describe('password reset through the mail', () => {
  test('202 for an unknown address, and no mail is sent', async () => {
    const r = await client().post('/api/auth/password-reset', { email: 'ghost@test.example' });
    expect(r.status).toBe(202);
    await new Promise((res) => setTimeout(res, 300));
    expect((await mail.all()).some((m) => m.to.includes('ghost@test.example'))).toBe(false);
  });

  test('request → mail with a link → confirm: new password works, the old does not, other sessions end, the token is single-use', async () => {
    const email = uniqueEmail('reset');
    const elsewhere = client();
    expect((await elsewhere.post('/api/auth/sign-up', { email, password: 'the first password', name: 'Reset Me' })).status).toBe(201);
    expect((await elsewhere.get('/api/me')).status).toBe(200);

    const req = await client().post('/api/auth/password-reset', { email: email.toUpperCase() });
    expect(req.status).toBe(202);
    const m = await mail.waitFor(email, /reset/i);
    const link = m.text.match(/https?:\/\/\S+\/reset\/([A-Za-z0-9_-]+)/);
    expect(link, m.text).not.toBeNull();
    expect(link![0].startsWith(s.url)).toBe(true);
    expect(m.html).toContain(link![0]);
    const token = link![1]!;

    const short = await client().post('/api/auth/password-reset/confirm', { token, password: 'short' });
    expect(short.status).toBe(400);
    expect(short.data.error.field).toBe('password');

    const confirmer = client();
    const ok = await confirmer.post('/api/auth/password-reset/confirm', { token, password: 'the second password' });
    expect(ok.status).toBe(200);
    expect((await confirmer.get('/api/me')).status).toBe(200);
    expect((await elsewhere.get('/api/me')).status).toBe(401);

    expect((await client().post('/api/auth/sign-in', { email, password: 'the first password' })).status).toBe(401);
    expect((await client().post('/api/auth/sign-in', { email, password: 'the second password' })).status).toBe(200);

    const again = await client().post('/api/auth/password-reset/confirm', { token, password: 'a third password' });
    expect(again.status).toBe(400);
    expect(again.data.error).toMatchObject({ code: 'invalid_token', field: 'token' });
  });

  test('a made-up token → 400 invalid_token', async () => {
    const r = await client().post('/api/auth/password-reset/confirm', { token: 'x'.repeat(43), password: 'long enough pw' });
    expect(r.status).toBe(400);
    expect(r.data.error.code).toBe('invalid_token');
  });
});

describe('profile and password change', () => {
  test('PATCH /api/me changes the name; a password change ends the other sessions only', async () => {
    const email = uniqueEmail('profile');
    const a = client();
    await a.post('/api/auth/sign-up', { email, password: 'first long password', name: 'Before' });
    const b = client();
    await b.signIn(email, 'first long password');
    const r = await a.patch('/api/me', { name: 'After' });
    expect(r.status).toBe(200);
    expect(r.data.user.name).toBe('After');
    expect((await a.post('/api/auth/password', { currentPassword: 'wrong one', newPassword: 'second long password' })).data.error.field).toBe('currentPassword');
    expect((await a.post('/api/auth/password', { currentPassword: 'first long password', newPassword: 'second long password' })).status).toBe(200);
    expect((await a.get('/api/me')).status).toBe(200);
    expect((await b.get('/api/me')).status).toBe(401);
  });
});

describe('pages and headers', () => {
  test('signed-out visitors of /dashboard are sent to /sign-in', async () => {
    const r = await client().request('GET', '/dashboard');
    expect(r.status).toBe(302);
    expect(r.headers.get('location')).toBe('/sign-in?next=/dashboard');
  });

  test('HTML pages carry the security headers; scripts are limited to our origin and hashed inline scripts', async () => {
    const r = await client().request('GET', '/sign-in');
    expect(r.status).toBe(200);
    const csp = r.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("img-src 'self' data: blob:");
    expect(csp).toMatch(/script-src 'self'( 'sha256-[A-Za-z0-9+/=]+')*;/);
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(r.headers.get('x-content-type-options')).toBe('nosniff');
    expect(r.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(r.headers.get('x-frame-options')).toBe('DENY');
  });

  test('API answers carry nosniff too', async () => {
    const r = await client().request('GET', '/api/me');
    expect(r.headers.get('x-content-type-options')).toBe('nosniff');
  });
});

describe('throttling per client address', () => {
  let s2: TestServer;
  beforeAll(async () => {
    s2 = await startServer({ env: { SMTP_URL: mail.smtpUrl } });
  });
  afterAll(() => s2?.stop());

  test('30 failures from one address across many e-mails → 429 for every e-mail from it', async () => {
    const c = new ApiClient(s2.url);
    for (let i = 0; i < 30; i++) {
      expect((await c.post('/api/auth/sign-in', { email: `spray-${i}@test.example`, password: 'guess' })).status).toBe(401);
    }
    const r = await c.post('/api/auth/sign-in', { email: DEMO.owner, password: DEMO.password });
    expect(r.status).toBe(429);
    expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
  }, 180_000);
});
