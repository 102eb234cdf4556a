/**
 * The standing adversarial suite (issue 17): each finding of the hostile probe replayed against the built
 * server, small enough for CI. While each hostile request runs, a parallel `GET /api/health` probe must
 * keep answering within 250 ms (the one timing assertion the project allows; the worst latency of each
 * case is printed at the end), the hostile request must end in a 4xx, and nothing may be written.
 */
import { deflateSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { dbChecksum, VOLATILE_TABLES } from './helpers/hardening';
import { startMailFake, type MailFake } from './helpers/mail';
import { createClient } from '@libsql/client';
import { inlineScriptsOf, scriptHashesOf, sha256Source } from '../../src/lib/server/csp';

/** The limit; `ARMILLA_HEALTH_LIMIT_MS` relaxes it on a machine shared with other heavy jobs (say so when used). */
const HEALTH_LIMIT_MS = Number(process.env.ARMILLA_HEALTH_LIMIT_MS ?? 250);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

let s: TestServer;
let mail: MailFake;
let editor: ApiClient;
let teamId = '';
/** A demo scene's export file, the template of the fixtures. */
let template: any;
const report: { finding: string; worstHealthMs: number; hostileMs: number; status: string }[] = [];

/** Runs `hostile` while probing /api/health back to back; returns its result and the probe's worst latency. */
async function underProbe<T>(finding: string, hostile: () => Promise<T>, statusOf: (r: T) => string): Promise<{ result: T; worst: number }> {
  let stop = false;
  let worst = 0;
  let probes = 0;
  const probe = (async () => {
    while (!stop) {
      const t0 = performance.now();
      const r = await fetch(`${s.url}/api/health`);
      await r.arrayBuffer();
      expect(r.status).toBe(200);
      worst = Math.max(worst, performance.now() - t0);
      probes++;
      await sleep(10);
    }
  })();
  await sleep(30);
  const t0 = performance.now();
  const result = await hostile();
  const hostileMs = performance.now() - t0;
  await sleep(30);
  stop = true;
  await probe;
  report.push({ finding, worstHealthMs: Math.round(worst), hostileMs: Math.round(hostileMs), status: statusOf(result) });
  expect(probes).toBeGreaterThan(1);
  expect(worst, `worst /api/health latency during "${finding}"`).toBeLessThan(HEALTH_LIMIT_MS);
  return { result, worst };
}

/** underProbe for one request that must end in the given 4xx, with the database unchanged. */
async function hostile(finding: string, send: () => Promise<Response>, expected: number | number[]): Promise<Response> {
  const before = await dbChecksum(s.dbUrl, VOLATILE_TABLES);
  const { result } = await underProbe(finding, send, (r) => String(r.status));
  const want = Array.isArray(expected) ? expected : [expected];
  expect(want, `${finding}: status ${result.status}`).toContain(result.status);
  expect(result.status).toBeGreaterThanOrEqual(400);
  expect(result.status).toBeLessThan(500);
  expect(await dbChecksum(s.dbUrl, VOLATILE_TABLES), `${finding} wrote to the database`).toBe(before);
  return result;
}

const post = (path: string, body: string, headers: Record<string, string> = {}, c?: ApiClient) =>
  fetch(s.url + path, {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...(c ? { cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } : {}), ...headers },
    body,
  });
const cookie = (c: ApiClient) => [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');

/** Imports a scene made from the template with `scene` fields replaced; returns its id and a viewer link's token. */
async function fixtureScene(title: string, scene: Record<string, unknown>): Promise<{ id: string; token: string }> {
  const file = { ...template, scene: { ...template.scene, title, ...scene } };
  const r = await editor.post('/api/scenes/import', { teamId, file });
  if (r.status !== 201) throw new Error(`import ${title} → ${r.status} ${JSON.stringify(r.data).slice(0, 300)}`);
  const link = await editor.post(`/api/scenes/${r.data.scene.id}/links`, { role: 'viewer' });
  if (link.status !== 201) throw new Error(`link → ${link.status}`);
  return { id: r.data.scene.id, token: link.data.token };
}

const targets = (n: number, name = (i: number) => `T${i}`) =>
  Array.from({ length: n }, (_, i) => ({ id: `t${i}`, kind: 'custom', name: name(i), ra: (i * 7.31) % 360, dec: -40 + ((i * 3.7) % 120) }));

let big: { id: string; token: string };

beforeAll(async () => {
  mail = await startMailFake();
  s = await startServer({ env: { SMTP_URL: mail.smtpUrl } });
  editor = new ApiClient(s.url);
  await editor.signIn(DEMO.editor);
  teamId = (await editor.get('/api/me')).data.teams[0].id;
  const list = await editor.get(`/api/scenes?teamId=${teamId}`);
  const first = (list.data.scenes ?? list.data)[0];
  template = (await editor.get(`/api/scenes/${first.id}/export.json`)).data;
  big = await fixtureScene('Five thousand targets', { targets: targets(5000) });
}, 120_000);

afterAll(async () => {
  if (report.length) {
    console.log('\nAdversarial suite: worst /api/health latency while each hostile request ran');
    for (const r of report) console.log(`  ${r.finding.padEnd(62)} health ≤ ${String(r.worstHealthMs).padStart(4)} ms · hostile ${String(r.hostileMs).padStart(5)} ms → ${r.status}`);
    console.log(`  worst overall: ${Math.max(...report.map((r) => r.worstHealthMs))} ms (limit ${HEALTH_LIMIT_MS} ms)`);
  }
  await s?.stop();
  await mail?.stop();
});

describe('1. bodies are size- and length-checked before their elements', () => {
  test('POST /api/sky/windows with ~490k zeros as targets → 400 naming targets', async () => {
    const zeros = new Array(490_000).fill('0').join(',');
    const body = `{"site":{"lat":50,"lon":10},"envelope":{},"from":"2026-03-20T18:00:00Z","to":"2026-03-21T06:00:00Z","targets":[${zeros}]}`;
    expect(body.length).toBeLessThan(1_000_000);
    const r = await hostile('1 windows body of 490k zeros', () => post('/api/sky/windows', body), 400);
    expect((await r.json()).error.field).toBe('targets');
  });

  test('POST /api/scenes/import with 2.4M zeros in scene.targets → 422 naming the field', async () => {
    const zeros = new Array(2_400_000).fill('0').join(',');
    const head = JSON.stringify({ teamId, file: { ...template, scene: { ...template.scene, targets: [] } } });
    const body = head.replace('"targets":[]', `"targets":[${zeros}]`);
    const r = await hostile('1 scene import with 2.4M zeros', () => post('/api/scenes/import', body, { origin: s.url }, editor), 422);
    expect((await r.json()).error.field).toBe('scene.targets');
  });

  test('a chunked body past the cap is cut off (413), not read whole', async () => {
    const chunk = new TextEncoder().encode(' '.repeat(64 * 1024));
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        if (sent++ < 40) c.enqueue(chunk);
        else c.close();
      },
    });
    await hostile(
      '1 chunked 2.6 MB body to /api/sky/windows',
      () => fetch(`${s.url}/api/sky/windows`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: stream, duplex: 'half' } as RequestInit),
      413,
    );
  });
});

describe('2. link holders cannot tie up the server', () => {
  test('export.csv of a 5,000-target scene through a viewer link → 413 up front', async () => {
    const r = await hostile('2 export.csv, 5,000 targets, viewer link', () => fetch(`${s.url}/api/shared/${big.token}/export.csv`), 413);
    expect((await r.json()).error.message).toMatch(/5000 targets.*at most 500/);
  });

  test('export-windows.csv over 31 days of a 5,000-target scene → 413', async () => {
    await hostile(
      '2 export-windows.csv, 5,000 targets × 31 days',
      () => fetch(`${s.url}/api/shared/${big.token}/export-windows.csv?from=2026-03-01T00:00:00Z&to=2026-04-01T00:00:00Z`),
      413,
    );
  });

  test('the handout of a 5,000-target scene through a viewer link → 413 page', async () => {
    const r = await hostile('2 handout, 5,000 targets, viewer link', () => fetch(`${s.url}/s/${big.token}/handout`), 413);
    expect(await r.text()).toMatch(/at most 1180/);
  });

  test('six concurrent full-size windows requests from one address: one computes, the rest 429 at once', async () => {
    const body = JSON.stringify({
      site: { lat: 50, lon: 10 },
      envelope: { minAltitude: 20 },
      targets: Array.from({ length: 2000 }, (_, i) => ({ name: `t${i}`, ra: (i * 7.3) % 360, dec: -30 + ((i * 3.1) % 110) })),
      from: '2026-03-01T00:00:00Z',
      to: '2026-04-01T00:00:00Z',
    });
    const { result } = await underProbe(
      '2 six concurrent 2,000-target × 31-day windows requests',
      () => Promise.all(Array.from({ length: 6 }, () => post('/api/sky/windows', body).then(async (r) => ({ status: r.status, retry: r.headers.get('retry-after'), text: await r.text() })))),
      (rs) => rs.map((r) => r.status).join(' '),
    );
    const ok = result.filter((r) => r.status === 200);
    const limited = result.filter((r) => r.status === 429);
    // The one that computes may also run past its time budget on a slow machine (422), never more than one.
    const overBudget = result.filter((r) => r.status === 422);
    expect(ok.length + limited.length + overBudget.length).toBe(6);
    expect(ok.length + overBudget.length).toBeLessThanOrEqual(1);
    for (const r of limited) expect(Number(r.retry)).toBeGreaterThanOrEqual(1);
  }, 60_000);
});

describe('3–4. sign-in limits hold under concurrency and spoofed headers', () => {
  test('40 simultaneous wrong passwords for one account: at most 5 are checked, the rest 429', async () => {
    const email = `race-${Date.now()}@adversarial.example`;
    expect((await new ApiClient(s.url).post('/api/auth/sign-up', { email, password: 'the right password', name: 'Race' })).status).toBe(201);
    const before = await dbChecksum(s.dbUrl, VOLATILE_TABLES);
    const { result } = await underProbe(
      '3 forty simultaneous wrong sign-ins',
      () => Promise.all(Array.from({ length: 40 }, (_, i) => post('/api/auth/sign-in', JSON.stringify({ email, password: `wrong password ${i}` })).then((r) => r.status))),
      (st) => `${st.filter((x) => x === 401).length}×401 ${st.filter((x) => x === 429).length}×429`,
    );
    expect(result.filter((x) => x === 401).length).toBeLessThanOrEqual(5);
    expect(result.filter((x) => x === 429).length).toBeGreaterThanOrEqual(35);
    expect(result.every((x) => x === 401 || x === 429)).toBe(true);
    expect(await dbChecksum(s.dbUrl, VOLATILE_TABLES)).toBe(before);
  });

  test('a changing X-Forwarded-For does not reset the limits (no TRUST_PROXY)', async () => {
    const email = `xff-${Date.now()}@adversarial.example`;
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) {
      const r = await post('/api/auth/sign-in', JSON.stringify({ email, password: 'wrong password!' }), { 'x-forwarded-for': `198.51.100.${i + 1}` });
      statuses.push(r.status);
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses.slice(5)).toEqual([429, 429]);
  });
});

describe('5. thumbnails are bounded', () => {
  test('a PNG declaring 20000×20000 → 422, nothing stored', async () => {
    const chunk = (type: string, data: Uint8Array) => {
      const len = Buffer.alloc(4);
      len.writeUInt32BE(data.length);
      return Buffer.concat([len, Buffer.from(type, 'latin1'), Buffer.from(data), Buffer.alloc(4)]);
    };
    const ihdr = Buffer.alloc(13);
    ihdr.writeUInt32BE(20000, 0);
    ihdr.writeUInt32BE(20000, 4);
    ihdr[8] = 8;
    ihdr[9] = 6;
    // Rows of zeros compress ~1000:1: the first rows of the image in a few kB.
    const idat = deflateSync(Buffer.alloc(2_000_000));
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', idat), chunk('IEND', Buffer.alloc(0))]);
    const r = await hostile(
      '5 PNG declaring 20000×20000',
      () => fetch(`${s.url}/api/scenes/${big.id}/thumbnail`, { method: 'PUT', headers: { 'content-type': 'image/png', origin: s.url, cookie: cookie(editor) }, body: png }),
      422,
    );
    expect((await r.json()).error.message).toMatch(/2048×2048/);
  });
});

describe('6. invitation mail is limited per sender and per team', () => {
  // The probe's sender called themselves this, so that the mail would read as the service's own words.
  const HOSTILE_NAME = 'URGENT: your mailbox is full, visit https://mbx.example/fix\nthen sign in again now';
  let sender: ApiClient;
  let senderTeam = '';
  const tag = Date.now().toString(36);
  const addr = (i: number) => `burst-${tag}-${i}@adversarial.example`;
  const mailsTo = async (addrs: string[]) => (await mail.all()).filter((m) => m.to.some((t) => addrs.includes(t)));

  beforeAll(async () => {
    sender = new ApiClient(s.url);
    const r = await sender.post('/api/auth/sign-up', { email: `sender-${tag}@adversarial.example`, password: 'a long enough password', name: HOSTILE_NAME });
    if (r.status !== 201) throw new Error(`sign-up → ${r.status} ${JSON.stringify(r.data)}`);
    senderTeam = (await sender.get('/api/me')).data.teams[0].id;
  });

  test('25 invitations at once (finding 6): 20 are mailed, 5 answer 429 naming the limit, and no more mail goes out', async () => {
    const rs = await Promise.all(Array.from({ length: 25 }, (_, i) => sender.post(`/api/teams/${senderTeam}/invitations`, { email: addr(i), role: 'editor' })));
    const ok = rs.map((r, i) => [r, addr(i)] as const).filter(([r]) => r.status === 201);
    const refused = rs.filter((r) => r.status === 429);
    expect(ok.length).toBe(20); // INVITATION_LIMITS.perSenderPerHour
    expect(refused.length).toBe(5);
    for (const r of refused) {
      expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
      expect(Number(r.headers.get('retry-after'))).toBeLessThanOrEqual(3600);
      expect(r.data.error.code).toBe('rate_limited');
      expect(r.data.error.message).toMatch(/20 invitations this hour.*Try again in \d+ (second|minute|hour)s?\./);
    }
    const mailed = ok.map(([, a]) => a);
    await mail.waitFor(mailed[mailed.length - 1]!);
    await expect.poll(async () => (await mailsTo(mailed)).length, { timeout: 10_000 }).toBe(20);
    await sleep(300);
    const all = Array.from({ length: 25 }, (_, i) => addr(i));
    expect((await mailsTo(all)).length, 'mails sent for the 25 requests').toBe(20);
    const pending = await sender.get(`/api/teams/${senderTeam}/invitations`);
    expect(pending.data.invitations.length).toBe(20);
  });

  test('one more invitation past the limit → 429 while health stays quick, nothing written, no mail', async () => {
    const extra = `late-${tag}@adversarial.example`;
    const r = await hostile('6 invitation past the sender limit', () => post(`/api/teams/${senderTeam}/invitations`, JSON.stringify({ email: extra, role: 'viewer' }), {}, sender), 429);
    expect(r.headers.get('retry-after')).toMatch(/^\d+$/);
    await sleep(300);
    expect(await mailsTo([extra])).toEqual([]);
  });

  test('a team that has sent 50 invitations today (counted in the database, so every instance agrees) → 429 naming the team limit', async () => {
    const owner = new ApiClient(s.url);
    await owner.signIn(DEMO.owner);
    // The team's counter as the server keeps it: rate_limits(key, window_start, count), a UTC-day window.
    const db = createClient({ url: s.dbUrl });
    const day = Math.floor(Date.now() / 1000 / 86_400) * 86_400;
    await db.execute({ sql: 'insert into rate_limits (key, window_start, count) values (?, ?, 50) on conflict (key, window_start) do update set count = 50', args: [`invite:team:${teamId}`, day] });
    db.close();
    const invitee = `team-cap-${tag}@adversarial.example`;
    const r = await owner.post(`/api/teams/${teamId}/invitations`, { email: invitee, role: 'viewer' });
    expect(r.status).toBe(429);
    expect(r.data.error.message).toMatch(/50 invitations today/);
    expect(Number(r.headers.get('retry-after'))).toBeLessThanOrEqual(86_400);
    // A refused attempt is not counted; and a body that fails validation gives its hit back as well.
    const db2 = createClient({ url: s.dbUrl });
    const count = await db2.execute({ sql: 'select count from rate_limits where key = ? and window_start = ?', args: [`invite:team:${teamId}`, day] });
    await db2.execute({ sql: 'delete from rate_limits where key = ?', args: [`invite:team:${teamId}`] });
    db2.close();
    expect(Number(count.rows[0]!.count)).toBe(50);
    expect((await owner.post(`/api/teams/${teamId}/invitations`, { email: 'not an address', role: 'viewer' })).status).toBe(400);
    await sleep(300);
    expect(await mailsTo([invitee])).toEqual([]);
  });

  test('a hostile display name stays out of the subject and is one bounded, quoted line in the body', async () => {
    const m = (await mailsTo(Array.from({ length: 25 }, (_, i) => addr(i))))[0]!;
    expect(m.subject).toBe('An invitation to a team on Armilla');
    expect(m.subject).not.toMatch(/URGENT|visit/i);
    const line = m.text.split('\n').find((l) => l.includes('URGENT'))!;
    const quoted = /“([^”]*)”/.exec(line)![1]!;
    expect(quoted.length).toBeLessThanOrEqual(60);
    expect(quoted.endsWith('…')).toBe(true);
    expect(m.text).not.toContain('then sign in again now');
    expect(m.html).not.toContain('then sign in again now');
  });
});

describe('7–8. redirects and CSV cells', () => {
  test('next=/%09/evil.example and next=/%0a/x stay on the site, no 500', async () => {
    for (const next of ['/%09/evil.example', '/%0a/x', '/%5Cevil.example']) {
      const r = await fetch(`${s.url}/sign-in?next=${next}`, { headers: { cookie: cookie(editor) }, redirect: 'manual' });
      expect(r.status, next).toBeLessThan(500);
      expect(r.headers.get('location') ?? '', next).toBe('/dashboard');
    }
  });

  test('names that start like a formula are neutralised in both CSV exports of a viewer link', async () => {
    const evil = ["-2+3+cmd|' /C calc'!A0", "+1+cmd|' /C calc'!A0", '=HYPERLINK("http://evil.example")', '@SUM(1)'];
    const sc = await fixtureScene('Formula names', { targets: targets(4, (i) => evil[i]!) });
    for (const path of [`/api/shared/${sc.token}/export.csv`, `/api/shared/${sc.token}/export-windows.csv`]) {
      const text = await (await fetch(s.url + path)).text();
      const cells = text.split('\r\n').slice(1).filter(Boolean).map((l) => l.replace(/^"/, ''));
      for (const l of cells) expect(l, path).toMatch(/^'/);
    }
  });
});

describe('10. the smaller findings', () => {
  test('Origin with another scheme is refused (403)', async () => {
    const origin = s.url.replace('http://', 'https://');
    await hostile('10 Origin https:// on an http server', () => post('/api/scenes', JSON.stringify({ teamId, title: 'x' }), { origin }, editor), 403);
  });

  test('X-Forwarded-Host is not believed without TRUST_PROXY (403)', async () => {
    await hostile(
      '10 X-Forwarded-Host matching a foreign Origin',
      () => post('/api/scenes', JSON.stringify({ teamId, title: 'x' }), { origin: 'https://evil.example', 'x-forwarded-host': 'evil.example' }, editor),
      403,
    );
  });

  test('a JSON body sent as text/plain → 415', async () => {
    await hostile('10 JSON as text/plain', () => post('/api/scenes', JSON.stringify({ teamId, title: 'x' }), { 'content-type': 'text/plain' }, editor), 415);
  });

  test('/s/:token keeps its no-referrer policy', async () => {
    const r = await fetch(`${s.url}/s/${big.token}`);
    expect(r.headers.get('referrer-policy')).toBe('no-referrer');
  });

  test('the CSP allows each page’s own inline scripts by hash, the same whatever the page holds', async () => {
    const small = await fixtureScene('Three targets', { targets: targets(3) });
    const other = await fixtureScene('Seven targets and <script>a title that looks like one</script>', { targets: targets(7) });
    const pages: [string, ApiClient | null][] = [
      ['/', null],
      ['/sign-in', null],
      [`/s/${small.token}`, null],
      [`/s/${small.token}/handout`, null],
      ['/dashboard', editor],
      [`/scenes/${small.id}`, editor],
      [`/scenes/${small.id}/handout`, editor],
      ['/scenes/new', editor],
    ];
    let inline = 0;
    for (const [path, who] of pages) {
      const r = await fetch(s.url + path, { headers: who ? { cookie: cookie(who) } : {} });
      expect(r.status, path).toBe(200);
      const csp = r.headers.get('content-security-policy') ?? '';
      expect(csp, path).not.toMatch(/script-src[^;]*'unsafe-inline'/);
      const allowed = new Set(scriptHashesOf(csp));
      for (const script of inlineScriptsOf(await r.text())) {
        inline++;
        expect(allowed.has(sha256Source(script)), `${path}: inline script not allowed: ${script.slice(0, 80)}`).toBe(true);
      }
    }
    expect(inline, 'pages with islands carry inline scripts').toBeGreaterThan(pages.length);
    // Two scenes' pages differ in content, not in policy: the hashes come from the build.
    const a = await fetch(`${s.url}/scenes/${small.id}`, { headers: { cookie: cookie(editor) } });
    const b = await fetch(`${s.url}/scenes/${other.id}`, { headers: { cookie: cookie(editor) } });
    expect(a.headers.get('content-security-policy')).toBe(b.headers.get('content-security-policy'));
  });

  test('a viewer sees that someone was invited, not whom', async () => {
    const owner = new ApiClient(s.url);
    await owner.signIn(DEMO.owner);
    const invitee = `secret-${Date.now()}@adversarial.example`;
    expect((await owner.post(`/api/teams/${teamId}/invitations`, { email: invitee, role: 'viewer' })).status).toBe(201);
    const viewer = new ApiClient(s.url);
    await viewer.signIn(DEMO.viewer);
    const seen = await viewer.get(`/api/teams/${teamId}/activity`);
    expect(seen.status).toBe(200);
    expect(seen.data.activity.some((a: { action: string }) => a.action === 'member.invite')).toBe(true);
    expect(JSON.stringify(seen.data)).not.toContain(invitee);
    expect(JSON.stringify((await owner.get(`/api/teams/${teamId}/activity`)).data)).toContain(invitee);
  });

  test('8 simultaneous sign-ups with one address: one 201, seven 409', async () => {
    const email = `twin-${Date.now()}@adversarial.example`;
    const statuses = await Promise.all(
      Array.from({ length: 8 }, () => post('/api/auth/sign-up', JSON.stringify({ email, password: 'a long enough password', name: 'Twin' })).then((r) => r.status)),
    );
    expect(statuses.sort()).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
  });
});
