/**
 * The fixed night API (`GET /api/scenes/:id/night`, `GET /api/shared/:token/night`) through the built
 * server: window edges equal `POST /api/sky/windows` for the scene's envelope, samples agree with
 * `/api/sky/observe` (the engine's fixed single-place route), airmass null below the horizon, bad
 * parameters answer 400 naming the field and change nothing.
 */
import { get } from 'node:http';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO } from './helpers/client';
import { startServer, type TestServer } from './helpers/server';

const SITE = { name: 'Night test site', lat: 37.2, lon: -3.6, height: 2800, timeZone: 'Europe/Madrid' };
const TIME = '2026-03-20T22:00:00Z';
const ENVELOPE = { name: 'Night test mount', minAltitude: 20, maxAltitude: 85, keyholeRadius: 4, moonAvoidance: 15, azimuthRanges: [[20, 340]], horizonMask: [[0, 10], [90, 25], [180, 12], [270, 18]] };
const ARCSEC = 1 / 3600;

let server: TestServer;
let editor: ApiClient;
let viewer: ApiClient;
let anon: ApiClient;
let sceneId: string;
let token: string;

beforeAll(async () => {
  server = await startServer();
  editor = new ApiClient(server.url);
  viewer = new ApiClient(server.url);
  anon = new ApiClient(server.url);
  await editor.signIn(DEMO.editor);
  await viewer.signIn(DEMO.viewer);
  const me = await editor.get('/api/me');
  const teamId = me.data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await editor.post('/api/scenes', {
    teamId,
    title: 'Night API test',
    site: SITE,
    time: TIME,
    envelope: ENVELOPE,
    targets: [
      { id: 't1', kind: 'custom', name: 'Field A', ra: 83.8221, dec: -5.3911 },
      { id: 't2', kind: 'custom', name: 'Field B', ra: 150.2, dec: 40.1 },
      { id: 't3', kind: 'star', name: 'Vega', hr: 7001 },
      { id: 't4', kind: 'body', name: 'Jupiter', body: 'jupiter' },
    ],
  });
  expect(created.status, JSON.stringify(created.data)).toBe(201);
  sceneId = created.data.scene.id;
  const link = await editor.post(`/api/scenes/${sceneId}/links`, { role: 'viewer' });
  expect(link.status).toBe(201);
  token = link.data.token;
});

afterAll(async () => {
  await server?.stop();
});

describe('GET /api/scenes/:id/night', () => {
  it('answers the contract shape for the scene night (sunset to sunrise)', async () => {
    const r = await viewer.get(`/api/scenes/${sceneId}/night`);
    expect(r.status, JSON.stringify(r.data)).toBe(200);
    const d = r.data;
    expect(d.site).toMatchObject({ lat: SITE.lat, lon: SITE.lon, height: SITE.height });
    expect(d.step).toBe(5);
    const kinds = d.sun.events.map((e: { kind: string }) => e.kind);
    expect(kinds[0]).toBe('set');
    expect(kinds.at(-1)).toBe('rise');
    expect(Date.parse(d.sun.events[0].time) - Date.parse(d.from)).toBeLessThan(60000);
    expect(typeof d.moon.illumination).toBe('number');
    expect(d.moon.samples.length).toBe(d.targets[0].samples.length);
    expect(d.targets.map((t: { name: string }) => t.name)).toEqual(['Field A', 'Field B', 'Vega', 'Jupiter']);
    for (const t of d.targets) {
      expect(Object.keys(t.best)).toEqual(expect.arrayContaining(['time', 'altitude', 'airmass', 'moonSeparation', 'sunSeparation']));
      t.samples.forEach((s: { time: string; altitude: number; airmass: number | null }, k: number) => {
        expect(Date.parse(s.time)).toBe(Date.parse(d.from) + k * 5 * 60000);
        expect(s.airmass === null).toBe(s.altitude < 0);
      });
      for (const w of t.windows) expect(typeof w.closedBy).toBe('string');
    }
  });

  it('window edges equal POST /api/sky/windows for the scene envelope', async () => {
    const from = '2026-03-20T18:00:00Z', to = '2026-03-21T07:00:00Z';
    const n = await viewer.get(`/api/scenes/${sceneId}/night?from=${from}&to=${to}&step=10`);
    expect(n.status).toBe(200);
    const w = await anon.post('/api/sky/windows', {
      site: { lat: SITE.lat, lon: SITE.lon, height: SITE.height },
      envelope: ENVELOPE,
      targets: [
        { name: 'Field A', ra: 83.8221, dec: -5.3911 },
        { name: 'Field B', ra: 150.2, dec: 40.1 },
        // Vega, HR 7001: the place the scene's catalogue holds (BSC5 J2000 18h36m56.2s +38°47′01″, bsc5.json)
        { name: 'Vega', ra: 279.234, dec: 38.7836 },
        { name: 'Jupiter', body: 'jupiter' },
      ],
      from,
      to,
    });
    expect(w.status, JSON.stringify(w.data)).toBe(200);
    let compared = 0;
    w.data.targets.forEach((t: { name: string; windows: { start: string; end: string; closedBy: string }[] }, i: number) => {
      const mine = n.data.targets[i];
      expect(mine.name).toBe(t.name);
      expect(mine.windows.length).toBe(t.windows.length);
      t.windows.forEach((x, j) => {
        expect(mine.windows[j].start).toBe(x.start);
        expect(mine.windows[j].end).toBe(x.end);
        expect(mine.windows[j].closedBy).toBe(x.closedBy);
        compared++;
      });
    });
    expect(compared).toBeGreaterThanOrEqual(3);
  });

  it('samples agree with GET /api/sky/observe (0.5″ in altitude and azimuth; airmass to 1e-3)', async () => {
    const n = await viewer.get(`/api/scenes/${sceneId}/night?from=2026-03-20T20:00:00Z&to=2026-03-21T02:00:00Z&step=30`);
    expect(n.status).toBe(200);
    const checks: [number, string][] = [[0, 'ra=83.8221&dec=-5.3911'], [1, 'ra=150.2&dec=40.1'], [3, 'body=jupiter']];
    for (const [i, q] of checks) {
      for (const k of [0, 5, 12]) {
        const s = n.data.targets[i].samples[k];
        const o = await anon.get(`/api/sky/observe?lat=${SITE.lat}&lon=${SITE.lon}&height=${SITE.height}&time=${s.time}&${q}`);
        expect(o.status).toBe(200);
        expect(Math.abs(s.altitude - o.data.altitude)).toBeLessThan(0.5 * ARCSEC);
        expect(Math.abs(((s.azimuth - o.data.azimuth + 540) % 360) - 180)).toBeLessThan(0.5 * ARCSEC);
        if (o.data.airmass === null) expect(s.airmass).toBeNull();
        else expect(Math.abs(s.airmass - o.data.airmass)).toBeLessThan(1e-3);
      }
    }
    const moon = n.data.moon.samples[4];
    const o = await anon.get(`/api/sky/observe?lat=${SITE.lat}&lon=${SITE.lon}&height=${SITE.height}&time=${moon.time}&body=moon`);
    expect(Math.abs(moon.altitude - o.data.altitude)).toBeLessThan(0.5 * ARCSEC);
  });

  it('bad parameters: 400 naming the field, nothing written', async () => {
    const before = await editor.get(`/api/scenes/${sceneId}`);
    const bad: [string, string][] = [
      ['step=0', 'step'],
      ['step=31', 'step'],
      ['step=2.5', 'step'],
      ['step=five', 'step'],
      ['from=yesterday', 'from'],
      ['to=2026-03-20T22:00:00', 'to'],
      ['from=2026-03-20T00:00:00Z&to=2026-03-21T12:00:01Z', 'to'],
      ['from=2026-03-21T00:00:00Z&to=2026-03-20T00:00:00Z', 'to'],
      ['bodies=pluto', 'bodies'],
    ];
    for (const [q, field] of bad) {
      const r = await viewer.get(`/api/scenes/${sceneId}/night?${q}`);
      expect(r.status, q).toBe(400);
      expect(r.data.error.field, q).toBe(field);
      const s = await anon.get(`/api/shared/${token}/night?${q}`);
      expect(s.status, q).toBe(400);
      expect(s.data.error.field, q).toBe(field);
    }
    const ok36 = await viewer.get(`/api/scenes/${sceneId}/night?from=2026-03-20T00:00:00Z&to=2026-03-21T12:00:00Z&step=30`);
    expect(ok36.status).toBe(200);
    const after = await editor.get(`/api/scenes/${sceneId}`);
    expect(after.data.scene.version).toBe(before.data.scene.version);
    expect(after.data.scene.updatedAt).toBe(before.data.scene.updatedAt);
  });

  it('not signed in: 401; another team: 404', async () => {
    expect((await anon.get(`/api/scenes/${sceneId}/night`)).status).toBe(401);
    const outsider = new ApiClient(server.url);
    await outsider.signIn(DEMO.outsider);
    expect((await outsider.get(`/api/scenes/${sceneId}/night`)).status).toBe(404);
  });
});

describe('GET /api/shared/:token/night', () => {
  it('the same answer as the member route, without an account; unknown token 404', async () => {
    const q = 'from=2026-03-20T20:00:00Z&to=2026-03-21T04:00:00Z&step=15&bodies=moon,saturn';
    const a = await viewer.get(`/api/scenes/${sceneId}/night?${q}`);
    const b = await anon.get(`/api/shared/${token}/night?${q}`);
    expect(b.status).toBe(200);
    expect(b.data).toEqual(a.data);
    expect(b.data.bodies.map((x: { body: string }) => x.body)).toEqual(['moon', 'saturn']);
    expect((await anon.get(`/api/shared/not-a-token-${'x'.repeat(20)}/night`)).status).toBe(404);
  });

  it('answers brotli, gzip or plain JSON as the request accepts (encoded on the compute thread), all the same data', async () => {
    const q = 'from=2026-03-20T20:00:00Z&to=2026-03-21T04:00:00Z&step=5';
    const raw = (acceptEncoding: string) =>
      new Promise<{ encoding: string | undefined; vary: string | undefined; length: number; body: Buffer }>((resolve, reject) => {
        get(`${server.url}/api/shared/${token}/night?${q}`, { headers: { 'accept-encoding': acceptEncoding } }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => resolve({ encoding: res.headers['content-encoding'], vary: res.headers.vary, length: Number(res.headers['content-length']), body: Buffer.concat(chunks) }));
        }).on('error', reject);
      });
    const plain = await raw('identity');
    expect(plain.encoding).toBeUndefined();
    expect(plain.length).toBe(plain.body.length);
    const data = JSON.parse(plain.body.toString('utf8'));
    expect(data.targets.map((t: { name: string }) => t.name)).toEqual(['Field A', 'Field B', 'Vega', 'Jupiter']);
    const br = await raw('gzip, deflate, br');
    expect(br.encoding).toBe('br');
    expect(br.vary).toMatch(/accept-encoding/i);
    expect(br.body.length).toBeLessThan(plain.body.length / 3);
    expect(JSON.parse(brotliDecompressSync(br.body).toString('utf8'))).toEqual(data);
    const gz = await raw('gzip');
    expect(gz.encoding).toBe('gzip');
    expect(JSON.parse(gunzipSync(gz.body).toString('utf8'))).toEqual(data);
  });
});

describe('comments pinned to the altitude chart', () => {
  it('a reviewer pins a comment to a target at a time; sky anchors keep working; a bad chart anchor is a 400 naming the field', async () => {
    const reviewer = new ApiClient(server.url);
    await reviewer.signIn(DEMO.reviewer);
    const chart = await reviewer.post(`/api/scenes/${sceneId}/comments`, { body: 'Field A is best here', anchor: { chart: 'altitude', target: 'Field A', time: '2026-03-20T21:30:00Z' } });
    expect(chart.status, JSON.stringify(chart.data)).toBe(201);
    const sky = await reviewer.post(`/api/scenes/${sceneId}/comments`, { body: 'South, low', anchor: { azimuth: 180, altitude: 20 } });
    expect(sky.status).toBe(201);
    const eq = await reviewer.post(`/api/scenes/${sceneId}/comments`, { body: 'Here', anchor: { ra: 83.8, dec: -5.4 } });
    expect(eq.status).toBe(201);
    const list = await viewer.get(`/api/scenes/${sceneId}/comments`);
    const anchors = list.data.comments.map((c: { anchor: unknown }) => c.anchor);
    expect(anchors).toEqual(expect.arrayContaining([{ chart: 'altitude', target: 'Field A', time: '2026-03-20T21:30:00Z' }, { azimuth: 180, altitude: 20 }, { ra: 83.8, dec: -5.4 }]));
    const before = list.data.comments.length;
    const bad = await reviewer.post(`/api/scenes/${sceneId}/comments`, { body: 'No time', anchor: { chart: 'altitude', target: 'Field A', time: 'tonight' } });
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toMatch(/^anchor/);
    expect((await viewer.get(`/api/scenes/${sceneId}/comments`)).data.comments.length).toBe(before);
  });

  it('the pinned comment is on the downloaded SVG (member and link) and numbered on the handout with its text listed', async () => {
    // Field A's altitude at the pinned instant, from the night API at a 1-minute step around it.
    const n = await viewer.get(`/api/scenes/${sceneId}/night?from=2026-03-20T21:00:00Z&to=2026-03-20T22:00:00Z&step=1`);
    const fieldA = n.data.targets.find((t: { name: string }) => t.name === 'Field A');
    const at = fieldA.samples.find((p: { time: string }) => p.time === '2026-03-20T21:30:00Z');
    expect(at.altitude).toBeGreaterThan(0);
    for (const url of [`/api/scenes/${sceneId}/night.svg`, `/api/shared/${token}/night.svg`]) {
      const r = await (url.startsWith('/api/shared') ? anon : viewer).get(url);
      expect(r.status).toBe(200);
      const svg = String(r.data);
      const marker = /<g data-comment="[^"]+" data-target="Field A" data-time="2026-03-20T21:30:00Z"><path d="M([\d.]+),([\d.]+) /.exec(svg);
      expect(marker, url).not.toBeNull();
      expect(svg).toMatch(/<title>1\. [^<]*Field A is best here — Field A at 22:30/); // Europe/Madrid, UTC+1
    }
    const handout = await viewer.get(`/scenes/${sceneId}/handout`);
    expect(handout.status).toBe(200);
    const html = String(handout.data);
    const list = /data-testid="handout-chart-comments"[^>]*>(.*?)<\/ol>/s.exec(html);
    expect(list, 'the handout lists the chart comments').not.toBeNull();
    expect(list![1]).toMatch(/<li[^>]*>Field A at 22:30[^<]*: Field A is best here — /);
    expect(html).toMatch(/<title>1\. [^<]*Field A is best here/);
  });
});
