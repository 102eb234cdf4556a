/**
 * Exports through the built server: positions CSV (checked against the sky engine's /api/sky/observe and
 * against a published ERFA value), windows CSV, the armilla-scene JSON round trip, the VOTable, share-link
 * exports, the PNG thumbnail and the printable handout.
 */
import { deflateSync } from 'node:zlib';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO } from './helpers/client';
import { startServer, type TestServer } from './helpers/server';

const ARCSEC = 1 / 3600;
/** Sirius, ICRS α 06h45m08.91728s δ −16°42′58.0171″ (reference-values.md E1). */
const SIRIUS = { ra: (6 + 45 / 60 + 8.91728 / 3600) * 15, dec: -(16 + 42 / 60 + 58.0171 / 3600) };
const SITE = { name: 'E1 test site', lat: 51.4769, lon: 0, height: 0, timeZone: 'Europe/London' };
const TIME = '2024-01-15T22:00:00Z';

let server: TestServer;
let editor: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let anon: ApiClient;
let teamId: string;
let sceneId: string;

/** PUT raw bytes with a client's session (the shared ApiClient sends JSON, strings and forms only). */
const putBytes = (c: ApiClient, path: string, bytes: Uint8Array, type: string) =>
  fetch(server.url + path, {
    method: 'PUT',
    headers: { cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'content-type': type },
    body: new Blob([new Uint8Array(bytes)]),
  });

const csv = (text: string) => Papa.parse<string[]>(text.trimEnd(), { newline: '\r\n' }).data;

/** A 1×1 PNG built from the spec (ISO/IEC 15948): signature, IHDR, IDAT, IEND with CRC-32. */
function tinyPng(): Uint8Array {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (b: Buffer) => {
    let c = 0xffffffff;
    for (const x of b) c = crcTable[(c ^ x) & 0xff]! ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const c = Buffer.alloc(4);
    c.writeUInt32BE(crc(td));
    return Buffer.concat([len, td, c]);
  };
  const ihdr = Buffer.from([0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0]);
  const idat = deflateSync(Buffer.from([0, 10, 20, 30]));
  return new Uint8Array(
    Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', idat), chunk('IEND', Buffer.alloc(0))]),
  );
}

beforeAll(async () => {
  server = await startServer();
  editor = new ApiClient(server.url);
  viewer = new ApiClient(server.url);
  outsider = new ApiClient(server.url);
  anon = new ApiClient(server.url);
  await editor.signIn(DEMO.editor);
  await viewer.signIn(DEMO.viewer);
  await outsider.signIn(DEMO.outsider);
  const me = await editor.get('/api/me');
  teamId = me.data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await editor.post('/api/scenes', {
    teamId,
    title: 'Export test: Sirius at E1',
    site: SITE,
    time: TIME,
    envelope: { name: 'Test 0.6 m', minAltitude: 15, maxAltitude: 85, horizonMask: [[0, 5], [90, 12.5], [180, 20], [270, 8]] },
    targets: [
      { id: 't1', kind: 'custom', name: 'Sirius (E1)', ra: SIRIUS.ra, dec: SIRIUS.dec, epoch: 2000, notes: 'ICRS; check value E1' },
      { id: 't2', kind: 'custom', name: 'Field "A" & <B>, east', ra: 95.5, dec: 5.25 },
      { id: 't3', kind: 'star', name: 'Vega', hr: 7001 },
      { id: 't4', kind: 'body', name: 'Jupiter', body: 'jupiter' },
    ],
    pins: [{ id: 'p1', kind: 'label', frame: 'horizontal', points: [[180, 30]], label: 'South' }],
    steps: [
      { id: 's1', title: 'Sunset', time: '2024-01-15T16:10:00Z', caption: 'The **Sun** sets. <script>alert(1)</script>' },
      { id: 's2', title: 'Sirius', time: TIME, caption: '- Look *south*\n- Find [Sirius](javascript:alert(1))' },
    ],
  });
  expect(created.status, JSON.stringify(created.data)).toBe(201);
  sceneId = created.data.scene.id;
});

afterAll(async () => {
  await server?.stop();
});

describe('GET /api/scenes/:id/export.csv', () => {
  it('one RFC 4180 row a target, as an attachment', async () => {
    const r = await viewer.request('GET', `/api/scenes/${sceneId}/export.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(r.headers.get('content-disposition')).toMatch(/^attachment; filename="/);
    const rows = csv(await r.text());
    expect(rows[0]!.slice(0, 10)).toEqual(['name', 'ra', 'dec', 'azimuth', 'altitude', 'airmass', 'next_rise', 'next_transit', 'next_set', 'inside_envelope']);
    expect(rows.slice(1).map((x) => x[0])).toEqual(['Sirius (E1)', 'Field "A" & <B>, east', 'Vega', 'Jupiter']);
  });

  it('Sirius matches ERFA atco13 (E1: A 162.938748°, standard-refraction alt 20.279789°; ±5″) and the sky engine', async () => {
    const r = await editor.request('GET', `/api/scenes/${sceneId}/export.csv?time=${TIME}`);
    const rows = csv(await r.text());
    const h = rows[0]!;
    const s = Object.fromEntries(h.map((k, i) => [k, rows[1]![i]!]));
    expect(Math.abs(Number(s.azimuth) - 162.938748)).toBeLessThan(5 * ARCSEC);
    expect(Math.abs(Number(s.altitude) - 20.279789)).toBeLessThan(5 * ARCSEC);
    const o = await anon.get(`/api/sky/observe?lat=${SITE.lat}&lon=${SITE.lon}&height=0&time=${TIME}&ra=${SIRIUS.ra}&dec=${SIRIUS.dec}`);
    expect(o.status).toBe(200);
    expect(Number(s.azimuth)).toBeCloseTo(o.data.azimuth, 5);
    expect(Number(s.altitude)).toBeCloseTo(o.data.altitude, 5);
    expect(Number(s.airmass)).toBeCloseTo(o.data.airmass, 3);
    // Envelope: floor 15°, mask 20° due south interpolated to ~18.7° at A 163° → Sirius at 20.28° is inside.
    expect(s.inside_envelope).toBe('true');
    expect(s.next_transit! > TIME).toBe(true);
  });

  it('?time= moves the instant: two hours earlier Sirius is 10.63° up (E2, standard refraction) and below the floor', async () => {
    const rows = csv(await (await editor.request('GET', `/api/scenes/${sceneId}/export.csv?time=2024-01-15T20:00:00Z`)).text());
    const s = Object.fromEntries(rows[0]!.map((k, i) => [k, rows[1]![i]!]));
    // reference-values.md E2: A 134.770788°, alt 10.628579° (ERFA atco13); ~20″ allowed at 10° for another refraction model.
    expect(Math.abs(Number(s.altitude) - 10.628579)).toBeLessThan(20 * ARCSEC);
    expect(Math.abs(Number(s.azimuth) - 134.770788)).toBeLessThan(5 * ARCSEC);
    expect(s.inside_envelope).toBe('false');
    expect(s.envelope_violations).toMatch(/minAltitude/);
  });

  it('bad time is a 400 naming the field; outsider 404; anonymous 401', async () => {
    const r = await editor.get(`/api/scenes/${sceneId}/export.csv?time=2024-01-15T22:00:00`);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('time');
    expect((await outsider.get(`/api/scenes/${sceneId}/export.csv`)).status).toBe(404);
    expect((await anon.get(`/api/scenes/${sceneId}/export.csv`)).status).toBe(401);
  });
});

describe('GET /api/scenes/:id/windows.csv', () => {
  it('lists windows inside the envelope over the span', async () => {
    const r = await viewer.request('GET', `/api/scenes/${sceneId}/windows.csv?from=2024-01-15T18:00:00Z&to=2024-01-16T06:00:00Z`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-disposition')).toMatch(/^attachment/);
    const rows = csv(await r.text());
    expect(rows[0]).toEqual(['name', 'start', 'end', 'duration_min', 'opened_by', 'closed_by', 'note']);
    const sirius = rows.find((x) => x[0] === 'Sirius (E1)')!;
    expect(sirius[1]! > '2024-01-15T20:00:00Z' && sirius[1]! < '2024-01-15T22:00:00Z').toBe(true);
    expect(Number(sirius[3])).toBeGreaterThan(60);
  });
  it('refuses a reversed or over-long span', async () => {
    expect((await editor.get(`/api/scenes/${sceneId}/windows.csv?from=2024-01-16T00:00:00Z&to=2024-01-15T00:00:00Z`)).status).toBe(400);
    expect((await editor.get(`/api/scenes/${sceneId}/windows.csv?from=2024-01-01T00:00:00Z&to=2024-03-01T00:00:00Z`)).status).toBe(400);
  });
});

describe('JSON export and import', () => {
  it('export → import gives an equal scene in a new id', async () => {
    const ex = await viewer.get(`/api/scenes/${sceneId}/export.json`);
    expect(ex.status).toBe(200);
    expect(ex.headers.get('content-disposition')).toMatch(/^attachment/);
    expect(ex.data).toMatchObject({ format: 'armilla-scene', formatVersion: 1 });
    const im = await editor.post('/api/scenes/import', { teamId, ...ex.data });
    expect(im.status, JSON.stringify(im.data)).toBe(201);
    expect(im.data.scene.id).not.toBe(sceneId);
    const a = (await editor.get(`/api/scenes/${sceneId}`)).data.scene;
    const b = (await editor.get(`/api/scenes/${im.data.scene.id}`)).data.scene;
    for (const k of ['title', 'description', 'site', 'time', 'layers', 'camera', 'envelope', 'targets', 'pins', 'steps']) expect(b[k], k).toEqual(a[k]);
    expect(b.version).toBe(1);
  });
  it('multipart file + teamId works too', async () => {
    const ex = await editor.get(`/api/scenes/${sceneId}/export.json`);
    const fd = new FormData();
    fd.set('file', new Blob([JSON.stringify(ex.data)], { type: 'application/json' }), 'scene.armilla.json');
    fd.set('teamId', teamId);
    const r = await editor.post('/api/scenes/import', fd);
    expect(r.status, JSON.stringify(r.data)).toBe(201);
    expect(r.data.scene.title).toBe('Export test: Sirius at E1');
  });
  it('invalid files are 422 naming the field; nothing created', async () => {
    const ex = (await editor.get(`/api/scenes/${sceneId}/export.json`)).data;
    const count = (await editor.get('/api/scenes')).data.scenes.length;
    const v2 = await editor.post('/api/scenes/import', { teamId, ...ex, formatVersion: 2 });
    expect(v2.status).toBe(422);
    expect(v2.data.error.field).toBe('formatVersion');
    const badLat = await editor.post('/api/scenes/import', { teamId, ...ex, scene: { ...ex.scene, site: { ...ex.scene.site, lat: 123 } } });
    expect(badLat.status).toBe(422);
    expect(badLat.data.error.field).toBe('scene.site.lat');
    const notJson = new FormData();
    notJson.set('file', new Blob(['not json'], { type: 'application/json' }), 'x.json');
    notJson.set('teamId', teamId);
    expect((await editor.post('/api/scenes/import', notJson)).status).toBe(422);
    expect((await editor.get('/api/scenes')).data.scenes.length).toBe(count);
  });
  it('roles: viewer cannot import (403), another team is 404, teamId is required (400)', async () => {
    const ex = (await editor.get(`/api/scenes/${sceneId}/export.json`)).data;
    expect((await viewer.post('/api/scenes/import', { teamId, ...ex })).status).toBe(403);
    expect((await outsider.post('/api/scenes/import', { teamId, ...ex })).status).toBe(404);
    const r = await editor.post('/api/scenes/import', ex);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('teamId');
  });
  it('the JSON Schema is served', async () => {
    const r = await anon.get('/schemas/armilla-scene-1.schema.json');
    expect(r.status).toBe(200);
    expect(r.data.properties.format.const).toBe('armilla-scene');
  });
});

describe('GET /api/scenes/:id/targets.vot', () => {
  it('is a well-formed VOTable 1.4 in ICRS with escaped names', async () => {
    const r = await viewer.request('GET', `/api/scenes/${sceneId}/targets.vot`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/votable\+xml/);
    const xml = await r.text();
    expect(XMLValidator.validate(xml)).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(xml);
    expect(doc.VOTABLE.version).toBe('1.4');
    expect(doc.VOTABLE.RESOURCE.COOSYS).toMatchObject({ system: 'ICRS', epoch: 'J2000' });
    const fields = doc.VOTABLE.RESOURCE.TABLE.FIELD as { name: string; ucd: string; unit?: string }[];
    expect(fields.find((f) => f.name === 'ra')).toMatchObject({ ucd: 'pos.eq.ra;meta.main', unit: 'deg' });
    expect(fields.find((f) => f.name === 'dec')).toMatchObject({ ucd: 'pos.eq.dec;meta.main', unit: 'deg' });
    const rows = doc.VOTABLE.RESOURCE.TABLE.DATA.TABLEDATA.TR as { TD: unknown[] }[];
    expect(rows.map((x) => x.TD[0])).toEqual(['Sirius (E1)', 'Field "A" & <B>, east', 'Vega', 'Jupiter']);
    expect(xml).toContain('Field &quot;A&quot; &amp; &lt;B&gt;, east');
    expect(Number(rows[0]!.TD[2])).toBeCloseTo(SIRIUS.ra, 7);
    // Vega, HR 7001: BSC5 J2000 α 18h36m56.3s = 279.23°, δ +38.78° (Bright Star Catalogue, 5th rev. ed.)
    expect(Number(rows[2]!.TD[2])).toBeCloseTo(279.23, 1);
    expect(Number(rows[2]!.TD[3])).toBeCloseTo(38.78, 1);
  });
});

describe('share-link exports', () => {
  let token: string;
  let linkId: string;
  beforeAll(async () => {
    const r = await editor.post(`/api/scenes/${sceneId}/links`, { role: 'viewer' });
    expect(r.status).toBe(201);
    token = r.data.token;
    linkId = r.data.id;
  });
  it('a live token exports CSV, windows, JSON and VOTable without an account', async () => {
    for (const p of ['export.csv', 'export-windows.csv', 'export.json', 'export.vot']) {
      const r = await anon.request('GET', `/api/shared/${token}/${p}`);
      expect(r.status, p).toBe(200);
      expect(r.headers.get('content-disposition'), p).toMatch(/^attachment/);
    }
    const j = await anon.get(`/api/shared/${token}/export.json`);
    expect(j.data.source.teamId).toBe(teamId);
  });
  it('the handout works through the link; a revoked token is 404 everywhere', async () => {
    const h = await anon.request('GET', `/s/${token}/handout`);
    expect(h.status).toBe(200);
    expect(await h.text()).toContain('id="sky-chart"');
    expect((await editor.del(`/api/scenes/${sceneId}/links/${linkId}`)).status).toBe(204);
    expect((await anon.get(`/api/shared/${token}/export.csv`)).status).toBe(404);
    expect((await anon.request('GET', `/s/${token}/handout`)).status).toBe(404);
    expect((await anon.get(`/api/shared/not-a-real-token-at-all/export.json`)).status).toBe(404);
  });
});

describe('thumbnail', () => {
  const png = tinyPng();
  it('PUT image/png (editor) → 204, GET thumbnail.png returns the same bytes (viewer)', async () => {
    const put = await putBytes(editor, `/api/scenes/${sceneId}/thumbnail`, png, 'image/png');
    expect(put.status).toBe(204);
    const get = await viewer.request('GET', `/api/scenes/${sceneId}/thumbnail.png`);
    expect(get.status).toBe(200);
    expect(get.headers.get('content-type')).toBe('image/png');
    expect(new Uint8Array(await get.arrayBuffer())).toEqual(png);
    const etag = get.headers.get('etag')!;
    const again = await viewer.request('GET', `/api/scenes/${sceneId}/thumbnail.png`, undefined, { 'if-none-match': etag });
    expect(again.status).toBe(304);
  });
  it('refuses a non-PNG (422), a wrong type (400), over 2 MB (413), a viewer (403)', async () => {
    const gif = new Uint8Array(Buffer.from('GIF89a' + 'x'.repeat(100)));
    expect((await putBytes(editor, `/api/scenes/${sceneId}/thumbnail`, gif, 'image/png')).status).toBe(422);
    expect((await putBytes(editor, `/api/scenes/${sceneId}/thumbnail`, png, 'image/gif')).status).toBe(400);
    const big = new Uint8Array(2 * 1024 * 1024 + 10);
    big.set(png.slice(0, 33));
    expect((await putBytes(editor, `/api/scenes/${sceneId}/thumbnail`, big, 'image/png')).status).toBe(413);
    expect((await putBytes(viewer, `/api/scenes/${sceneId}/thumbnail`, png, 'image/png')).status).toBe(403);
  });
});

describe('handout page', () => {
  it('renders for a team member with the chart, events, cautions and safely rendered captions', async () => {
    const r = await viewer.request('GET', `/scenes/${sceneId}/handout?paper=a4`);
    expect(r.status).toBe(200);
    const html = await r.text();
    expect(html).toContain('id="sky-chart"');
    expect(html).toContain('size: A4 portrait');
    expect(html).toContain('Computed times are for planning; local rules and instrument interlocks take precedence.');
    expect(html).toMatch(/Solar caution/); // the first step is at sunset with the Sun still up
    expect(html).toContain('<strong>Sun</strong>');
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).not.toMatch(/href="javascript:/i);
    expect(html).toMatch(/civil dusk/);
  });
  it('every demo scene exports and prints (no 5xx on real seed data)', async () => {
    const list = (await viewer.get('/api/scenes')).data.scenes as { id: string; title: string }[];
    expect(list.length).toBeGreaterThan(1);
    for (const sc of list) {
      for (const p of [`/scenes/${sc.id}/handout`, `/api/scenes/${sc.id}/export.csv`, `/api/scenes/${sc.id}/windows.csv`, `/api/scenes/${sc.id}/export.json`, `/api/scenes/${sc.id}/targets.vot`]) {
        const r = await viewer.request('GET', p);
        expect(r.status, `${sc.title}: ${p}`).toBe(200);
        await r.arrayBuffer();
      }
    }
  });
  it('outsider gets 404, anonymous is sent to sign in', async () => {
    expect((await outsider.request('GET', `/scenes/${sceneId}/handout`)).status).toBe(404);
    const r = await anon.request('GET', `/scenes/${sceneId}/handout`);
    expect([302, 303]).toContain(r.status);
  });
});
