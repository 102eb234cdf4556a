/**
 * The visibility-windows search skips grid instants where a target's state cannot change
 * (src/lib/sky/windows.ts, "Skip-ahead"). Its answer must be the one the exhaustive search gives: the
 * previous implementation is kept unchanged in reference/windows-before.ts and both run here over many
 * random sites, envelopes (every limit, alone and together, including awkward ones: wrapping azimuth
 * ranges, steep and stepped horizon masks, targets at the poles and near the Sun) and spans. Windows
 * (start, end to the millisecond, openedBy, closedBy) and reasons must be equal.
 */
import { describe, expect, it } from 'vitest';
import { visibilityWindows, APPARENT_ALT_RATE_FACTOR, type WindowTarget } from '../../../src/lib/sky/windows';
import { visibilityWindowsBefore } from './reference/windows-before';
import { refractionForTrueAltitudeDeg } from '../../../src/lib/sky/refraction';
import type { Envelope } from '../../../src/lib/sky/envelope';
import type { BodyName } from '../../../src/lib/sky/bodies';
import { rng } from './helpers';

function randomEnvelope(r: () => number): Envelope {
  const e: Envelope = {};
  const pick = (p: number) => r() < p;
  if (pick(0.7)) e.minAltitude = -5 + r() * 45;
  if (pick(0.4)) e.maxAltitude = Math.max(e.minAltitude ?? 0, 55 + r() * 35);
  if (pick(0.4)) e.keyholeRadius = r() * 10;
  if (pick(0.4)) {
    const n = 1 + Math.floor(r() * 2);
    e.azimuthRanges = Array.from({ length: n }, () => [Math.round(r() * 360), Math.round(r() * 360)] as [number, number]);
    if (pick(0.1)) e.azimuthRanges.push([40, 40]); // a full circle
  }
  if (pick(0.4)) {
    const n = 1 + Math.floor(r() * 24);
    e.horizonMask = Array.from({ length: n }, () => [r() * 360, r() * 30] as [number, number]);
    if (pick(0.3) && n > 1) e.horizonMask.push([e.horizonMask[0][0], 40 * r()]); // a vertical step
  }
  if (pick(0.4)) e.sunAvoidance = r() * 60;
  if (pick(0.4)) e.moonAvoidance = r() * 30;
  if (pick(0.35)) {
    const a = -12 + r() * 24, b = -12 + r() * 24;
    e.hourAngleLimits = [Math.min(a, b), Math.max(a, b)];
  }
  if (pick(0.3)) {
    const a = -90 + r() * 180, b = -90 + r() * 180;
    e.declinationLimits = [Math.min(a, b), Math.max(a, b)];
  }
  return e;
}

function randomTargets(r: () => number, n: number): WindowTarget[] {
  const out: WindowTarget[] = [];
  for (let i = 0; i < n; i++) out.push({ name: `T${i}`, raDeg: r() * 360, decDeg: (Math.asin(2 * r() - 1) * 180) / Math.PI });
  out.push({ name: 'north pole', raDeg: 0, decDeg: 90 }, { name: 'south pole', raDeg: 10, decDeg: -90 }, { name: 'near pole', raDeg: 37.95, decDeg: 89.26 });
  out.push({ name: 'moving', raDeg: 269.45, decDeg: 4.69, motion: { pmra: -798.6, pmdec: 10328.1, parallax: 546.98, radialVelocity: -110.6 } });
  const bodies: BodyName[] = ['moon', 'sun', 'jupiter'];
  for (const b of bodies) if (r() < 0.5) out.push({ name: b, body: b });
  return out;
}

const iso = (res: ReturnType<typeof visibilityWindows>) =>
  res.map((t) => ({ name: t.name, reasons: t.reasons, windows: t.windows.map((w) => [w.start.toISOString(), w.end.toISOString(), w.openedBy, w.closedBy]) }));

describe('visibility windows: skip-ahead search equals the exhaustive search', () => {
  const cases = 36;
  for (let c = 0; c < cases; c++) {
    it(`random case ${c}`, () => {
      const r = rng(1000 + c);
      const site = { latDeg: -85 + r() * 170, lonDeg: -180 + r() * 360, heightM: r() * 4500 };
      const env = randomEnvelope(r);
      const targets = randomTargets(r, 40);
      const from = new Date(Date.UTC(2020, 0, 1) + Math.floor(r() * 20 * 365) * 86400000 + Math.floor(r() * 86400) * 1000);
      const hours = [6, 12, 24, 30, 72][Math.floor(r() * 5)];
      const to = new Date(from.getTime() + hours * 3600000);
      const stepSec = [undefined, 60, 120, 300, 600][Math.floor(r() * 5)];
      const opts = stepSec ? { stepSec } : {};
      const now = iso(visibilityWindows(site, env, targets, from, to, opts));
      const before = iso(visibilityWindowsBefore(site, env, targets, from, to, opts));
      expect(now).toEqual(before);
    });
  }

  it('the full bench envelope, 300 targets over 24 h, equal', () => {
    const r = rng(7);
    const env: Envelope = {
      minAltitude: 20, maxAltitude: 85, keyholeRadius: 4, sunAvoidance: 40, moonAvoidance: 15, azimuthRanges: [[20, 340]],
      horizonMask: Array.from({ length: 72 }, (_, i) => [i * 5, 8 + 6 * Math.sin(i / 4)] as [number, number]), hourAngleLimits: [-5, 5], declinationLimits: [-35, 80],
    };
    const targets = randomTargets(r, 300);
    const site = { latDeg: 37.2, lonDeg: -3.6, heightM: 2800 };
    const from = new Date('2026-03-20T12:00:00Z'), to = new Date('2026-03-21T12:00:00Z');
    const now = iso(visibilityWindows(site, env, targets, from, to, { stepSec: 120 }));
    expect(now).toEqual(iso(visibilityWindowsBefore(site, env, targets, from, to, { stepSec: 120 })));
    // the comparison is not vacuous: most targets have windows, some have none and carry reasons
    expect(now.filter((t) => t.windows.length).length).toBeGreaterThan(100);
    expect(now.some((t) => !t.windows.length && t.reasons.length > 0)).toBe(true);
  });

  it(`the skip bound for altitude limits holds: the apparent altitude changes at most ${APPARENT_ALT_RATE_FACTOR}× as fast as the true altitude`, () => {
    let worst = 0;
    for (let h = -90; h < 90; h += 0.001) {
      const d = 1e-4;
      const slope = (h + d + refractionForTrueAltitudeDeg(h + d) - (h + refractionForTrueAltitudeDeg(h))) / d;
      worst = Math.max(worst, Math.abs(slope));
    }
    expect(worst).toBeLessThanOrEqual(APPARENT_ALT_RATE_FACTOR);
    expect(worst).toBeGreaterThan(0.99); // the slope is measured, not zero
  });
});
