/**
 * Compression on the wire: built assets go out in the brotli or gzip form made at build time, chosen by
 * Accept-Encoding (RFC 9110 §12.5.3: q-values, q=0 refuses) with `Vary: Accept-Encoding` (§12.5.5);
 * HTML and JSON answers of 1 kB or more are compressed; the shared-scene read answers from the
 * compressed forms kept beside its cache, and they decode to exactly the plain answer.
 */
import http from 'node:http';
import { readdirSync } from 'node:fs';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';

let s: TestServer;
let token = '';

/** A raw GET (Node's fetch would add its own Accept-Encoding and decode the body). */
function get(path: string, acceptEncoding?: string): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((res, rej) => {
    const req = http.get(s.url + path, { headers: acceptEncoding === undefined ? {} : { 'accept-encoding': acceptEncoding } }, (r) => {
      const chunks: Buffer[] = [];
      r.on('data', (c) => chunks.push(c));
      r.on('end', () => res({ status: r.statusCode ?? 0, headers: r.headers, body: Buffer.concat(chunks) }));
    });
    req.on('error', rej);
  });
}
const decode = (r: { headers: http.IncomingHttpHeaders; body: Buffer }) =>
  r.headers['content-encoding'] === 'br' ? brotliDecompressSync(r.body) : r.headers['content-encoding'] === 'gzip' ? gunzipSync(r.body) : r.body;

beforeAll(async () => {
  s = await startServer();
  const editor = new ApiClient(s.url);
  await editor.signIn(DEMO.editor);
  const { scenes } = (await editor.get('/api/scenes')).data as { scenes: { id: string; title: string }[] };
  const sc = scenes.find((x) => x.title === 'Equinox evening briefing')!;
  token = (await editor.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).data.token;
});
afterAll(async () => {
  await s?.stop();
});

describe('static assets', () => {
  const js = readdirSync('dist/client/_astro').filter((f) => f.endsWith('.js') && readdirSync('dist/client/_astro').includes(f + '.br')).sort()[0]!;
  test('brotli when accepted, gzip when only that is, the plain file otherwise; the same bytes once decoded', async () => {
    const plain = await get(`/_astro/${js}`);
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers.vary).toMatch(/accept-encoding/i);
    const br = await get(`/_astro/${js}`, 'gzip, deflate, br');
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers['content-type']).toMatch(/javascript/);
    expect(br.headers.vary).toMatch(/accept-encoding/i);
    expect(br.body.length).toBeLessThan(plain.body.length * 0.6);
    expect(decode(br).equals(plain.body)).toBe(true);
    const gz = await get(`/_astro/${js}`, 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(decode(gz).equals(plain.body)).toBe(true);
    expect((await get(`/_astro/${js}`, 'br;q=0, gzip;q=0.5')).headers['content-encoding']).toBe('gzip');
    expect((await get(`/_astro/${js}`, 'identity')).headers['content-encoding']).toBeUndefined();
    expect(br.headers['cache-control']).toMatch(/immutable/);
  });
  test('/favicon.ico and /favicon.svg are served', async () => {
    expect((await get('/favicon.ico')).status).toBe(200);
    expect((await get('/favicon.svg')).headers['content-type']).toMatch(/svg/);
  });
});

describe('pages and API answers', () => {
  test('an HTML page over 1 kB is compressed, with Vary', async () => {
    const plain = await get('/');
    const br = await get('/', 'br, gzip');
    expect(plain.body.length).toBeGreaterThan(1024);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.vary).toMatch(/accept-encoding/i);
    const page = decode(br).toString();
    expect(page).toMatch(/^<!DOCTYPE html>/i);
    expect(Math.abs(page.length - plain.body.length)).toBeLessThan(plain.body.length * 0.02); // the same page
  });
  test('the shared-scene read: compressed forms decode to the plain answer, a small answer goes out plain', async () => {
    const plain = await get(`/api/shared/${token}`);
    expect(plain.status).toBe(200);
    expect(plain.body.length).toBeGreaterThan(1024);
    for (const ae of ['br', 'gzip', 'gzip, deflate, br']) {
      const r = await get(`/api/shared/${token}`, ae);
      expect(r.headers['content-encoding']).toBe(ae === 'gzip' ? 'gzip' : 'br');
      expect(r.headers.vary).toMatch(/accept-encoding/i);
      expect(Number(r.headers['content-length'])).toBe(r.body.length);
      expect(JSON.parse(decode(r).toString())).toEqual(JSON.parse(plain.body.toString()));
    }
    const again = await get(`/api/shared/${token}`, 'br');
    expect(again.body.equals((await get(`/api/shared/${token}`, 'br')).body)).toBe(true);
    const small = await get('/api/health', 'br, gzip');
    expect(small.status).toBe(200);
    expect(small.body.length).toBeLessThan(1024);
    expect(small.headers['content-encoding']).toBeUndefined();
    const missing = await get('/api/shared/nope', 'br');
    expect(missing.status).toBe(404);
  });
});
