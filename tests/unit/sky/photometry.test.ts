/**
 * What the cards and the API show besides positions — the Moon's illuminated fraction and age, a planet's
 * magnitude and elongation — against the astronomia package (Meeus, Astronomical Algorithms, 2nd ed.):
 *  - Moon phase angle: Meeus eq. 48.4 (astronomia moonillum.phaseAngle3, good to ~0.3°, so 0.005 in k);
 *  - new moon: Meeus ch. 49 (astronomia moonphase.newMoon, within a minute or so) → age, ±0.005 d;
 *  - magnitudes: the Astronomical Almanac 1984 formulae (Meeus eq. 41.x, astronomia illum.mars84/jupiter84)
 *    with r, Δ and the phase angle from astronomia's full VSOP87B; ±0.1 mag (astronomy-engine, which the
 *    product uses for magnitudes, has later phase curves; they agree to a few hundredths for Jupiter);
 *  - elongation: the Sun–Earth–planet angle from the same VSOP87B vectors, ±0.02° (light time and aberration).
 */
import { describe, expect, it } from 'vitest';
import { phaseAngle3 } from 'astronomia/moonillum';
import { newMoon } from 'astronomia/moonphase';
import { mars84, jupiter84 } from 'astronomia/illum';
import { Planet } from 'astronomia/planetposition';
import earthData from 'astronomia/data/vsop87Bearth';
import marsData from 'astronomia/data/vsop87Bmars';
import jupiterData from 'astronomia/data/vsop87Bjupiter';
import { bodies } from '../../../src/lib/sky/bodies';
import { instantFromDate } from '../../../src/lib/sky/timescales';

const SITE = { latDeg: 51.4769, lonDeg: 0, heightM: 0 };
const DATES = ['2024-01-20T20:00:00Z', '2025-05-05T03:00:00Z', '2026-12-03T22:00:00Z', '2027-08-14T01:30:00Z', '2029-02-27T12:00:00Z'];
const D = Math.PI / 180;
const xyz = (p: { lon: number; lat: number; range: number }) => [p.range * Math.cos(p.lat) * Math.cos(p.lon), p.range * Math.cos(p.lat) * Math.sin(p.lon), p.range * Math.sin(p.lat)];
const angle = (a: number[], b: number[]) => Math.acos((a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) / Math.hypot(a[0], a[1], a[2]) / Math.hypot(b[0], b[1], b[2])) / D;

describe('the Moon: illuminated fraction and age (astronomia, Meeus ch. 48–49)', () => {
  for (const iso of DATES) {
    it(iso, () => {
      const moon = bodies(SITE, new Date(iso)).find((b) => b.body === 'moon')!;
      const jde = instantFromDate(new Date(iso)).jdTT;
      const k = (1 + Math.cos(phaseAngle3(jde))) / 2;
      expect(Math.abs(moon.illuminatedFraction! - k)).toBeLessThan(0.005);
      // The new moon before the instant: Meeus's new moon nearest a decimal year, stepped back a lunation if after.
      const year = 2000 + (jde - 2451545) / 365.25;
      let nm = newMoon(year);
      if (nm > jde) nm = newMoon(year - 29.530588853 / 365.25);
      if (jde - nm > 29.6) nm = newMoon(year + 29.530588853 / 365.25 / 2);
      const age = jde - nm; // both in TT
      expect(Math.abs(moon.ageDays! - age)).toBeLessThan(0.005);
    });
  }
});

describe('planets: magnitude and elongation (astronomia: full VSOP87B, Astronomical Almanac 1984 magnitudes)', () => {
  const earth = new Planet(earthData), mars = new Planet(marsData), jupiter = new Planet(jupiterData);
  for (const iso of DATES) {
    it(iso, () => {
      const jde = instantFromDate(new Date(iso)).jdTT;
      const all = bodies(SITE, new Date(iso));
      const e = xyz(earth.position2000(jde));
      for (const [name, planet, mag] of [['mars', mars, mars84], ['jupiter', jupiter, jupiter84]] as const) {
        const p = xyz(planet.position2000(jde));
        const g = [p[0] - e[0], p[1] - e[1], p[2] - e[2]];
        const r = Math.hypot(p[0], p[1], p[2]), delta = Math.hypot(g[0], g[1], g[2]);
        const i = angle(p, g); // phase angle: Sun–planet–Earth
        const elong = angle(g, [-e[0], -e[1], -e[2]]);
        const b = all.find((x) => x.body === name)!;
        expect(Math.abs(b.magnitude - mag(r, delta, i * D)), `${name} magnitude`).toBeLessThan(0.1);
        expect(Math.abs(b.elongationDeg! - elong), `${name} elongation`).toBeLessThan(0.02);
      }
    });
  }
});
