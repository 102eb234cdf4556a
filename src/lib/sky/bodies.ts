/**
 * Sun, Moon and planets as apparent topocentric places.
 *
 * Sun and planets: heliocentric positions from the VSOP87B series (planets/series.ts), the observer's
 * heliocentric position (Earth + site), light time (the planet taken at t − τ), then aberration with the
 * observer's total velocity (apparent.ts), and the engine's own N·P·B and Earth rotation, so bodies and
 * stars share one frame. Within 1″ of JPL DE405 + IAU SOFA (tests/unit/sky/bodies-de405.test.ts).
 * Moon: astronomy-engine's geocentric Moon series, made topocentric with the
 * frame's own observer position (WGS84, UT1 and polar motion) and given diurnal aberration; within 2″ of DE405.
 * Light deflection is neglected for bodies (< 0.1″ beyond 5° from the Sun).
 */
import { Astronomy } from './astronomy';
import { DEG, RAD, wrap360 } from './math';
import { KM_PER_AU, MOON_RADIUS_KM } from './constants';
import { aberrate, addDiurnalAberration, describeEnu, skyFrame, type HorizontalPlace, type SkyFrame } from './apparent';
import { heliocentricIcrs, type SeriesBody } from './planets/series';
import { nodeInterpolator } from './ephemeris-nodes';
import { C_AU_PER_DAY } from './constants';
import { mulVec } from './math';
import type { SiteInput } from './frames';
import type { RefractionMode } from './refraction';

export type BodyName = 'sun' | 'moon' | 'mercury' | 'venus' | 'mars' | 'jupiter' | 'saturn' | 'uranus' | 'neptune';
export const BODY_NAMES: readonly BodyName[] = ['sun', 'moon', 'mercury', 'venus', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune'];

const BODY_ENUM: Record<BodyName, Astronomy.Body> = {
  sun: Astronomy.Body.Sun,
  moon: Astronomy.Body.Moon,
  mercury: Astronomy.Body.Mercury,
  venus: Astronomy.Body.Venus,
  mars: Astronomy.Body.Mars,
  jupiter: Astronomy.Body.Jupiter,
  saturn: Astronomy.Body.Saturn,
  uranus: Astronomy.Body.Uranus,
  neptune: Astronomy.Body.Neptune,
};
export const astronomyBody = (b: BodyName): Astronomy.Body => BODY_ENUM[b];
export const isBodyName = (s: string): s is BodyName => (BODY_NAMES as readonly string[]).includes(s);

/** Equatorial radius (km) for the apparent semidiameter. Sun: IAU 2015 nominal; others IAU WGCCRE. */
const RADIUS_KM: Record<BodyName, number> = {
  sun: 695700, moon: MOON_RADIUS_KM, mercury: 2440.5, venus: 6051.8, mars: 3396.2,
  jupiter: 71492, saturn: 60268, uranus: 25559, neptune: 24764,
};

export interface BodyVector {
  /** Apparent topocentric unit vector, ICRS axes (light time, aberration incl. diurnal). */
  icrs: [number, number, number];
  /** The same in ENU (unrefracted). */
  enu: [number, number, number];
  distanceKm: number;
}

const scratchE = [0, 0, 0];
const scratchM = [0, 0, 0];
const scratchP = [0, 0, 0];

/**
 * The Moon's geometric geocentric position (au, EQJ = ICRS axes), astronomy-engine's series at hourly
 * nodes of its TT and cubic between them (ephemeris-nodes.ts; within a metre of the series).
 */
export const moonGeocentric = nodeInterpolator(3, 1 / 24, (tt) => {
  const v = Astronomy.GeoMoon(Astronomy.AstroTime.FromTerrestrialTime(tt));
  return [v.x, v.y, v.z];
});

/**
 * Geometric direction (au, ICRS axes) from the frame's observer to the Sun or a planet, with light
 * time: the planet's heliocentric position at t − τ minus the observer's at t. The Sun's own motion
 * about the barycentre during τ (≤ 0.01″) is neglected.
 */
function geometricFromObserver(f: SkyFrame, body: Exclude<BodyName, 'moon'>, out: number[]): number[] {
  const e = heliocentricIcrs('earth', f.dTT, scratchE);
  const ox = e[0] + f.obsGeoAu[0], oy = e[1] + f.obsGeoAu[1], oz = e[2] + f.obsGeoAu[2];
  if (body === 'sun') {
    out[0] = -ox; out[1] = -oy; out[2] = -oz;
    return out;
  }
  // One evaluation: the light time is that of the start of this 6-hour slot (see lightTimeGuess).
  const p = heliocentricIcrs(body as SeriesBody, f.dTT - lightTimeGuess(body as SeriesBody, f.dTT), scratchP);
  out[0] = p[0] - ox; out[1] = p[1] - oy; out[2] = p[2] - oz;
  return out;
}

const SLOT_DAYS = 0.25;
const tauSlots = new Map<SeriesBody, { slot: number; tau: number }>();
/**
 * Geocentric light time (days) of a planet at the start of the 6-hour slot holding dTT, iterated twice
 * and remembered. Within a slot the true τ differs by < 4 s (range rate ≤ 60 km/s), which moves the
 * planet by < 200 km (< 0.002″); the result depends on dTT alone, so every caller gets the same place.
 */
function lightTimeGuess(body: SeriesBody, dTT: number): number {
  const slot = Math.floor(dTT / SLOT_DAYS);
  const c = tauSlots.get(body);
  if (c && c.slot === slot) return c.tau;
  const t = slot * SLOT_DAYS;
  const e = heliocentricIcrs('earth', t, [0, 0, 0]);
  let tau = 0;
  for (let i = 0; i < 3; i++) {
    const p = heliocentricIcrs(body, t - tau, [0, 0, 0]);
    tau = Math.hypot(p[0] - e[0], p[1] - e[1], p[2] - e[2]) / C_AU_PER_DAY;
  }
  tauSlots.set(body, { slot, tau });
  return tau;
}

/** Apparent topocentric direction of a body at a frame. */
export function bodyVector(f: SkyFrame, body: BodyName): BodyVector {
  let p: [number, number, number];
  let d: number;
  if (body === 'moon') {
    const g = moonGeocentric(f.astroTime.tt, scratchM);
    const x = g[0] - f.obsGeoAu[0], y = g[1] - f.obsGeoAu[1], z = g[2] - f.obsGeoAu[2];
    d = Math.hypot(x, y, z);
    p = [x / d, y / d, z / d];
    addDiurnalAberration(f, p);
  } else {
    const g = geometricFromObserver(f, body, [0, 0, 0]);
    d = Math.hypot(g[0], g[1], g[2]);
    p = [g[0] / d, g[1] / d, g[2] / d];
    aberrate(f, p);
  }
  const enu = mulVec([0, 0, 0], f.icrsToEnu, p) as [number, number, number];
  return { icrs: p, enu, distanceKm: d * KM_PER_AU };
}

export interface BodyPlace extends HorizontalPlace {
  body: BodyName;
  /** Apparent topocentric RA/Dec in ICRS axes (the catalogue frame), degrees. */
  raDeg: number;
  decDeg: number;
  distanceKm: number;
  magnitude: number;
  semidiameterDeg: number;
  /** Geocentric elongation from the Sun, degrees (absent for the Sun). */
  elongationDeg?: number;
  illuminatedFraction?: number;
  phaseAngleDeg?: number;
  /** Moon only. */
  ageDays?: number;
  horizontalParallaxDeg?: number;
  /** Moon only: geocentric minus topocentric altitude (unrefracted), degrees. */
  parallaxInAltitudeDeg?: number;
  /** Moon only: 0 new, 90 first quarter, 180 full, 270 last quarter (ecliptic longitude difference). */
  phaseLongitudeDeg?: number;
}

/**
 * Geocentric apparent place of a body (true equator and equinox of date), e.g. for almanac checks:
 * astronomy-engine's geocentric vector with light time and aberration, then N·P·B.
 */
export function geocentricApparent(body: BodyName, date: Date): { raDeg: number; decDeg: number; distanceKm: number } {
  const f = skyFrame({ latDeg: 0, lonDeg: 0, heightM: 0 }, date, { geocentric: true });
  let u: number[];
  let d: number;
  if (body === 'moon') {
    const g = Astronomy.GeoVector(BODY_ENUM[body], f.astroTime, true);
    d = Math.hypot(g.x, g.y, g.z);
    u = [g.x / d, g.y / d, g.z / d];
  } else {
    const bv = bodyVector(f, body);
    u = bv.icrs;
    d = bv.distanceKm / KM_PER_AU;
  }
  const v = mulVec([0, 0, 0], f.npb, u);
  return { raDeg: wrap360(Math.atan2(v[1], v[0]) * RAD), decDeg: Math.asin(v[2]) * RAD, distanceKm: d * KM_PER_AU };
}

/** Days since the last new moon (astronomy-engine's phase search). */
export function moonAgeDays(date: Date): number {
  const lon = Astronomy.MoonPhase(date);
  const approx = (lon / 360) * 29.530588853;
  const start = new Date(date.getTime() - (approx + 2) * 86400000);
  const nm = Astronomy.SearchMoonPhase(0, start, 5);
  if (!nm || nm.date.getTime() > date.getTime()) return approx;
  return (date.getTime() - nm.date.getTime()) / 86400000;
}

/** Full description of a body for a site and instant. */
export function bodyPlace(f: SkyFrame, body: BodyName, mode: RefractionMode = 'standard'): BodyPlace {
  const bv = bodyVector(f, body);
  const place = describeEnu(f, bv.enu, mode);
  const ra = wrap360(Math.atan2(bv.icrs[1], bv.icrs[0]) * RAD);
  const dec = Math.asin(bv.icrs[2]) * RAD;
  const ill = Astronomy.Illumination(BODY_ENUM[body], f.astroTime);
  const out: BodyPlace = {
    body,
    ...place,
    raDeg: ra,
    decDeg: dec,
    distanceKm: bv.distanceKm,
    magnitude: ill.mag,
    semidiameterDeg: Math.asin(Math.min(1, RADIUS_KM[body] / bv.distanceKm)) * RAD,
  };
  if (body !== 'sun') {
    out.elongationDeg = Astronomy.AngleFromSun(BODY_ENUM[body], f.astroTime);
    out.illuminatedFraction = ill.phase_fraction;
    out.phaseAngleDeg = ill.phase_angle;
  }
  if (body === 'moon') {
    const geo = Astronomy.GeoVector(Astronomy.Body.Moon, f.astroTime, true);
    const gd = Math.hypot(geo.x, geo.y, geo.z);
    const genu = mulVec([0, 0, 0], f.icrsToEnu, [geo.x / gd, geo.y / gd, geo.z / gd]);
    const geoAlt = Math.asin(genu[2]) * RAD;
    out.horizontalParallaxDeg = Math.asin(6378.137 / (gd * KM_PER_AU)) * RAD;
    out.parallaxInAltitudeDeg = geoAlt - place.trueAltDeg;
    out.ageDays = moonAgeDays(f.date);
    out.phaseLongitudeDeg = Astronomy.MoonPhase(f.astroTime);
  }
  return out;
}

/** Sun, Moon and the planets Mercury to Neptune for a site and instant. */
export function bodies(site: SiteInput, date: Date, opts: { refraction?: RefractionMode } = {}): BodyPlace[] {
  const f = skyFrame(site, date);
  return BODY_NAMES.map((b) => bodyPlace(f, b, opts.refraction ?? 'standard'));
}

export const SUN_MEAN_SEMIDIAMETER_DEG = 16 / 60;
export { DEG };
