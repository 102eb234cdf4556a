/**
 * The node interpolation of ephemeris quantities (src/lib/sky/ephemeris-nodes.ts) against the exact
 * functions it stands for: the VSOP87B series (heliocentricIcrsExact), astronomy-engine's GeoMoon and
 * HelioState, and the 77-term IAU 2000B nutation. The external truth of those functions is checked
 * elsewhere (bodies-de405.test.ts against JPL DE405 + ERFA, nutation.test.ts against ERFA nut06a, the
 * E1–E4 star places against ERFA atco13); here the bound is that interpolating adds nothing visible:
 * ≤ 1 m in position (the planets and the Earth ≤ 0.5 m: 0.0007″ at 1 au; the Moon 0.0005″), ≤ 1 µas in nutation.
 */
import { describe, expect, it } from 'vitest';
import { Astronomy } from '../../../src/lib/sky/astronomy';
import { heliocentricIcrs, heliocentricIcrsExact, type SeriesBody } from '../../../src/lib/sky/planets/series';
import { moonGeocentric } from '../../../src/lib/sky/bodies';
import { earthHelioState } from '../../../src/lib/sky/apparent';
import { nutationIau2000b, nutationIau2000bExact } from '../../../src/lib/sky/nutation';
import { nodeInterpolator } from '../../../src/lib/sky/ephemeris-nodes';
import { rng } from './helpers';

const AU_M = 149597870700;
const AS = (180 / Math.PI) * 3600;
const dist = (a: ArrayLike<number>, b: ArrayLike<number>) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
/** Random TT days since J2000.0 between 1900 and 2100 (seeded). */
function instants(seed: number, n: number): number[] {
  const r = rng(seed);
  return Array.from({ length: n }, () => (r() * 2 - 1) * 36525);
}

describe('ephemeris nodes: interpolated values stay on the exact functions', () => {
  it('a cubic through four nodes reproduces a cubic exactly and a node value bit for bit', () => {
    const f = nodeInterpolator(1, 0.5, (t) => [2 - 3 * t + 0.5 * t * t - 0.25 * t * t * t]);
    for (const t of [-3.3, -0.1, 0, 0.25, 7.77]) expect(f(t, [0])[0]).toBeCloseTo(2 - 3 * t + 0.5 * t * t - 0.25 * t * t * t, 9);
    const g = nodeInterpolator(1, 0.25, (t) => [Math.sin(t)]);
    expect(g(1.5, [0])[0]).toBe(Math.sin(1.5));
    // and a sine is not a cubic: the check above can fail
    expect(Math.abs(g(1.6, [0])[0] - Math.sin(1.6))).toBeGreaterThan(0);
  });

  it('a value depends on the instant only, not on what was asked before', () => {
    const a = heliocentricIcrs('earth', 9876.54321, [0, 0, 0]);
    for (let k = 0; k < 200; k++) heliocentricIcrs('earth', -20000 + k * 37.3, [0, 0, 0]);
    expect(heliocentricIcrs('earth', 9876.54321, [0, 0, 0])).toEqual(a);
  });

  it.each(['earth', 'mercury', 'venus', 'mars', 'jupiter', 'neptune'] as SeriesBody[])('VSOP87B %s within 0.5 m of the series, 1900–2100', (body) => {
    let worst = 0;
    for (const t of instants(11, 400)) worst = Math.max(worst, dist(heliocentricIcrs(body, t, [0, 0, 0]), heliocentricIcrsExact(body, t, [0, 0, 0])) * AU_M);
    expect(worst).toBeLessThan(0.5);
  });

  it('the Moon within 1 m of astronomy-engine GeoMoon, 1900–2100', () => {
    let worst = 0;
    for (const t of instants(12, 1000)) {
      const time = Astronomy.AstroTime.FromTerrestrialTime(t);
      const v = Astronomy.GeoMoon(time);
      worst = Math.max(worst, dist(moonGeocentric(time.tt, [0, 0, 0]), [v.x, v.y, v.z]) * AU_M);
    }
    expect(worst).toBeLessThan(1);
  });

  it("the Earth's heliocentric state within 0.2 m and 0.1 mm/s of astronomy-engine HelioState", () => {
    let worstP = 0, worstV = 0;
    for (const t of instants(13, 400)) {
      const time = Astronomy.AstroTime.FromTerrestrialTime(t);
      const s = Astronomy.HelioState(Astronomy.Body.Earth, time);
      const e = earthHelioState(time.tt);
      worstP = Math.max(worstP, dist(e, [s.x, s.y, s.z]) * AU_M);
      worstV = Math.max(worstV, (dist(e.subarray(3), [s.vx, s.vy, s.vz]) * AU_M) / 86400);
    }
    expect(worstP).toBeLessThan(0.2);
    expect(worstV).toBeLessThan(1e-4);
  });

  it('IAU 2000B nutation within 1 µas of its 77 terms', () => {
    let worst = 0;
    for (const t of instants(14, 1000)) {
      const a = nutationIau2000b(t), b = nutationIau2000bExact(t);
      worst = Math.max(worst, Math.abs(a.dPsiRad - b.dPsiRad) * AS, Math.abs(a.dEpsRad - b.dEpsRad) * AS);
    }
    expect(worst).toBeLessThan(1e-6);
  });
});
