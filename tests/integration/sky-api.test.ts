import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';
import stars from '../reference/stars.json';
import eop from '../reference/earth-orientation.json';
import motion from '../reference/motion.json';

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
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, dut1: 1.2 }, 'dut1'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, xp: 'north' }, 'xp'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, yp: 3 }, 'yp'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, pmra: 30000 }, 'pmra'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, parallax: -1 }, 'parallax'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', ra: 10, dec: 10, epoch: 'J2000' }, 'epoch'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', body: 'mars', pmdec: 5 }, 'pmdec'],
    [{ lat: 10, lon: 0, time: '2024-01-15T22:00:00Z', body: 'mars', radialVelocity: 5 }, 'radialVelocity'],
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

describe('GET /api/sky/observe: Earth orientation and space motion', () => {
  const arcsec = (a: { azimuth: number; altitude: number }, az: number, alt: number) =>
    Math.hypot(a.altitude - alt, ((a.azimuth - az + 540) % 360 - 180) * Math.cos((alt * Math.PI) / 180)) * 3600;

  it('dut1, xp, yp: within 0.05″ of ERFA atco13 with the same values (tests/reference/earth_orientation.py), echoed back', async () => {
    for (const k of eop.cases) {
      const q = { lat: k.site.lat, lon: k.site.lon, height: k.site.height, time: k.time, ra: k.ra, dec: k.dec, refraction: 'none', dut1: k.dut1, xp: k.xp, yp: k.yp };
      const r = await c.json('GET', `/api/sky/observe?${qs(q)}`);
      expect(r.status).toBe(200);
      expect(arcsec(r.data, k.none.az, k.none.alt)).toBeLessThan(0.05);
      expect(r.data.earthOrientation).toEqual({ dut1: k.dut1, xp: k.xp, yp: k.yp });
    }
    const k = eop.cases[0]!;
    const zero = await c.json('GET', `/api/sky/observe?${qs({ lat: k.site.lat, lon: k.site.lon, time: k.time, ra: k.ra, dec: k.dec, refraction: 'none' })}`);
    expect(arcsec(zero.data, k.noneWithZeros.az, k.noneWithZeros.alt)).toBeLessThan(0.05);
    expect(zero.data.earthOrientation).toEqual({ dut1: 0, xp: 0, yp: 0 });
  });

  it('epoch, pmra, pmdec, parallax, radialVelocity: within 0.5″ of ERFA pmsafe + atco13 after 50 years (tests/reference/motion.py)', async () => {
    for (const m of motion.cases) {
      for (const o of m.observed) {
        const q = { lat: o.site.lat, lon: o.site.lon, height: o.site.height, time: m.time, ra: m.ra, dec: m.dec, refraction: 'none', epoch: 2000, pmra: m.pmra, pmdec: m.pmdec, parallax: m.parallax, radialVelocity: m.rv };
        const r = await c.json('GET', `/api/sky/observe?${qs(q)}`);
        expect(r.status).toBe(200);
        expect(arcsec(r.data, o.az, o.alt), m.name).toBeLessThan(0.5);
      }
    }
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

  it("the star's window edges are where it crosses the 30° floor, within 2 s of ERFA atco13 (tests/reference/stars.py, case windows-equator-star)", async () => {
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

  it('site.dut1 moves the edges by UT1 − UTC (a star keeps sidereal time: +0.9 s of UT1 → 0.9 s earlier in UTC; edges are refined to 0.5 s)', async () => {
    const r0 = await c.json('POST', '/api/sky/windows', body, { origin: s.url });
    const r1 = await c.json('POST', '/api/sky/windows', { ...body, site: { ...body.site, dut1: 0.9, xp: 0.2, yp: 0.3 } }, { origin: s.url });
    expect(r1.status).toBe(200);
    const e0 = Date.parse(r0.data.targets[0].windows[1].start), e1 = Date.parse(r1.data.targets[0].windows[1].start);
    expect(Math.abs(e0 - e1 - 900)).toBeLessThan(600);
    const bad = await c.json('POST', '/api/sky/windows', { ...body, site: { ...body.site, dut1: 1 } }, { origin: s.url });
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('site.dut1');
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
