/**
 * Imports through the built server: target-list CSV (all or nothing, 422 rows, 413 over 5 MB) and the
 * horizon-mask CSV of an envelope. Each test file builds its own world on a fresh database.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO } from './helpers/client';
import { startServer, type TestServer } from './helpers/server';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/imports/${name}`, import.meta.url));
const form = (bytes: Uint8Array, filename = 'targets.csv', fields: Record<string, string> = {}) => {
  const fd = new FormData();
  fd.set('file', new Blob([new Uint8Array(bytes)], { type: 'text/csv' }), filename);
  for (const [k, v] of Object.entries(fields)) fd.set(k, v);
  return fd;
};

let server: TestServer;
let editor: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let teamId: string;
let sceneId: string;

async function scene() {
  const r = await editor.get(`/api/scenes/${sceneId}`);
  expect(r.status).toBe(200);
  return r.data.scene as { version: number; targets: { id: string; kind: string; name: string; ra?: number; dec?: number; notes?: string; pmra?: number }[] };
}

beforeAll(async () => {
  server = await startServer();
  editor = new ApiClient(server.url);
  viewer = new ApiClient(server.url);
  outsider = new ApiClient(server.url);
  await editor.signIn(DEMO.editor);
  await viewer.signIn(DEMO.viewer);
  await outsider.signIn(DEMO.outsider);
  const me = await editor.get('/api/me');
  teamId = me.data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await editor.post('/api/scenes', {
    teamId,
    title: 'Import test scene',
    site: { name: 'Test site', lat: 51.4769, lon: 0, height: 0, timeZone: 'Europe/London' },
    time: '2024-01-15T22:00:00Z',
  });
  expect(created.status).toBe(201);
  sceneId = created.data.scene.id;
});

afterAll(async () => {
  await server?.stop();
});

describe('POST /api/scenes/:id/targets/import', () => {
  it('imports a good file: 200 {added}, one version bump, values parsed', async () => {
    const before = await scene();
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture('targets-good.csv')));
    expect(r.status, JSON.stringify(r.data)).toBe(200);
    expect(r.data.added).toBe(5);
    const after = await scene();
    expect(after.version).toBe(before.version + 1);
    expect(after.targets.map((t) => t.name)).toEqual(['Arcturus', 'Spica', 'Sirius', 'Field A', 'Calibration lamp']);
    // Arcturus 14h15m39.7s +19°10′57″ (Meeus, Astronomical Algorithms, Ex. 17.a)
    expect(after.targets[0]!.ra).toBeCloseTo(213.9154167, 6);
    expect(after.targets[0]!.dec).toBeCloseTo(19.1825, 6);
    expect(after.targets[2]!.pmra).toBe(-546.01);
    expect(after.targets[3]!.notes).toBe('dark-sky patch, for the\nvolunteers');
    expect(after.targets.every((t) => t.kind === 'custom')).toBe(true);
  });

  it('the same file again: 422, every name flagged as already in the scene, nothing written', async () => {
    const before = await scene();
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture('targets-good.csv')));
    expect(r.status).toBe(422);
    expect(r.data.error.code).toBe('invalid_rows');
    expect(r.data.rows).toHaveLength(5);
    expect(r.data.rows[0]).toEqual({ line: 2, field: 'name', message: expect.stringMatching(/already in the scene/) });
    expect((await scene()).version).toBe(before.version);
  });

  it('out-of-range values: 422 with line and field for each bad row, the good row not written either', async () => {
    const before = await scene();
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture('targets-out-of-range.csv')));
    expect(r.status).toBe(422);
    const lines = new Set(r.data.rows.map((x: { line: number }) => x.line));
    expect([...lines].sort((a, b) => (a as number) - (b as number))).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11]);
    expect(r.data.rows.find((x: { line: number }) => x.line === 4).field).toBe('dec');
    const after = await scene();
    expect(after.version).toBe(before.version);
    expect(after.targets.find((t) => t.name === 'Good one')).toBeUndefined();
  });

  it('duplicate names inside the file: 422 on the repeat', async () => {
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture('targets-duplicates.csv')));
    expect(r.status).toBe(422);
    expect(r.data.rows).toEqual([{ line: 4, field: 'name', message: expect.stringMatching(/duplicate/) }]);
  });

  it.each([
    ['targets-latin1.csv', 'encoding'],
    ['binary-junk.bin', 'binary'],
    ['targets-missing-columns.csv', 'missing_columns'],
  ])('%s: 422 %s, nothing written', async (file, code) => {
    const before = await scene();
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture(file)));
    expect(r.status).toBe(422);
    expect(r.data.error.code).toBe(code);
    expect(r.data.error.message).toBeTruthy();
    expect((await scene()).version).toBe(before.version);
  });

  it('sexagesimal variants, including "-0 30 00" keeping its sign', async () => {
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, form(fixture('targets-sexagesimal.csv')));
    expect(r.status, JSON.stringify(r.data)).toBe(200);
    expect(r.data.added).toBe(11);
    const t = (await scene()).targets;
    for (const name of ['spaces', 'colons', 'letters', 'letters spaced', 'unicode marks', 'ascii marks', 'degrees', 'hours suffix']) {
      const x = t.find((y) => y.name === name)!;
      expect(x.ra, name).toBeCloseTo(213.9154167, 6);
      expect(x.dec, name).toBeCloseTo(19.1825, 6);
    }
    for (const name of ['minus zero', 'unicode minus', 'colon minus zero']) expect(t.find((y) => y.name === name)!.dec).toBe(-0.5);
  });

  it('a 6 MB file: 413, refused from Content-Length, nothing written', async () => {
    const before = await scene();
    const line = 'Filler target 0000000,10.0,10.0,2000,0,0,padding padding padding padding padding padding\n';
    const big = Buffer.alloc(6 * 1024 * 1024, 0x20);
    Buffer.from('name,ra,dec,epoch,pmra,pmdec,notes\n').copy(big, 0);
    for (let off = 40; off + line.length < big.length; off += line.length) Buffer.from(line).copy(big, off);
    const r = await editor.request('POST', `/api/scenes/${sceneId}/targets/import`, form(big));
    expect(r.status).toBe(413);
    const body = await r.json();
    expect(body.error.code).toBe('too_large');
    expect((await scene()).version).toBe(before.version);
  });

  it('a 6 MB body without Content-Length (chunked): 413 while streaming', async () => {
    const chunk = new Uint8Array(64 * 1024).fill(0x41);
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        if (sent >= 6 * 1024 * 1024) return c.close();
        sent += chunk.length;
        c.enqueue(chunk);
      },
    });
    const r = await fetch(`${server.url}/api/scenes/${sceneId}/targets/import`, {
      method: 'POST',
      headers: { cookie: [...editor.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'content-type': 'text/csv' },
      body: stream,
      // @ts-expect-error Node's fetch needs duplex for a streamed body
      duplex: 'half',
    }).catch((e: unknown) => e as Error);
    // The server answers 413 as soon as the count passes 5 MB; the client may see the answer or a closed socket.
    if (r instanceof Response) expect(r.status).toBe(413);
    else expect(String(r)).toMatch(/fetch failed|socket|closed|EPIPE|ECONNRESET/i);
    expect(sent).toBeLessThan(6 * 1024 * 1024 + 1);
  });

  it('roles: viewer 403, outsider 404, anonymous 401; no file 400', async () => {
    const good = fixture('targets-duplicates.csv');
    expect((await viewer.post(`/api/scenes/${sceneId}/targets/import`, form(good))).status).toBe(403);
    expect((await outsider.post(`/api/scenes/${sceneId}/targets/import`, form(good))).status).toBe(404);
    expect((await new ApiClient(server.url).post(`/api/scenes/${sceneId}/targets/import`, form(good))).status).toBe(401);
    const fd = new FormData();
    fd.set('other', 'x');
    const r = await editor.post(`/api/scenes/${sceneId}/targets/import`, fd);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('file');
  });
});

describe('POST /api/scenes/:id/targets/preview', () => {
  it('returns parsed rows with errors and writes nothing', async () => {
    const before = await scene();
    const r = await editor.post(`/api/scenes/${sceneId}/targets/preview`, form(fixture('targets-out-of-range.csv')));
    expect(r.status).toBe(200);
    expect(r.data.valid).toBe(false);
    expect(r.data.rows[0]).toMatchObject({ line: 2, name: 'Good one', ra: 10, dec: 10, errors: [] });
    expect(r.data.rows[2].errors[0].field).toBe('dec');
    expect((await scene()).version).toBe(before.version);
  });
});

describe('POST /api/envelopes/:id/horizon', () => {
  let envelopeId: string;
  beforeAll(async () => {
    const r = await editor.post(`/api/teams/${teamId}/envelopes`, { name: 'Import test envelope', minAltitude: 10 });
    expect(r.status, JSON.stringify(r.data)).toBe(201);
    envelopeId = (r.data.envelope ?? r.data).id;
  });
  const EXPECTED = [
    [0, 5],
    [90, 12.5],
    [180, 20],
    [270, 8],
  ];
  it.each([
    ['horizon-north-east.csv', undefined],
    ['horizon-south.csv', 'south'],
    ['horizon-signed.csv', 'signed'],
  ])('%s (convention %s) replaces the mask, sorted, azimuth from north through east', async (file, convention) => {
    const r = await editor.post(`/api/envelopes/${envelopeId}/horizon`, form(fixture(file), 'mask.csv', convention ? { convention } : {}));
    expect(r.status, JSON.stringify(r.data)).toBe(200);
    expect(r.data.envelope.horizonMask).toEqual(EXPECTED);
    expect(r.data.envelope.minAltitude).toBe(10);
  });
  it('bad rows: 422 with line and field; the mask is unchanged', async () => {
    await editor.post(`/api/envelopes/${envelopeId}/horizon`, form(fixture('horizon-north-east.csv')));
    const r = await editor.post(`/api/envelopes/${envelopeId}/horizon`, form(fixture('horizon-bad.csv')));
    expect(r.status).toBe(422);
    expect(r.data.rows.map((x: { line: number; field: string }) => [x.line, x.field])).toEqual([
      [3, 'azimuth'],
      [4, 'elevation'],
    ]);
    const env = await editor.get(`/api/envelopes/${envelopeId}`);
    expect(env.data.envelope.horizonMask).toEqual(EXPECTED);
  });
  it('an unknown convention is a 400 naming the field; a viewer gets 403', async () => {
    const r = await editor.post(`/api/envelopes/${envelopeId}/horizon`, form(fixture('horizon-south.csv'), 'm.csv', { convention: 'west' }));
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('convention');
    expect((await viewer.post(`/api/envelopes/${envelopeId}/horizon`, form(fixture('horizon-south.csv')))).status).toBe(403);
  });
});
