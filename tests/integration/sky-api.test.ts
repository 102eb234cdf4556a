import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';
import stars from '../reference/stars.json';

let s: TestServer;
let c: ApiClient;
beforeAll(async () => {
  s = await startServer({ seed: false });
  c = new ApiClient(s.url);
});
afterAll(() => s?.stop());

const qs = (o: Record<string, string | number>) => new URLSearchParams(Object.entries(o).map(([k, v]) => [k, String(v)])).toString();

describe('GET /api/sky/observe', () => {
  it('E1 (IAU SOFA atco13, reference-values.md): Sirius-like star from Greenwich, with and without refraction', async () => {
    const base = { lat: 51.4769, lon: 0, time: '2024-01-15T22:00:00Z', ra: 101.28715533, dec: -16.71611586 };
    const none = await c.json('GET', `/api/sky/observe?${qs({ ...base, refraction: 'none' })}`);
    expect(none.status).toBe(200);
    // atco13: A 162.938748°, alt 20.236391° (no refraction); 20.279789° (standard); 1″
    expect(Math.abs(none.data.azimuth - 162.938748) * 3600 * Math.cos((20.24 * Math.PI) / 180)).toBeLessThan(1);
    expect(Math.abs(none.data.altitude - 20.236391) * 3600).toBeLessThan(1);
    const std = await c.json('GET', `/api/sky/observe?${qs(base)}`);
    expect(Math.abs(std.data.altitude - 20.279789) * 3600).toBeLessThan(1);
    expect(std.data.constellation).toBe('CMa');
    expect(std.data.airmass).toBeGreaterThan(2.8);
    for (const k of ['azimuth', 'altitude', 'hourAngle', 'raOfDate', 'decOfDate', 'lst', 'airmass', 'constellation']) expect(std.data).toHaveProperty(k);
  });

  it('a body, and airmass null below the horizon', async () => {
    const r = await c.json('GET', `/api/sky/observe?${qs({ lat: 51.5, lon: 0, time: '2024-01-15T00:00:00Z', body: 'sun' })}`);
    expect(r.status).toBe(200);
    expect(r.data.altitude).toBeLessThan(0);
    expect(r.data.airmass).toBeNull();
    expect(r.data.constellation).toBe('Sgr');
  });

  it.each([
    [{ lat: 91, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10 }, 'lat'],
    [{ lat: 10, lon: 0, time: '2024-01-15 22:00', ra: 10, dec: 10 }, 'time'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00', ra: 10, dec: 10 }, 'time'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 400, dec: 10 }, 'ra'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: -95 }, 'dec'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', body: 'vulcan' }, 'body'],
  ])('400 naming the field for %o', async (q, field) => {
    const r = await c.json('GET', `/api/sky/observe?${qs(q)}`);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect(typeof r.data.error.message).toBe('string');
  });
});

describe('GET /api/sky/events', () => {
  it('A14 (Meeus Ex. 15.a): Venus at Boston, 1988-03-20, within a minute', async () => {
    const r = await c.json('GET', `/api/sky/events?${qs({ lat: 42 + 20 / 60, lon: -(71 + 5 / 60), height: 0, body: 'venus', from: '1988-03-20T00:00:00Z', to: '1988-03-21T00:00:00Z' })}`);
    expect(r.status).toBe(200);
    const at = (k: string) => new Date(r.data.events.find((e: { kind: string }) => e.kind === k).time).getTime();
    expect(Math.abs(at('rise') - Date.parse('1988-03-20T12:25:00Z'))).toBeLessThan(60000);
    expect(Math.abs(at('transit') - Date.parse('1988-03-20T19:41:00Z'))).toBeLessThan(60000);
    expect(Math.abs(at('set') - Date.parse('1988-03-20T02:55:00Z'))).toBeLessThan(60000);
  });

  it('the Sun brings twilights, in time order', async () => {
    const r = await c.json('GET', `/api/sky/events?${qs({ lat: 40, lon: -105, height: 1600, body: 'sun', from: '2024-03-01T00:00:00Z', to: '2024-03-03T00:00:00Z' })}`);
    expect(r.status).toBe(200);
    const kinds = r.data.events.map((e: { kind: string }) => e.kind);
    for (const k of ['rise', 'transit', 'set', 'civil-dawn', 'civil-dusk', 'nautical-dawn', 'nautical-dusk', 'astronomical-dawn', 'astronomical-dusk']) expect(kinds).toContain(k);
    const times = r.data.events.map((e: { time: string }) => Date.parse(e.time));
    expect([...times].sort((a, b) => a - b)).toEqual(times);
  });

  it('a span over 31 days is refused naming "to"', async () => {
    const r = await c.json('GET', `/api/sky/events?${qs({ lat: 40, lon: 0, ra: 10, dec: 10, from: '2024-01-01T00:00:00Z', to: '2024-02-02T00:00:00Z' })}`);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('to');
  });
});

describe('POST /api/sky/windows', () => {
  const body = {
    site: { lat: 0, lon: 0, height: 0 },
    envelope: { name: 'test', minAltitude: 30 },
    targets: [{ name: 'Equator star', ra: 120, dec: 0 }, { name: 'Moon', body: 'moon' }],
    from: '2024-03-01T00:00:00Z',
    to: '2024-03-02T00:00:00Z',
  };

  it('returns windows with the limit that closes each', async () => {
    const r = await c.json('POST', '/api/sky/windows', body, { origin: s.url });
    expect(r.status).toBe(200);
    expect(r.data.targets.map((t: { name: string }) => t.name)).toEqual(['Equator star', 'Moon']);
    const star = r.data.targets[0];
    expect(star.windows.length).toBeGreaterThan(0);
    expect(star.reasons.length).toBe(star.windows.length);
    for (const w of star.windows) expect(Date.parse(w.end)).toBeGreaterThan(Date.parse(w.start));
    expect(star.reasons).toContain('minAltitude');
  });

  it('the star's window edges are where it crosses the 30° floor, within 2 s of ERFA atco13 (tests/reference/stars.py, case windows-equator-star)', async () => {
    const ref = stars.cases.find((c) => c.id === 'windows-equator-star')!.instants;
    const setsAt = Date.parse(ref.find((x) => !x.rising)!.time), risesAt = Date.parse(ref.find((x) => x.rising)!.time);
    const r = await c.json('POST', '/api/sky/windows', body, { origin: s.url });
    expect(r.status).toBe(200);
    const w = r.data.targets[0].windows.map((x: { start: string; end: string }) => [Date.parse(x.start), Date.parse(x.end)]);
    // Span 2024-03-01 00:00 → 03-02 00:00: up at the start until it sinks below 30°, and again from its rise above 30° to the end.
    expect(w).toHaveLength(2);
    expect(w[0][0]).toBe(Date.parse(body.from));
    expect(Math.abs(w[0][1] - setsAt)).toBeLessThan(2000);
    expect(Math.abs(w[1][0] - risesAt)).toBeLessThan(2000);
    expect(w[1][1]).toBe(Date.parse(body.to));
  });

  it('refuses more than 2,000 targets, bad JSON and bad fields', async () => {
    const many = { ...body, targets: Array.from({ length: 2001 }, (_, i) => ({ name: `t${i}`, ra: i % 360, dec: 0 })) };
    const r1 = await c.json('POST', '/api/sky/windows', many, { origin: s.url });
    expect(r1.status).toBe(400);
    expect(r1.data.error.field).toBe('targets');
    const r2 = await c.json('POST', '/api/sky/windows', '{"site":', { origin: s.url, 'content-type': 'application/json' });
    expect(r2.status).toBe(400);
    const r3 = await c.json('POST', '/api/sky/windows', { ...body, envelope: { minAltitude: 120 } }, { origin: s.url });
    expect(r3.status).toBe(400);
    expect(r3.data.error.field).toBe('envelope.minAltitude');
    const r4 = await c.json('POST', '/api/sky/windows', { ...body, to: '2024-04-15T00:00:00Z' }, { origin: s.url });
    expect(r4.status).toBe(400);
    expect(r4.data.error.field).toBe('to');
  });
});
