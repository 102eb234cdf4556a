import { describe, expect, it } from 'vitest';
import { greatCircles, referencePoints, circlePoints } from '../../../src/lib/sky/circles';
import { observe } from '../../../src/lib/sky/observe';
import { riseTransitSetDetailed } from '../../../src/lib/sky/events';
import { skyFrame } from '../../../src/lib/sky/apparent';
import { trueObliquityDeg } from '../../../src/lib/sky/nutation';
import { airmassKastenYoung, airmassPickering, airmassSecant } from '../../../src/lib/sky/airmass';
import { separationDeg, positionAngleDeg } from '../../../src/lib/sky/angles';
import { constellationOf } from '../../../src/lib/sky/constellation';
import { RAD } from '../../../src/lib/sky/math';
import { dms, hms } from './helpers';

const date = new Date('2024-09-10T03:17:00Z');

describe('the sphere itself (domain-facts.md, "The sphere itself")', () => {
  for (const lat of [-71.5, -33.87, 0, 19.82, 40, 51.48, 78.2]) {
    it(`pole altitude = latitude, equator meets the horizon at 90° and 270° (φ = ${lat}°)`, () => {
      const site = { latDeg: lat, lonDeg: 12.3, heightM: 0 };
      const rp = referencePoints(site, date);
      expect(Math.abs(rp.ncpAltitudeDeg - lat)).toBeLessThan(1e-9);
      expect(Math.abs(rp.poleAltitudeDeg - Math.abs(lat))).toBeLessThan(1e-9);
      expect(Math.abs(rp.scp.altDeg + lat)).toBeLessThan(1e-9);
      const eq = greatCircles(site, date).equator.poleEnu;
      // Equator ∩ horizon = ±(up × pole); its azimuths are the east and west points.
      const x = -eq[1], y = eq[0];
      const az = ((Math.atan2(x, y) * RAD) + 360) % 360;
      const a = Math.min(Math.abs(az - 90), Math.abs(az - 270));
      expect(a).toBeLessThan(1e-9);
      expect(rp.east.azDeg).toBeCloseTo(90, 12);
      expect(rp.west.azDeg).toBeCloseTo(270, 12);
      expect(rp.zenith.altDeg).toBeCloseTo(90, 12);
      expect(rp.nadir.altDeg).toBeCloseTo(-90, 12);
    });
  }

  it('transit altitude = 90° − |φ − δ| (true altitude, no refraction)', () => {
    const site = { latDeg: 40, lonDeg: -105, heightM: 0 };
    for (const dec of [-40, -10, 0, 25, 39, 45, 70]) {
      const target = { raDeg: 100, decDeg: dec };
      const r = riseTransitSetDetailed(site, target, new Date('2024-03-01T00:00:00Z'), new Date('2024-03-02T06:00:00Z'));
      const tr = r.events.find((e) => e.kind === 'transit')!;
      const o = observe(site, tr.time, target, { refraction: 'none' });
      // The apparent declination of date differs from the J2000 one by precession etc.: use it.
      expect(Math.abs(o.altDeg - (90 - Math.abs(40 - o.decOfDateDeg)))).toBeLessThan(1e-4);
      expect(Math.abs(o.haHours)).toBeLessThan(1 / 3600);
    }
  });

  it('a star is circumpolar where δ > 90° − φ (common practice)', () => {
    const site = { latDeg: 50, lonDeg: 0, heightM: 0 };
    const from = new Date('2024-01-01T00:00:00Z'), to = new Date('2024-01-03T00:00:00Z');
    expect(riseTransitSetDetailed(site, { raDeg: 10, decDeg: 45 }, from, to).alwaysUp).toBe(true);
    expect(riseTransitSetDetailed(site, { raDeg: 10, decDeg: 35 }, from, to).alwaysUp).toBe(false);
    expect(riseTransitSetDetailed(site, { raDeg: 10, decDeg: -45 }, from, to).alwaysDown).toBe(true);
  });

  it('the angle between ecliptic and horizon at the pole is the obliquity (ε = 23.44°; IAU 2006)', () => {
    const rp = referencePoints({ latDeg: 90, lonDeg: 0, heightM: 0 }, date);
    const f = skyFrame({ latDeg: 90, lonDeg: 0, heightM: 0 }, date);
    expect(Math.abs(rp.eclipticHorizonAngleDeg - trueObliquityDeg(f.dTT))).toBeLessThan(1e-6);
    expect(Math.abs(trueObliquityDeg(f.dTT) - 23.44)).toBeLessThan(0.01);
  });

  it('the ecliptic–horizon intersections are on the horizon and on the ecliptic, and 180° apart', () => {
    const site = { latDeg: 35, lonDeg: 139.7, heightM: 0 };
    const rp = referencePoints(site, date);
    const ecl = greatCircles(site, date).ecliptic.poleEnu;
    for (const p of [rp.eclipticHorizon1, rp.eclipticHorizon2]) {
      expect(Math.abs(p.altDeg)).toBeLessThan(1e-9);
      expect(Math.abs(p.enu[0] * ecl[0] + p.enu[1] * ecl[1] + p.enu[2] * ecl[2])).toBeLessThan(1e-12);
    }
    expect(Math.abs(Math.abs(rp.eclipticHorizon1.azDeg - rp.eclipticHorizon2.azDeg) - 180)).toBeLessThan(1e-9);
    // equinoxes and solstices lie on the ecliptic, 90° apart
    for (const k of ['marchEquinox', 'septemberEquinox', 'juneSolstice', 'decemberSolstice'] as const) {
      const e = rp[k].enu;
      expect(Math.abs(e[0] * ecl[0] + e[1] * ecl[1] + e[2] * ecl[2])).toBeLessThan(1e-12);
    }
  });

  it('circlePoints are unit vectors perpendicular to the pole', () => {
    const pole = greatCircles({ latDeg: 10, lonDeg: 0, heightM: 0 }, date).galactic.poleEnu;
    const pts = circlePoints(pole, 64);
    for (let i = 0; i < 64; i++) {
      const x = pts[3 * i], y = pts[3 * i + 1], z = pts[3 * i + 2];
      expect(Math.abs(Math.hypot(x, y, z) - 1)).toBeLessThan(1e-12);
      expect(Math.abs(x * pole[0] + y * pole[1] + z * pole[2])).toBeLessThan(1e-12);
    }
  });
});

describe('airmass, separation, position angle, constellation', () => {
  it('A18: Kasten & Young 1989 at z = 60°, 80°, 89.9° (Kasten & Young, Appl. Opt. 28, 4735)', () => {
    // 1.9943, 5.586, 36.467; ±0.001 (5.586 is quoted to 3 decimals → ±0.001 on rounding)
    expect(Math.abs(airmassKastenYoung(30)! - 1.9943)).toBeLessThan(0.001);
    expect(Math.abs(airmassKastenYoung(10)! - 5.586)).toBeLessThan(0.001);
    expect(Math.abs(airmassKastenYoung(0.1)! - 36.467)).toBeLessThan(0.001);
  });

  it('derived check values (domain-facts.md "Airmass")', () => {
    // h = 30°: sec 2.000, K&Y 1.994, Pickering 1.993; h = 10°: 5.759 / 5.586 / 5.581; h = 0: ∞ / 37.92 / 38.75
    expect(airmassSecant(30)!).toBeCloseTo(2.0, 3);
    expect(airmassPickering(30)!).toBeCloseTo(1.993, 3);
    expect(airmassSecant(10)!).toBeCloseTo(5.759, 3);
    expect(airmassPickering(10)!).toBeCloseTo(5.581, 3);
    expect(airmassKastenYoung(0)!).toBeCloseTo(37.92, 2);
    expect(airmassPickering(0)!).toBeCloseTo(38.75, 2);
    expect(airmassKastenYoung(-0.1)).toBeNull();
    expect(airmassPickering(-1)).toBeNull();
  });

  it('A15: separation of Arcturus and Spica is 32.7930° (Meeus Ex. 17.a)', () => {
    // Arcturus 14h15m39.7s +19°10′57″; Spica 13h25m11.6s −11°09′41″; ±1″
    const d = separationDeg(hms(14, 15, 39.7), dms(1, 19, 10, 57), hms(13, 25, 11.6), dms(-1, 11, 9, 41));
    expect(Math.abs(d - 32.793) * 3600).toBeLessThan(1);
    expect(separationDeg(10, 20, 10, 20)).toBe(0);
    expect(Math.abs(separationDeg(0, 0, 180, 0) - 180)).toBeLessThan(1e-12);
  });

  it('position angle: north is 0°, east is 90° (common practice)', () => {
    expect(positionAngleDeg(100, 10, 100, 11)).toBeCloseTo(0, 9);
    expect(positionAngleDeg(100, 0, 101, 0)).toBeCloseTo(90, 9);
    expect(positionAngleDeg(100, 0, 99, 0)).toBeCloseTo(270, 9);
    expect(positionAngleDeg(100, 10, 100, 9)).toBeCloseTo(180, 9);
  });

  it('constellations of well-known stars (IAU boundaries; common knowledge)', () => {
    expect(constellationOf(88.7929, 7.4071).abbr).toBe('Ori'); // Betelgeuse
    expect(constellationOf(101.2872, -16.7161).abbr).toBe('CMa'); // Sirius
    expect(constellationOf(37.9546, 89.2641).abbr).toBe('UMi'); // Polaris
    expect(constellationOf(279.2347, 38.7837).abbr).toBe('Lyr'); // Vega
  });
});
