import { describe, expect, it } from 'vitest';
import { azimuthMarginDeg, evaluateEnvelope, maskAltitudeDeg, prepareMask } from '../../../src/lib/sky/envelope';
import { envelopeSchema } from '../../../src/lib/contracts/envelope';
import { visibilityWindows } from '../../../src/lib/sky/windows';
import { riseTransitSet } from '../../../src/lib/sky/events';
import { observe } from '../../../src/lib/sky/observe';
import { bodies } from '../../../src/lib/sky/bodies';
import { evaluateEnvelopeAt } from '../../../src/lib/sky/pointing';
import { trueAltitudeDeg } from '../../../src/lib/sky/refraction';
import { DEG, RAD } from '../../../src/lib/sky/math';

/** Sidereal day in seconds (domain-facts.md: 23h56m04.0905s). */
const SIDEREAL_DAY_S = 86164.0905;

describe('envelope schema (API contract "Envelopes")', () => {
  it('accepts the contract fields and rejects bad ones naming the field', () => {
    const ok = envelopeSchema.parse({
      name: 'Nickel-like', minAltitude: 21.1, azimuthRanges: [[300, 60]], keyholeRadius: 2, sunAvoidance: 45, moonAvoidance: 10,
      horizonMask: [[0, 5], [180, 12]], hourAngleLimits: [-5.48, 5.23], declinationLimits: [-31.18, 64.1],
    });
    expect(ok.azimuthRanges).toEqual([[300, 60]]);
    expect(envelopeSchema.parse({ minAltitude: null }).minAltitude).toBeUndefined();
    const bad = (v: unknown) => {
      const r = envelopeSchema.safeParse(v);
      return r.success ? null : r.error.issues[0].path.join('.');
    };
    expect(bad({ minAltitude: 95 })).toBe('minAltitude');
    expect(bad({ azimuthRanges: [[10, 400]] })).toBe('azimuthRanges.0.1');
    expect(bad({ hourAngleLimits: [3, -3] })).toBe('hourAngleLimits');
    expect(bad({ minAltitude: 50, maxAltitude: 40 })).toBe('maxAltitude');
    expect(bad({ horizonMask: [[0, 'x']] })).toBe('horizonMask.0.1');
  });
});

describe('envelope pieces (constructed by hand)', () => {
  it('azimuth ranges run clockwise and may wrap through north', () => {
    expect(azimuthMarginDeg(0, [[300, 60]])).toBe(60);
    expect(azimuthMarginDeg(330, [[300, 60]])).toBe(30);
    expect(azimuthMarginDeg(90, [[300, 60]])).toBe(-30);
    expect(azimuthMarginDeg(299, [[300, 60]])).toBe(-1);
    expect(azimuthMarginDeg(180, [[300, 60]])).toBe(-120);
    expect(azimuthMarginDeg(100, [[60, 300]])).toBe(40);
    expect(azimuthMarginDeg(10, [[0, 360]])).toBe(Infinity);
    expect(azimuthMarginDeg(10, [[300, 60], [90, 120]])).toBe(50);
  });

  it('the horizon mask is linear in azimuth and wraps at 360°', () => {
    const m = prepareMask([[350, 10], [10, 30]]);
    expect(maskAltitudeDeg(m, 0)).toBeCloseTo(20, 12);
    expect(maskAltitudeDeg(m, 355)).toBeCloseTo(15, 12);
    expect(maskAltitudeDeg(m, 5)).toBeCloseTo(25, 12);
    expect(maskAltitudeDeg(m, 180)).toBeCloseTo(20, 12); // 10 → 350 through south: halfway
    expect(maskAltitudeDeg(m, 10)).toBeCloseTo(30, 12);
    expect(maskAltitudeDeg(prepareMask([[123, 7]]), 300)).toBe(7);
  });

  it('a 10 m wall 20 m away, entered as a mask of 26.565° (domain-facts.md: atan(10/20) = 26.5651°), blocks below that altitude only', () => {
    const env = envelopeSchema.parse({ horizonMask: [[150, 26.565], [210, 26.565]] });
    const below = evaluateEnvelope(env, { azDeg: 180, altDeg: 26.5 });
    expect(below.allowed).toBe(false);
    expect(below.violations.map((v) => v.limit)).toEqual(['horizonMask']);
    expect(below.violations[0]!.margin).toBeCloseTo(-0.065, 9);
    expect(evaluateEnvelope(env, { azDeg: 180, altDeg: 26.6 }).allowed).toBe(true);
  });

  it('evaluateEnvelope reports every violated limit with its margin', () => {
    const env = envelopeSchema.parse({
      minAltitude: 30, maxAltitude: 85, azimuthRanges: [[300, 60]], keyholeRadius: 3, sunAvoidance: 40, moonAvoidance: 10,
      horizonMask: [[0, 35], [180, 35]], hourAngleLimits: [-4, 4], declinationLimits: [-30, 60],
    });
    const r = evaluateEnvelope(env, { azDeg: 90, altDeg: 20, haHours: -5, decDeg: 70 }, { sun: { azDeg: 90, altDeg: 0 }, moon: { azDeg: 270, altDeg: 0 } });
    expect(r.allowed).toBe(false);
    const m = Object.fromEntries(r.violations.map((v) => [v.limit, v.margin]));
    expect(m.minAltitude).toBeCloseTo(-10, 12);
    expect(m.azimuthRanges).toBeCloseTo(-30, 12);
    expect(m.sunAvoidance).toBeCloseTo(-20, 9);
    expect(m.horizonMask).toBeCloseTo(-15, 12);
    expect(m.hourAngleLimits).toBeCloseTo(-1, 12);
    expect(m.declinationLimits).toBeCloseTo(-10, 12);
    expect(m.moonAvoidance).toBeUndefined();
    const ok = evaluateEnvelope(env, { azDeg: 10, altDeg: 50, haHours: 1, decDeg: 10 }, { sun: { azDeg: 180, altDeg: -30 } });
    expect(ok.allowed).toBe(true);
    const keyhole = evaluateEnvelope(env, { azDeg: 10, altDeg: 88, haHours: 0, decDeg: 10 }, {});
    expect(keyhole.violations.map((v) => v.limit).sort()).toEqual(['keyholeRadius', 'maxAltitude']);
  });
});

describe('visibility windows on constructed cases (answers by hand)', () => {
  // A site on the equator: a star of declination δ has sin h = cos δ cos H, so every limit in
  // altitude maps to an hour angle by hand; hour angle runs at 360° per sidereal day.
  const site = { latDeg: 0, lonDeg: 0, heightM: 0 };
  const star = { raDeg: 120, decDeg: 0 };
  const day = [new Date('2024-03-01T00:00:00Z'), new Date('2024-03-02T00:00:00Z')] as const;
  const transit = riseTransitSet(site, star, day[0], day[1]).find((e) => e.kind === 'transit')!.time.getTime();
  const from = new Date(transit - 8 * 3600000), to = new Date(transit + 8 * 3600000);
  const decApp = observe(site, new Date(transit), star, { refraction: 'none' }).decOfDateDeg;
  const seconds = (hDeg: number) => (hDeg / 360) * SIDEREAL_DAY_S;
  const haForTrueAlt = (hDeg: number) => Math.acos(Math.sin(hDeg * DEG) / Math.cos(decApp * DEG)) * RAD;
  const tg = [{ name: 'S', ...star }];

  it('minAltitude 30° (apparent): one window of 2H centred on transit', () => {
    const [w] = visibilityWindows(site, { minAltitude: 30 }, tg, from, to)[0].windows;
    const H = haForTrueAlt(trueAltitudeDeg(30));
    const dur = (w.end.getTime() - w.start.getTime()) / 1000;
    expect(Math.abs(dur - 2 * seconds(H))).toBeLessThan(2);
    expect(Math.abs((w.start.getTime() + w.end.getTime()) / 2 - transit) / 1000).toBeLessThan(1);
    expect(w.openedBy).toBe('minAltitude');
    expect(w.closedBy).toBe('minAltitude');
    // the edges agree with single evaluations 2 s inside and outside
    const env = { minAltitude: 30 };
    expect(evaluateEnvelopeAt(env, site, new Date(w.start.getTime() + 2000), star).allowed).toBe(true);
    expect(evaluateEnvelopeAt(env, site, new Date(w.start.getTime() - 2000), star).allowed).toBe(false);
    expect(evaluateEnvelopeAt(env, site, new Date(w.end.getTime() - 2000), star).allowed).toBe(true);
    expect(evaluateEnvelopeAt(env, site, new Date(w.end.getTime() + 2000), star).allowed).toBe(false);
  });

  it('a flat horizon mask at 30° gives the same window as minAltitude 30°', () => {
    const a = visibilityWindows(site, { minAltitude: 30 }, tg, from, to)[0].windows[0];
    const b = visibilityWindows(site, { horizonMask: [[0, 30], [180, 30]] }, tg, from, to)[0].windows[0];
    expect(Math.abs(a.start.getTime() - b.start.getTime())).toBeLessThan(1000);
    expect(Math.abs(a.end.getTime() - b.end.getTime())).toBeLessThan(1000);
    expect(b.closedBy).toBe('horizonMask');
  });

  it('a zenith keyhole of 5° splits the pass with a gap of 2·acos(cos 5° / cos δ)', () => {
    const ws = visibilityWindows(site, { minAltitude: 0, keyholeRadius: 5 }, tg, from, to)[0].windows;
    expect(ws.length).toBe(2);
    const gap = (ws[1].start.getTime() - ws[0].end.getTime()) / 1000;
    const H = Math.acos(Math.cos(5 * DEG) / Math.cos(decApp * DEG)) * RAD;
    expect(Math.abs(gap - 2 * seconds(H))).toBeLessThan(2);
    expect(ws[0].closedBy).toBe('keyholeRadius');
    expect(ws[1].openedBy).toBe('keyholeRadius');
  });

  it('hour-angle limits [−2 h, +3 h] give a window of 5 sidereal hours', () => {
    const ws = visibilityWindows(site, { hourAngleLimits: [-2, 3] }, tg, from, to)[0].windows;
    expect(ws.length).toBe(1);
    const dur = (ws[0].end.getTime() - ws[0].start.getTime()) / 1000;
    expect(Math.abs(dur - seconds(75))).toBeLessThan(2);
    expect(Math.abs(ws[0].start.getTime() - (transit - seconds(30) * 1000)) / 1000).toBeLessThan(2);
    expect(ws[0].closedBy).toBe('hourAngleLimits');
  });

  it('an azimuth range [180, 360] admits the star from transit (az 180°) until it sets', () => {
    const ws = visibilityWindows(site, { minAltitude: 0, azimuthRanges: [[180, 360]] }, tg, from, to)[0].windows;
    expect(ws.length).toBe(1);
    expect(Math.abs(ws[0].start.getTime() - transit) / 1000).toBeLessThan(2);
    expect(ws[0].openedBy).toBe('azimuthRanges');
    expect(ws[0].closedBy).toBe('minAltitude');
  });

  it('declination limits that exclude the target: no window, reason declinationLimits', () => {
    const r = visibilityWindows(site, { declinationLimits: [10, 60] }, tg, from, to)[0];
    expect(r.windows).toEqual([]);
    expect(r.reasons).toEqual(['declinationLimits']);
  });

  it('Sun and Moon avoidance exclude the Sun and the Moon themselves', () => {
    const r = visibilityWindows(site, { sunAvoidance: 5, moonAvoidance: 5 }, [{ name: 'sun', body: 'sun' }, { name: 'moon', body: 'moon' }, { name: 'S', ...star }], from, to);
    expect(r[0].windows).toEqual([]);
    expect(r[0].reasons[0]).toBe('sunAvoidance');
    expect(r[1].windows).toEqual([]);
    expect(r[1].reasons[0]).toBe('moonAvoidance');
    // the star, far from both this day (RA 120° vs the Sun near 340°), is inside the whole span
    expect(r[2].windows.length).toBe(1);
    expect(r[2].windows[0].closedBy).toBe('span-end');
  });

  it('sunAvoidance margin for a star at a known separation from the Sun', () => {
    // Put a fixed target 20° east of the Sun in RA on the equator near the March equinox: separation ≈ 20°.
    const t = new Date('2024-03-20T12:00:00Z');
    const sun = bodies(site, t).find((b) => b.body === 'sun')!;
    const target = { raDeg: sun.raDeg + 20, decDeg: sun.decDeg };
    const e = evaluateEnvelopeAt({ sunAvoidance: 25 }, site, t, target);
    expect(e.allowed).toBe(false);
    // separation = 20° · cos δ☉ (δ☉ ≈ 0 at the equinox) up to aberration/deflection differences
    expect(Math.abs(e.violations[0].margin - (20 * Math.cos(sun.decDeg * DEG) - 25))).toBeLessThan(0.01);
  });
});
