import { describe, expect, it } from 'vitest';
import { eventsQuerySchema, eventsResponse, observeQuerySchema, observeResponse, windowsBodySchema, windowsResponse } from '../../../src/lib/server/sky-api';

const fieldOf = (r: { success: boolean; error?: { issues: { path: (string | number)[] }[] } }) => (r.success ? null : r.error!.issues[0].path.join('.'));

describe('sky API input validation (API contract "Sky computation")', () => {
  const ok = { lat: '51.4769', lon: '0', time: '2024-01-15T22:00:00Z', ra: '101.2875', dec: '-16.7161' };

  it('accepts a valid observe query, with height and refraction defaults', () => {
    const q = observeQuerySchema.parse(ok);
    expect(q.height).toBe(0);
    expect(q.refraction).toBe('standard');
    const r = observeResponse(q);
    expect(Object.keys(r)).toEqual(expect.arrayContaining(['azimuth', 'altitude', 'hourAngle', 'raOfDate', 'decOfDate', 'lst', 'airmass', 'constellation']));
    expect(r.constellation).toBe('CMa');
    expect(r.hourAngle).toBeGreaterThanOrEqual(-12);
    expect(r.hourAngle).toBeLessThan(12);
  });

  it('names the bad field', () => {
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, lat: '91' }))).toBe('lat');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, lat: 'abc' }))).toBe('lat');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, time: '2024-01-15T22:00:00' }))).toBe('time');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, time: '15/01/2024' }))).toBe('time');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, ra: '361' }))).toBe('ra');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, ra: '-1' }))).toBe('ra');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, dec: '-91' }))).toBe('dec');
    expect(fieldOf(observeQuerySchema.safeParse({ lat: '1', lon: '2', time: ok.time, body: 'pluto' }))).toBe('body');
    expect(fieldOf(observeQuerySchema.safeParse({ lat: '1', lon: '2', time: ok.time }))).toBe('body');
    expect(fieldOf(observeQuerySchema.safeParse({ ...ok, refraction: 'heavy' }))).toBe('refraction');
    expect(fieldOf(observeQuerySchema.safeParse({ lat: '1', lon: '2', time: ok.time, ra: '10' }))).toBe('dec');
  });

  it('events: span at most 31 days, to after from', () => {
    const base = { lat: '40', lon: '-105', body: 'sun', from: '2024-01-01T00:00:00Z' };
    expect(eventsQuerySchema.safeParse({ ...base, to: '2024-02-01T00:00:00Z' }).success).toBe(true);
    expect(fieldOf(eventsQuerySchema.safeParse({ ...base, to: '2024-02-01T00:00:01Z' }))).toBe('to');
    expect(fieldOf(eventsQuerySchema.safeParse({ ...base, to: '2023-12-31T00:00:00Z' }))).toBe('to');
    const r = eventsResponse(eventsQuerySchema.parse({ ...base, to: '2024-01-02T00:00:00Z' }));
    expect(r.events.map((e) => e.kind)).toEqual(expect.arrayContaining(['rise', 'transit', 'set', 'civil-dawn', 'astronomical-dusk']));
  });

  it('windows: at most 2,000 targets; bad envelope and target fields are named', () => {
    const base = { site: { lat: 30, lon: 10 }, envelope: { minAltitude: 20 }, from: '2024-01-01T00:00:00Z', to: '2024-01-01T12:00:00Z' };
    const many = Array.from({ length: 2001 }, (_, i) => ({ name: `t${i}`, ra: i % 360, dec: 0 }));
    expect(fieldOf(windowsBodySchema.safeParse({ ...base, targets: many }))).toBe('targets');
    expect(fieldOf(windowsBodySchema.safeParse({ ...base, targets: [{ name: 'x', ra: 400, dec: 0 }] }))).toMatch(/^targets\.0/);
    expect(fieldOf(windowsBodySchema.safeParse({ ...base, envelope: { minAltitude: 100 }, targets: [] }))).toBe('envelope.minAltitude');
    expect(fieldOf(windowsBodySchema.safeParse({ ...base, site: { lat: 95, lon: 0 }, targets: [] }))).toBe('site.lat');
    const r = windowsResponse(windowsBodySchema.parse({ ...base, targets: [{ name: 'Sirius', ra: 101.2875, dec: -16.7161 }, { name: 'Moon', body: 'moon' }] }));
    expect(r.targets.map((t) => t.name)).toEqual(['Sirius', 'Moon']);
  });
});
