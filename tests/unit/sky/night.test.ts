/**
 * Night data (src/lib/sky/night.ts) against outside values. Check values from ERFA 2.0 (Debian
 * python3-erfa) through tests/unit/sky/reference/night-erfa.py; run it with /usr/bin/python3 to see them.
 * Site stated for the test: latitude +37.2°, longitude −3.6°, height 2800 m.
 */
import { describe, expect, it } from 'vitest';
import { nightData, sceneNight, MAX_NIGHT_SPAN_MS } from '../../../src/lib/sky/night';
import { visibilityWindows } from '../../../src/lib/sky/windows';
import { windowsStepSec } from '../../../src/lib/server/sky-api';
import { skyEvents } from '../../../src/lib/sky/events';

const site = { name: 'Test site', lat: 37.2, lon: -3.6, height: 2800, timeZone: 'Europe/Madrid' };
const siteInput = { latDeg: 37.2, lonDeg: -3.6, heightM: 2800 };
const star = { name: 'Star A', raDeg: 83.8221, decDeg: -5.3911 };
const ms = (s: string) => new Date(s).getTime();

describe('night data against ERFA', () => {
  const night = sceneNight(site, new Date('2026-03-20T22:00:00Z'));
  const data = nightData({ site, envelope: { minAltitude: 15 }, targets: [star], from: night.from, to: night.to, stepMin: 5 });

  it('astronomical dusk on 2026-03-20 within 2 s of ERFA (epv00 + atco13, pressure 0: 19:53:19.6 UTC)', () => {
    const dusk = data.sun.events.find((e) => e.kind === 'astronomical-dusk');
    expect(dusk).toBeDefined();
    // ERFA leaves out the Sun's 8.8″ diurnal parallax (≈ 0.7 s here); the engine includes it.
    expect(Math.abs(ms(dusk!.time) - ms('2026-03-20T19:53:19.627Z'))).toBeLessThan(2000);
  });

  it('apparent altitude of RA 83.8221°, Dec −5.3911° at 2026-03-20T22:00Z (ERFA atco13, 1013.25 hPa, 10 °C: 19.401466°, az 246.963650°)', () => {
    const d = nightData({ site, envelope: null, targets: [star], from: ms('2026-03-20T22:00:00Z'), to: ms('2026-03-20T23:00:00Z'), stepMin: 10 });
    const s = d.targets[0].samples[0];
    expect(s.time).toBe('2026-03-20T22:00:00Z');
    expect(Math.abs(s.altitude - 19.401466) * 3600).toBeLessThan(2); // 2″ (samples are rounded to 0.0001°)
    expect(Math.abs(s.azimuth - 246.96365) * 3600).toBeLessThan(2);
    // Kasten & Young (1989, Applied Optics 28, 4735) at the ERFA altitude 19.401466°: 1/(cos z + 0.50572·(96.07995 − z)^−1.6364),
    // z = 70.598534°, = 2.98763 (evaluated with /usr/bin/python3 math)
    expect(s.airmass).toBeCloseTo(2.98763, 3);
  });

  it('the default span is sunset to sunrise around the scene time, whole minutes', () => {
    const set = data.sun.events.find((e) => e.kind === 'set');
    const rise = data.sun.events.find((e) => e.kind === 'rise');
    expect(set && rise).toBeTruthy();
    expect(night.from).toBeLessThanOrEqual(ms(set!.time));
    expect(ms(set!.time) - night.from).toBeLessThan(60000);
    expect(night.to).toBeGreaterThanOrEqual(ms(rise!.time));
    expect(night.to - ms(rise!.time)).toBeLessThan(60000);
    // the same night from a scene time in the afternoon before it
    const earlier = sceneNight(site, new Date('2026-03-20T14:00:00Z'));
    expect(earlier).toEqual(night);
    expect(night.to - night.from).toBeLessThan(MAX_NIGHT_SPAN_MS);
  });
});

describe('night data: shape and consistency', () => {
  const from = ms('2026-03-20T19:00:00Z'), to = ms('2026-03-21T05:00:00Z');
  const env = { minAltitude: 25, maxAltitude: 80, keyholeRadius: 5, moonAvoidance: 20 };
  const targets = [star, { name: 'Polaris-ish', raDeg: 37.95, decDeg: 89.26 }, { name: 'Jupiter', body: 'jupiter' as const }, { name: 'Never', raDeg: 100, decDeg: -80 }];
  const d = nightData({ site, envelope: env, targets, from, to, stepMin: 5 });

  it('samples on the step grid, airmass null below the horizon only', () => {
    for (const t of d.targets) {
      expect(t.samples.length).toBe(121);
      t.samples.forEach((s, k) => expect(ms(s.time)).toBe(from + k * 300000));
      for (const s of t.samples) expect(s.airmass === null).toBe(s.altitude < 0);
    }
    expect(d.moon.samples.length).toBe(121);
    expect(d.step).toBe(5);
    expect(d.moon.illumination).toBeGreaterThanOrEqual(0);
    expect(d.moon.illumination).toBeLessThanOrEqual(1);
  });

  it('windows equal visibilityWindows with the windows API grid step', () => {
    const ref = visibilityWindows(siteInput, env, targets, new Date(from), new Date(to), { stepSec: windowsStepSec(to - from, targets.length) });
    d.targets.forEach((t, i) => {
      expect(t.windows).toEqual(ref[i].windows.map((w) => ({ start: w.start.toISOString(), end: w.end.toISOString(), openedBy: w.openedBy, closedBy: w.closedBy })));
    });
    expect(d.targets[0].windows.length).toBeGreaterThan(0);
    expect(d.targets[3].windows).toEqual([]);
    expect(d.targets[3].reasons[0]).toBe('minAltitude');
  });

  it('best: the highest point inside a window, not lower than any sample inside one', () => {
    for (const t of d.targets.filter((x) => x.windows.length)) {
      expect(t.best.inWindow).toBe(true);
      const bt = ms(t.best.time);
      expect(t.windows.some((w) => bt >= ms(w.start) && bt <= ms(w.end))).toBe(true);
      for (const s of t.samples) {
        const inside = t.windows.some((w) => ms(s.time) >= ms(w.start) && ms(s.time) <= ms(w.end));
        if (inside) expect(t.best.altitude).toBeGreaterThanOrEqual(s.altitude - 1e-3);
      }
      expect(t.best.moonSeparation).toBeGreaterThanOrEqual(20 - 0.01); // inside the Moon avoidance limit
      expect(t.best.sunSeparation).toBeGreaterThan(0);
    }
    expect(d.targets[3].best.inWindow).toBe(false);
  });
});

describe('sceneNight: the two-day search first gives the night the three-day search gives', () => {
  /** sceneNight as it was before the two-stage search: one 3-day search with every Sun event. */
  function sceneNightBefore(s: { lat: number; lon: number; height: number }, at: Date) {
    const site = { latDeg: s.lat, lonDeg: s.lon, heightM: s.height };
    const t = at.getTime();
    const day = 86400000;
    const ev = skyEvents(site, { body: 'sun' }, new Date(t - day), new Date(t + 2 * day)).events;
    const sets = ev.filter((e) => e.kind === 'set').map((e) => e.time.getTime());
    const rises = ev.filter((e) => e.kind === 'rise').map((e) => e.time.getTime());
    const lastSet = sets.filter((x) => x <= t).pop();
    const lastRise = rises.filter((x) => x <= t).pop();
    const sunDown = lastSet !== undefined && (lastRise === undefined || lastSet > lastRise);
    const start = sunDown ? lastSet! : sets.find((x) => x > t);
    const end = start !== undefined ? rises.find((x) => x > start) : undefined;
    if (start === undefined || end === undefined || end - start > day || (!sunDown && start - t > day)) {
      return { from: Math.floor((t - day / 2) / 60000) * 60000, to: Math.floor((t - day / 2) / 60000) * 60000 + day, polar: true };
    }
    return { from: Math.floor(start / 60000) * 60000, to: Math.ceil(end / 60000) * 60000, polar: false };
  }
  let seed = 99;
  const r = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  it('over random sites (polar ones included) and instants', () => {
    let polar = 0;
    for (let i = 0; i < 24; i++) {
      const s = { lat: i < 6 ? (i % 2 ? -1 : 1) * (67 + r() * 20) : -66 + r() * 132, lon: -180 + r() * 360, height: r() * 4000 };
      const at = new Date(Date.UTC(2024, 0, 1) + r() * 3 * 365 * 86400000);
      const now = sceneNight({ name: 'x', ...s, timeZone: 'UTC' }, at);
      expect(now, `${JSON.stringify(s)} ${at.toISOString()}`).toEqual(sceneNightBefore(s, at));
      if (now.polar) polar++;
    }
    expect(polar).toBeGreaterThan(0); // the fall-back path ran too
  }, 60_000);
});
