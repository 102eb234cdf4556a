import { describe, expect, it } from 'vitest';
import { Equatorial } from 'astronomia/coord';
import { Precessor } from 'astronomia/precess';
import { nutation as nutation1980 } from 'astronomia/nutation';
import { mean as gmst1982Seconds } from 'astronomia/sidereal';
import {
  FRAME_NAMES, BIAS, convertDirection, convertDirections, enuFromOfDateMatrix, equatorialToEcliptic, frameMatrix, galacticFromIcrs,
  icrsFromGalactic, precessionMatrix, anglesInFrame, vectorInFrame,
} from '../../../src/lib/sky/frames';
import { nutationIau2000b } from '../../../src/lib/sky/nutation';
import { gmstHours, J2000_JD } from '../../../src/lib/sky/timescales';
import { angleBetween, mat3, mul, mulVec, RAD, DEG } from '../../../src/lib/sky/math';
import { dAngle, dms, hms, rng } from './helpers';

const site = { latDeg: 51.4769, lonDeg: -0.0005, heightM: 46 };
const date = new Date('2024-03-20T21:30:00Z');

describe('textbook conversions', () => {
  it('A3: equatorial → horizontal (Meeus Ex. 13.b)', () => {
    // Meeus Ex. 13.b: Venus apparent α 23h09m16.641s, δ −6°43′11.61″; φ +38°55′17″; λ 77°03′56″ W;
    // GAST 8h34m56.853s → A 68.0337° from S = 248.0337° from N, h 15.1249°; ±0.001°.
    const lat = dms(1, 38, 55, 17), lon = -dms(1, 77, 3, 56);
    const last = hms(8, 34, 56.853) + lon;
    const m = enuFromOfDateMatrix(mat3(), lat, last);
    const v = mulVec([0, 0, 0], m, vectorInFrame([0, 0, 0], 'icrs', hms(23, 9, 16.641), dms(-1, 6, 43, 11.61)));
    const [az, alt] = anglesInFrame('horizontal', v);
    expect(Math.abs(az - 248.0337)).toBeLessThan(0.001);
    expect(Math.abs(alt - 15.1249)).toBeLessThan(0.001);
  });

  it('A4: equatorial → ecliptic for Pollux (Meeus Ex. 13.a)', () => {
    // Meeus Ex. 13.a: α 7h45m18.946s, δ +28°01′34.26″, ε 23.4392911° → λ 113.215630°, β +6.684170°; ±2e-6°.
    const e = equatorialToEcliptic(hms(7, 45, 18.946), dms(1, 28, 1, 34.26), 23.4392911);
    expect(Math.abs(e.lonDeg - 113.21563)).toBeLessThan(2e-6);
    expect(Math.abs(e.latDeg - 6.68417)).toBeLessThan(2e-6);
  });

  it('A5: ICRS → galactic (IAU SOFA/ERFA test suite, t_icrs2g)', () => {
    // ERFA t_icrs2g: α 5.9338074302227188048671 rad = 339.982122°, δ −1.1784870613579944551541 rad
    // = −67.522335° → l 5.5850536063818546461558 rad = 320°, b −0.7853981633974483096157 rad = −45°.
    const g = galacticFromIcrs((5.9338074302227188048671 * 180) / Math.PI, (-1.1784870613579944551541 * 180) / Math.PI);
    expect(Math.abs(g.lDeg - 320)).toBeLessThan(1e-6);
    expect(Math.abs(g.bDeg - -45)).toBeLessThan(1e-6);
  });

  it('A6: galactic frame constants (Hipparcos Catalogue, ESA 1997, as in IAU SOFA icrs2g)', () => {
    // North galactic pole α 192.85948°, δ +27.12825° → b = 90°; l of the NCP 122.93192°;
    // galactic centre α 266.404995°, δ −28.936174° → l = 0, b = 0; 1e-5°.
    expect(Math.abs(galacticFromIcrs(192.85948, 27.12825).bDeg - 90)).toBeLessThan(1e-5);
    expect(Math.abs(galacticFromIcrs(0, 90).lDeg - 122.93192)).toBeLessThan(1e-5);
    const gc = galacticFromIcrs(266.404995, -28.936174);
    expect(Math.abs(dAngle(gc.lDeg, 0))).toBeLessThan(1e-5);
    expect(Math.abs(gc.bDeg)).toBeLessThan(1e-5);
    const back = icrsFromGalactic(0, 0);
    expect(Math.abs(back.raDeg - 266.404995)).toBeLessThan(1e-5);
    expect(Math.abs(back.decDeg - -28.936174)).toBeLessThan(1e-5);
  });
});

describe('frame rotations', () => {
  it('every frame matrix is a rotation (orthonormal, det +1)', () => {
    for (const a of FRAME_NAMES) for (const b of FRAME_NAMES) {
      const m = frameMatrix(a, b, site, date);
      const mt = Float64Array.of(m[0], m[3], m[6], m[1], m[4], m[7], m[2], m[5], m[8]);
      const p = mul(mat3(), m, mt);
      for (let i = 0; i < 9; i++) expect(Math.abs(p[i] - (i % 4 === 0 ? 1 : 0))).toBeLessThan(1e-14);
      const det = m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
      expect(Math.abs(det - 1)).toBeLessThan(1e-14);
    }
  });

  it('round trips between every pair of frames to 1e-9° (common practice: rotations are exactly invertible)', () => {
    const r = rng(7);
    let worst = 0;
    for (const a of FRAME_NAMES) for (const b of FRAME_NAMES) {
      for (let k = 0; k < 20; k++) {
        const lon = r() * 360, lat = Math.asin(2 * r() - 1) * RAD;
        const there = convertDirection(a, b, lon, lat, site, date);
        const back = convertDirection(b, a, there.lonDeg, there.latDeg, site, date);
        const d = angleBetween(vectorInFrame([0, 0, 0], a, lon, lat), vectorInFrame([0, 0, 0], a, back.lonDeg, back.latDeg)) * RAD;
        worst = Math.max(worst, d);
      }
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('typed-array conversion equals one-at-a-time conversion (allocation-free batch)', () => {
    const r = rng(21);
    const n = 500;
    const lon = Float64Array.from({ length: n }, () => r() * 360);
    const lat = Float64Array.from({ length: n }, () => Math.asin(2 * r() - 1) * RAD);
    const outLon = new Float64Array(n), outLat = new Float64Array(n);
    for (const [a, b] of [['icrs', 'horizontal'], ['horizontal', 'galactic'], ['eclipticOfDate', 'icrs']] as const) {
      convertDirections(frameMatrix(a, b, site, date), a, b, lon, lat, outLon, outLat);
      for (let i = 0; i < n; i += 25) {
        const one = convertDirection(a, b, lon[i], lat[i], site, date);
        expect(Math.abs(dAngle(outLon[i], one.lonDeg)) * Math.cos(one.latDeg * DEG)).toBeLessThan(1e-9);
        expect(Math.abs(outLat[i] - one.latDeg)).toBeLessThan(1e-9);
      }
    }
  });

  it('composition: icrs → galactic → horizontal equals icrs → horizontal', () => {
    const a = frameMatrix('icrs', 'galactic', site, date);
    const b = frameMatrix('galactic', 'horizontal', site, date);
    const c = frameMatrix('icrs', 'horizontal', site, date);
    const ab = mul(mat3(), b, a);
    for (let i = 0; i < 9; i++) expect(Math.abs(ab[i] - c[i])).toBeLessThan(1e-14);
  });
});

describe('cross-check against the astronomia package (Meeus, Astronomical Algorithms)', () => {
  const N = 1000;

  it(`equatorial → ecliptic on ${N} random inputs (astronomia coord.Equatorial.toEcliptic)`, () => {
    const r = rng(11);
    let worst = 0;
    for (let k = 0; k < N; k++) {
      const ra = r() * 360, dec = Math.asin(2 * r() - 1) * RAD, eps = 22 + r() * 3;
      const mine = equatorialToEcliptic(ra, dec, eps);
      const theirs = new Equatorial(ra * DEG, dec * DEG).toEcliptic(eps * DEG);
      const d = angleBetween(vectorInFrame([0, 0, 0], 'icrs', mine.lonDeg, mine.latDeg), vectorInFrame([0, 0, 0], 'icrs', theirs.lon * RAD, theirs.lat * RAD));
      worst = Math.max(worst, d * RAD);
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it(`equatorial → horizontal on ${N} random inputs (astronomia coord.Equatorial.toHorizontal; Meeus azimuth from south, longitude west)`, () => {
    const r = rng(12);
    let worst = 0;
    for (let k = 0; k < N; k++) {
      const ra = r() * 360, dec = Math.asin(2 * r() - 1) * RAD;
      const lat = Math.asin(2 * r() - 1) * RAD, lonEast = r() * 360 - 180, stSec = r() * 86400;
      const last = (stSec / 240 + lonEast) % 360;
      const v = mulVec([0, 0, 0], enuFromOfDateMatrix(mat3(), lat, last), vectorInFrame([0, 0, 0], 'icrs', ra, dec));
      const h = new Equatorial(ra * DEG, dec * DEG).toHorizontal({ lat: lat * DEG, lon: -lonEast * DEG }, stSec);
      const theirs = vectorInFrame([0, 0, 0], 'horizontal', h.az * RAD + 180, h.alt * RAD);
      worst = Math.max(worst, angleBetween(v, theirs) * RAD);
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it(`precession J2000 → mean of date on ${N} random inputs, 1950–2050 (astronomia precess.Precessor, IAU 1976)`, () => {
    // IAU 1976 (Lieske) vs IAU 2006 (P03): P03 corrected the precession rate by −0.30″ per century
    // (Capitaine et al. 2003), plus the 23 mas frame bias → allowed 0.025″ + 0.35″ × |Δt| / century.
    const r = rng(13);
    let worst = 0;
    for (let k = 0; k < N; k++) {
      const ra = r() * 360, dec = Math.asin(1.9 * r() - 0.95) * RAD;
      const epoch = 1950 + r() * 100;
      const dTT = (epoch - 2000) * 365.25;
      const pb = mul(mat3(), precessionMatrix(mat3(), dTT), BIAS);
      const v = mulVec([0, 0, 0], pb, vectorInFrame([0, 0, 0], 'icrs', ra, dec));
      const e = new Precessor(2000, epoch).precess(new Equatorial(ra * DEG, dec * DEG));
      const d = angleBetween(v, vectorInFrame([0, 0, 0], 'icrs', e.ra * RAD, e.dec * RAD)) * RAD * 3600;
      worst = Math.max(worst, d / (0.025 + (0.35 * Math.abs(epoch - 2000)) / 100));
    }
    expect(worst).toBeLessThan(1);
  });

  it(`nutation on ${N} random dates 1950–2050 (astronomia nutation, IAU 1980 series)`, () => {
    // IAU 1980 vs IAU 2000B differ by a few hundredths of an arcsecond (from memory: < 0.05″).
    const r = rng(14);
    let worstPsi = 0, worstEps = 0;
    for (let k = 0; k < N; k++) {
      const dTT = (r() * 100 - 50) * 365.25;
      const [dpsi, deps] = nutation1980(dTT + J2000_JD);
      const n = nutationIau2000b(dTT);
      worstPsi = Math.max(worstPsi, Math.abs(n.dPsiRad - dpsi) * RAD * 3600);
      worstEps = Math.max(worstEps, Math.abs(n.dEpsRad - deps) * RAD * 3600);
    }
    expect(worstPsi).toBeLessThan(0.06);
    expect(worstEps).toBeLessThan(0.03);
  });

  it(`mean sidereal time on ${N} random instants 1970–2050 (astronomia sidereal.mean, IAU 1982)`, () => {
    // GMST82 (UT1-based polynomial) vs GMST06 (ERA-based): a few milliseconds (from memory).
    const r = rng(15);
    let worst = 0;
    for (let k = 0; k < N; k++) {
      const dUT = (r() * 80 - 30) * 365.25;
      const mine = gmstHours(dUT, dUT + 65 / 86400) * 3600;
      const theirs = gmst1982Seconds(dUT + J2000_JD);
      const d = Math.abs(((mine - theirs + 43200 * 3) % 86400) - 43200);
      worst = Math.max(worst, d);
    }
    expect(worst).toBeLessThan(0.01);
  });
});
