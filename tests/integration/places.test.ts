/**
 * Place search and time-zone lookup over HTTP (API contract: GET /api/places, GET /api/places/zone):
 * the answer's shape, 400 naming the field for bad parameters, and the rate limit.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';

let s: TestServer;
let c: ApiClient;
beforeAll(async () => {
  s = await startServer({ seed: false });
  c = new ApiClient(s.url);
});
afterAll(() => s?.stop());

describe('GET /api/places', () => {
  test('answers towns with the contract fields, prefix matches first, ranked by population', async () => {
    const r = await c.get('/api/places?q=paris&limit=8');
    expect(r.status).toBe(200);
    expect(r.data.places.length).toBeGreaterThan(0);
    for (const p of r.data.places) {
      expect(Object.keys(p)).toEqual(expect.arrayContaining(['name', 'country', 'admin', 'lat', 'lon', 'timeZone', 'population']));
      expect(typeof p.lat).toBe('number');
      expect(typeof p.population).toBe('number');
    }
    // Paris, France (2.1 million in GeoNames) before Paris, Texas and the other towns of the name
    expect(r.data.places[0]).toMatchObject({ name: 'Paris', country: 'FR', timeZone: 'Europe/Paris' });
    expect(r.data.places.some((p: any) => p.country === 'US' && p.admin === 'Texas' && p.timeZone === 'America/Chicago')).toBe(true);
    const pops = r.data.places.map((p: any) => p.population);
    expect(pops).toEqual([...pops].sort((a: number, b: number) => b - a));
  });

  test('a small observatory town is found (Coonabarabran, NSW: Siding Spring; zone from memory)', async () => {
    const r = await c.get('/api/places?q=coonabarabran');
    expect(r.data.places[0]).toMatchObject({ name: 'Coonabarabran', country: 'AU', admin: 'New South Wales', timeZone: 'Australia/Sydney' });
  });

  test('accent- and case-insensitive; limit respected', async () => {
    const r = await c.get(`/api/places?q=${encodeURIComponent('BOGOTÁ')}&limit=2`);
    expect(r.status).toBe(200);
    expect(r.data.places).toHaveLength(2);
    expect(r.data.places[0]).toMatchObject({ name: 'Bogotá', country: 'CO', timeZone: 'America/Bogota' });
    const plain = await c.get('/api/places?q=bogota&limit=1');
    expect(plain.data.places[0].name).toBe('Bogotá');
  });

  test.each([
    ['/api/places', 'q'],
    ['/api/places?q=', 'q'],
    ['/api/places?q=%20%20', 'q'],
    [`/api/places?q=${'x'.repeat(101)}`, 'q'],
    ['/api/places?q=paris&limit=0', 'limit'],
    ['/api/places?q=paris&limit=51', 'limit'],
    ['/api/places?q=paris&limit=2.5', 'limit'],
    ['/api/places?q=paris&limit=ten', 'limit'],
  ])('%s → 400 naming %s', async (path, field) => {
    const r = await c.get(path);
    expect(r.status).toBe(400);
    expect(r.data.error).toMatchObject({ field });
  });
});

describe('GET /api/places/zone', () => {
  test('the zone at Cerro Paranal (from memory: Chile keeps America/Santiago)', async () => {
    const r = await c.get('/api/places/zone?lat=-24.627&lon=-70.404');
    expect(r.status).toBe(200);
    expect(r.data).toEqual({ timeZone: 'America/Santiago' });
  });

  test.each([
    ['/api/places/zone?lon=10', 'lat'],
    ['/api/places/zone?lat=91&lon=10', 'lat'],
    ['/api/places/zone?lat=abc&lon=10', 'lat'],
    ['/api/places/zone?lat=10', 'lon'],
    ['/api/places/zone?lat=10&lon=181', 'lon'],
  ])('%s → 400 naming %s', async (path, field) => {
    const r = await c.get(path);
    expect(r.status).toBe(400);
    expect(r.data.error).toMatchObject({ field });
  });
});

test('rate limited per client address: 429 with Retry-After once the minute’s budget is spent', async () => {
  let limited: Response | null = null;
  // The window is a fixed wall-clock minute: 1,900 requests put more than 600 into one window even when a
  // slow machine spreads them over three windows.
  for (let i = 0; i < 1900 && !limited; i += 25) {
    const batch = await Promise.all(Array.from({ length: 25 }, () => fetch(`${s.url}/api/places/zone?lat=10&lon=10`)));
    limited = batch.find((r) => r.status === 429) ?? null;
    for (const r of batch) await r.arrayBuffer();
  }
  expect(limited?.status).toBe(429);
  expect(Number(limited!.headers.get('retry-after'))).toBeGreaterThan(0);
});
