import { describe, expect, it } from 'vitest';
import * as Astronomy from 'astronomy-engine';
import { loadCatalogue } from '../../../src/lib/sky/catalogue';
import { observeIcrs, skyFrame } from '../../../src/lib/sky/apparent';
import { starsToEnu, starsToHorizontal } from '../../../src/lib/sky/stars';
import { RAD } from '../../../src/lib/sky/math';
import { dAngle } from './helpers';

const cat = loadCatalogue();
const cases = [
  { site: { latDeg: 51.4769, lonDeg: 0, heightM: 0 }, date: new Date('2024-01-15T22:00:00Z') },
  { site: { latDeg: -33.8688, lonDeg: 151.2093, heightM: 50 }, date: new Date('2025-02-01T12:00:00Z') },
  { site: { latDeg: 19.8207, lonDeg: -155.4681, heightM: 4207 }, date: new Date('2023-06-21T10:00:00Z') },
];

describe('batched transform against the per-star full chain, whole catalogue (1″ goal of the brief)', () => {
  for (const { site, date } of cases) {
    it(`all ${cat.count} stars at φ ${site.latDeg}°, ${date.toISOString()}`, () => {
      const f = skyFrame(site, date);
      const alt = new Float64Array(cat.count), az = new Float64Array(cat.count);
      for (const mode of ['none', 'standard'] as const) {
        starsToHorizontal(cat, f, alt, az, { refraction: mode });
        let worst = 0;
        for (let i = 0; i < cat.count; i++) {
          const p = observeIcrs(f, cat.raDeg[i], cat.decDeg[i], mode);
          const dAlt = Math.abs(alt[i] - p.altDeg);
          const dAz = Math.abs(dAngle(az[i], p.azDeg)) * Math.cos(p.altDeg / RAD);
          worst = Math.max(worst, dAlt, dAz);
        }
        expect(worst * 3600).toBeLessThan(1);
      }
    });
  }

  it('starsToEnu gives unit vectors matching starsToHorizontal', () => {
    const f = skyFrame(cases[0].site, cases[0].date);
    const xyz = new Float32Array(3 * cat.count);
    const alt = new Float64Array(cat.count), az = new Float64Array(cat.count);
    starsToEnu(cat, f, xyz);
    starsToHorizontal(cat, f, alt, az);
    for (let i = 0; i < cat.count; i += 7) {
      const e = xyz[3 * i], n = xyz[3 * i + 1], u = xyz[3 * i + 2];
      expect(Math.abs(Math.hypot(e, n, u) - 1)).toBeLessThan(1e-6);
      expect(Math.abs(Math.asin(Math.min(1, u)) * RAD - alt[i])).toBeLessThan(1e-3);
    }
  });

  it('agrees with astronomy-engine (DefineStar + Equator + Horizon) to 1″ (it omits deflection and diurnal aberration)', () => {
    const { site, date } = cases[0];
    const f = skyFrame(site, date);
    const obs = new Astronomy.Observer(site.latDeg, site.lonDeg, site.heightM);
    let worst = 0;
    for (let i = 0; i < cat.count; i += 37) {
      Astronomy.DefineStar(Astronomy.Body.Star1, cat.raDeg[i] / 15, cat.decDeg[i], 1000);
      const eq = Astronomy.Equator(Astronomy.Body.Star1, date, obs, true, true);
      const hor = Astronomy.Horizon(date, obs, eq.ra, eq.dec);
      const p = observeIcrs(f, cat.raDeg[i], cat.decDeg[i], 'none');
      worst = Math.max(worst, Math.abs(hor.altitude - p.altDeg), Math.abs(dAngle(hor.azimuth, p.azDeg)) * Math.cos(p.altDeg / RAD));
    }
    expect(worst * 3600).toBeLessThan(1);
  });
});
