/**
 * The geometry handed to three.js: rings built from the sky engine's poles, the ENU → world mapping, and
 * star directions. Check values name their source beside them.
 */
import { describe, expect, it } from 'vitest';
import * as sky from '../../../src/lib/sky';
import {
  altAzToEnu, angleDeg, buildGrid, enuListToWorld, enuToAltAz, enuToWorld, greatCircle, raySphereDirection, ringNormal, ringPlanarity,
  smallCircle, SPHERE_RADIUS, worldToEnu, formatHours, formatDms, compassWord, envelopeShell, envelopeTintFace, tintIndices,
} from '../../../src/components/sphere/geometry';
import { SIDEREAL_PER_SOLAR, SIDEREAL_DAY_MS, fromLocalInputValue, toLocalInputValue, wallTimeToUtc, zoneOffsetMinutes } from '../../../src/components/sphere/clock';

const DEG = Math.PI / 180;
// Invented test sites (not real observatories).
const SITES = [
  { latDeg: 38.912, lonDeg: -106.254, heightM: 3120 },
  { latDeg: -33.87, lonDeg: 151.21, heightM: 40 },
  { latDeg: 64.2, lonDeg: -21.9, heightM: 0 },
  { latDeg: 0.5, lonDeg: 10, heightM: 0 },
];
const WHEN = new Date('2026-03-20T19:30:00Z');

/** World ring of a great circle, from the engine's pole, as the view builds it. */
function worldRing(poleEnu: ArrayLike<number>): Float32Array {
  return enuListToWorld(greatCircle(poleEnu, 256), SPHERE_RADIUS);
}
const up = [0, 1, 0]; // world: y = up

describe('ENU → world mapping (x = east, y = up, z = −north)', () => {
  it('maps the cardinal directions', () => {
    // Convention of the view (x east, y up, z −north) and of the engine (ENU = [sin A cos h, cos A cos h, sin h]).
    expect(Array.from(enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], 0, 0)))).toEqual([0, 0, -1].map((x) => expect.closeTo(x, 12)));
    expect(Array.from(enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], 90, 0)))).toEqual([1, 0, 0].map((x) => expect.closeTo(x, 12)));
    expect(Array.from(enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], 0, 90)))).toEqual([0, 1, 0].map((x) => expect.closeTo(x, 12)));
  });
  it('is a proper rotation (right-handed: east × north = up in both frames)', () => {
    const e = enuToWorld([0, 0, 0], [1, 0, 0]), n = enuToWorld([0, 0, 0], [0, 1, 0]), u = enuToWorld([0, 0, 0], [0, 0, 1]);
    const c = [e[1] * n[2] - e[2] * n[1], e[2] * n[0] - e[0] * n[2], e[0] * n[1] - e[1] * n[0]];
    c.forEach((x, i) => expect(x).toBeCloseTo(u[i], 12));
  });
  it('round-trips through worldToEnu and alt/az', () => {
    for (const [az, alt] of [[12.5, 33], [200, -10], [359, 89]]) {
      const w = enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], az, alt));
      const back = enuToAltAz(worldToEnu([0, 0, 0], w));
      expect(back.azDeg).toBeCloseTo(az, 10);
      expect(back.altDeg).toBeCloseTo(alt, 10);
    }
  });
});

describe('rings built from the engine', () => {
  for (const site of SITES) {
    const gc = sky.greatCircles(site, WHEN);
    it(`horizon ring: normal is the zenith (φ ${site.latDeg})`, () => {
      const pts = worldRing(gc.horizon.poleEnu);
      const n = ringNormal(pts, up);
      expect(angleDeg(n, up)).toBeLessThan(1e-6);
      expect(ringPlanarity(pts, n)).toBeLessThan(1e-3);
    });
    it(`equator ring: normal is the pole at altitude = latitude (φ ${site.latDeg})`, () => {
      // Altitude of the celestial pole = latitude of the site (domain facts, "The sphere itself"; common practice).
      const pts = worldRing(gc.equator.poleEnu);
      const n = ringNormal(pts, up);
      const { altDeg, azDeg } = enuToAltAz(worldToEnu([0, 0, 0], n));
      expect(altDeg).toBeCloseTo(Math.abs(site.latDeg), 1);
      // The elevated pole lies on the meridian: due north in the northern hemisphere, due south in the southern.
      const dAz = Math.abs(((azDeg - (site.latDeg >= 0 ? 0 : 180) + 540) % 360) - 180);
      expect(dAz).toBeLessThan(0.05);
      // The equator meets the horizon at azimuth 90° and 270° (domain facts).
      const east = enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], 90, 0));
      expect(Math.abs(n[0] * east[0] + n[1] * east[1] + n[2] * east[2])).toBeLessThan(2e-3);
    });
    it(`ecliptic ring: at the obliquity to the equator (φ ${site.latDeg})`, () => {
      // Mean obliquity at J2000 23.439279° (IAU 2006, P03; domain facts); of date in 2026 it is ~0.003° less
      // and nutation adds up to ±0.003°: 0.01° tolerance.
      const ne = ringNormal(worldRing(gc.equator.poleEnu));
      const nc = ringNormal(worldRing(gc.ecliptic.poleEnu));
      const a = angleDeg(ne, nc);
      expect(Math.min(a, 180 - a)).toBeCloseTo(23.4393, 1);
      expect(Math.abs(Math.min(a, 180 - a) - 23.4393)).toBeLessThan(0.01);
    });
    it(`meridian contains the zenith and the poles (φ ${site.latDeg})`, () => {
      const n = ringNormal(worldRing(gc.meridian.poleEnu));
      const z = enuToWorld([0, 0, 0], [0, 0, 1]);
      const p = enuToWorld([0, 0, 0], gc.equator.poleEnu);
      expect(Math.abs(n[0] * z[0] + n[1] * z[1] + n[2] * z[2])).toBeLessThan(1e-6);
      expect(Math.abs(n[0] * p[0] + n[1] * p[1] + n[2] * p[2])).toBeLessThan(2e-3);
    });
  }
  it('ring points all lie on the sphere and 90° from the pole', () => {
    const pole = sky.greatCircles(SITES[0], WHEN).galactic.poleEnu;
    const ring = greatCircle(pole, 64);
    for (let i = 0; i < ring.length; i += 3) {
      const v = [ring[i], ring[i + 1], ring[i + 2]];
      expect(Math.hypot(v[0], v[1], v[2])).toBeCloseTo(1, 12);
      expect(angleDeg(v, pole)).toBeCloseTo(90, 9);
    }
  });
  it('agrees with the engine’s own circlePoints (same circle)', () => {
    const pole = sky.greatCircles(SITES[1], WHEN).ecliptic.poleEnu;
    const theirs = sky.circlePoints(pole, 32);
    const mine = greatCircle(pole, 256);
    const nMine = ringNormal(mine), nTheirs = ringNormal(theirs);
    const a = angleDeg(nMine, nTheirs);
    expect(Math.min(a, 180 - a)).toBeLessThan(1e-6);
  });
  it('small circle (keep-out ring) is at the requested radius', () => {
    const c = altAzToEnu([0, 0, 0], 123, 40);
    const ring = smallCircle(c, 15, 48);
    for (let i = 0; i < ring.length; i += 3) expect(angleDeg([ring[i], ring[i + 1], ring[i + 2]], c)).toBeCloseTo(15, 9);
  });
});

describe('stars: world direction matches the engine alt/az', () => {
  const cat = sky.loadCatalogue();
  for (const site of SITES.slice(0, 2)) {
    it(`every catalogue star (φ ${site.latDeg})`, () => {
      const f = sky.skyFrame(site, WHEN);
      const enu = new Float32Array(cat.count * 3);
      sky.starsToEnu(cat, f, enu);
      const alt = new Float64Array(cat.count), az = new Float64Array(cat.count);
      sky.starsToHorizontal(cat, f, alt, az);
      const world = enuListToWorld(enu, SPHERE_RADIUS);
      let worst = 0;
      for (let i = 0; i < cat.count; i++) {
        const w = [world[i * 3], world[i * 3 + 1], world[i * 3 + 2]];
        const expected = enuToWorld([0, 0, 0], altAzToEnu([0, 0, 0], az[i], alt[i]));
        worst = Math.max(worst, angleDeg(w, expected));
      }
      // Float32 vertex precision: ~1e-7 rad ≈ 0.02″; allow 1″.
      expect(worst).toBeLessThan(1 / 3600);
    });
  }
  it('Sirius (HR 2491) from an invented mid-northern site agrees with the engine observe()', () => {
    const site = SITES[0];
    const i = Array.from(cat.hr).indexOf(2491);
    const obs = sky.observe(site, WHEN, { raDeg: cat.raDeg[i], decDeg: cat.decDeg[i] });
    const f = sky.skyFrame(site, WHEN);
    const enu = new Float32Array(cat.count * 3);
    sky.starsToEnu(cat, f, enu);
    const w = enuToWorld([0, 0, 0], [enu[i * 3], enu[i * 3 + 1], enu[i * 3 + 2]]);
    const aa = enuToAltAz(worldToEnu([0, 0, 0], w));
    expect(Math.abs(aa.altDeg - obs.altDeg) * 3600).toBeLessThan(2);
    expect(Math.abs(aa.azDeg - obs.azDeg) * 3600 * Math.cos(obs.altDeg * DEG)).toBeLessThan(2);
  });
});

describe('picking rays', () => {
  it('from the centre (Observer view) returns the ray direction', () => {
    const d = raySphereDirection([0, 0, 0], [0.3, 0.4, -0.5], SPHERE_RADIUS)!;
    const n = Math.hypot(0.3, 0.4, -0.5);
    expect(d[0]).toBeCloseTo(0.3 / n, 12);
  });
  it('from outside (Sphere view) returns the near hit', () => {
    const d = raySphereDirection([0, 0, 300], [0, 0, -1], SPHERE_RADIUS)!;
    expect(d).toEqual([0, 0, 1].map((x) => expect.closeTo(x, 12)));
    expect(raySphereDirection([0, 0, 300], [0, 1, 0], SPHERE_RADIUS)).toBeNull();
  });
});

describe('grids', () => {
  it('alt-az grid: parallels every 15°, meridians every 30°, endpoints on the unit sphere', () => {
    const g = buildGrid((az, alt, o) => altAzToEnu(o, az, alt), { lonStep: 30, latStep: 15, lonLabel: String, latLabel: String });
    expect(g.labels.filter((l) => /^-?\d+$/.test(l.text)).length).toBe(11 + 12);
    for (let i = 0; i < g.segments.length; i += 3) expect(Math.hypot(g.segments[i], g.segments[i + 1], g.segments[i + 2])).toBeCloseTo(1, 12);
  });
});

describe('time helpers', () => {
  it('sidereal rate: 24 h / 23h56m04.0905s = 1.0027379 (domain facts; common practice)', () => {
    expect(SIDEREAL_DAY_MS).toBe((23 * 3600 + 56 * 60 + 4.0905) * 1000);
    expect(SIDEREAL_PER_SOLAR).toBeCloseTo(1.0027379, 7);
  });
  it('engine LST advances 1.0027379 h per clock hour', () => {
    const a = sky.skyFrame(SITES[0], WHEN).lstHours;
    const b = sky.skyFrame(SITES[0], new Date(WHEN.getTime() + 3600_000)).lstHours;
    expect(((b - a + 24) % 24)).toBeCloseTo(1.0027379, 5);
  });
  it('wall time in a zone ↔ UTC (America/Denver is UTC−7 in winter, UTC−6 in summer: IANA tz database)', () => {
    expect(zoneOffsetMinutes(Date.parse('2026-01-15T12:00:00Z'), 'America/Denver')).toBe(-420);
    expect(zoneOffsetMinutes(Date.parse('2026-07-15T12:00:00Z'), 'America/Denver')).toBe(-360);
    expect(new Date(wallTimeToUtc({ year: 2026, month: 7, day: 15, hour: 21, minute: 30, second: 0 }, 'America/Denver')).toISOString()).toBe('2026-07-16T03:30:00.000Z');
    const ms = Date.parse('2026-03-20T19:30:00Z');
    expect(fromLocalInputValue(toLocalInputValue(ms, 'Europe/Madrid'), 'Europe/Madrid')).toBe(ms);
  });
});

describe('formatting', () => {
  it('sexagesimal hours and degrees', () => {
    expect(formatHours(6.5, 1)).toBe('06h 30m 00.0s');
    expect(formatDms(-16.716111)).toBe('−16° 42′ 58″');
    expect(compassWord(0)).toBe('north');
    expect(compassWord(225)).toBe('southwest');
    expect(compassWord(350)).toBe('north');
  });
});

describe('envelope tint shell', () => {
  // three.js draws a triangle's front face where its vertices wind counter-clockwise, i.e. where the normal
  // (v1 − v0) × (v2 − v0) points towards the viewer (OpenGL convention, common practice).
  const { positions, indices } = envelopeShell(120, 45, SPHERE_RADIUS * 0.99);
  it('covers the visible hemisphere on a sphere of the given radius', () => {
    expect(positions.length / 3).toBe(121 * 46);
    expect(indices.length).toBe(120 * 45 * 6);
    for (let i = 0; i < positions.length; i += 3) {
      expect(Math.hypot(positions[i], positions[i + 1], positions[i + 2])).toBeCloseTo(99, 4); // Float32 vertices
      expect(positions[i + 1]).toBeGreaterThanOrEqual(-1e-9); // world y = up: nothing below the horizon
    }
  });
  it('front faces look inwards, towards the observer at the centre', () => {
    let inward = 0;
    for (let t = 0; t < indices.length; t += 3) {
      const p = [0, 1, 2].map((j) => [positions[indices[t + j] * 3], positions[indices[t + j] * 3 + 1], positions[indices[t + j] * 3 + 2]]);
      const u = p[1].map((x, i) => x - p[0][i]), v = p[2].map((x, i) => x - p[0][i]);
      const n = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
      const area = Math.hypot(n[0], n[1], n[2]);
      if (area < 1e-9) continue; // the cells at the zenith collapse to a point
      const c = [0, 1, 2].map((i) => (p[0][i] + p[1][i] + p[2][i]) / 3);
      // The observer sits at the origin: a front face seen from there has its normal pointing at it.
      expect(n[0] * -c[0] + n[1] * -c[1] + n[2] * -c[2]).toBeGreaterThan(0);
      inward++;
    }
    expect(inward).toBeGreaterThan(120 * 44 * 2);
  });
  it('draws the inner face from inside the shell and the outer face from outside', () => {
    expect(envelopeTintFace(0, 99)).toBe('inner'); // Observer view: camera at the observer
    expect(envelopeTintFace(330, 99)).toBe('outer'); // Sphere view: camera 330 units out
  });
});

describe('envelope tint triangles', () => {
  const NA = 120, NB = 45, row = NA + 1;
  // Forbidden: below 20° altitude, plus a blob — an invented envelope, shaped like the demo's.
  const forbidden = (v: number) => {
    const a = v % row, b = Math.floor(v / row);
    return b < 10 || ((a - 30) ** 2 + (b - 25) ** 2 < 120) || (a * 7 + b * 3) % 97 === 0;
  };
  const out = new Uint32Array(NA * NB * 6);
  const k = tintIndices(forbidden, NA, NB, out, 6);
  const cover = new Map<number, number>();
  const quads: { a: number; b0: number; b1: number }[] = [];
  for (let t = 0; t < k; t += 6) {
    const i0 = out[t], j0 = out[t + 2];
    const q = { a: i0 % row, b0: Math.floor(i0 / row), b1: Math.floor(j0 / row) };
    quads.push(q);
    // Same winding as the full shell: (i0, i0+1, j0), (i0+1, j0+1, j0).
    expect([out[t + 1], out[t + 3], out[t + 4], out[t + 5]]).toEqual([i0 + 1, i0 + 1, j0 + 1, j0]);
    for (let b = q.b0; b < q.b1; b++) cover.set(b * NA + q.a, (cover.get(b * NA + q.a) ?? 0) + 1);
  }
  it('covers exactly the cells with a forbidden corner, each once', () => {
    for (let b = 0; b < NB; b++) {
      for (let a = 0; a < NA; a++) {
        const i = b * row + a;
        const any = forbidden(i) || forbidden(i + 1) || forbidden(i + row) || forbidden(i + row + 1);
        expect(cover.get(b * NA + a) ?? 0).toBe(any ? 1 : 0);
      }
    }
  });
  it('merges only wholly forbidden cells, at most 6 to a quad, and needs far fewer triangles', () => {
    for (const q of quads) {
      expect(q.b1 - q.b0).toBeLessThanOrEqual(6);
      if (q.b1 - q.b0 > 1) for (let b = q.b0; b <= q.b1; b++) expect(forbidden(b * row + q.a) && forbidden(b * row + q.a + 1)).toBe(true);
    }
    expect(quads.length).toBeLessThan(cover.size / 2);
  });
});
