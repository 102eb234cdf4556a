/**
 * Sun, Moon and planets as apparent topocentric places.
 *
 * astronomy-engine gives the topocentric J2000 direction corrected for light time and annual
 * aberration (Equator(..., ofdate = false, aberration = true)); this module adds diurnal aberration,
 * then applies the engine's own N·P·B and Earth rotation (apparent.ts) so bodies and stars share one
 * frame. Light deflection is neglected for bodies (< 0.01″ except grazing the Sun).
 */
import { Astronomy } from './astronomy';
import { DEG, RAD, wrap360 } from './math';
import { KM_PER_AU, MOON_RADIUS_KM } from './constants';
import { addDiurnalAberration, describeEnu, skyFrame, type HorizontalPlace, type SkyFrame } from './apparent';
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

/** Apparent topocentric direction of a body at a frame. */
export function bodyVector(f: SkyFrame, body: BodyName): BodyVector {
  const eq = Astronomy.Equator(BODY_ENUM[body], f.astroTime, f.observer, false, true);
  const v = eq.vec;
  const d = Math.hypot(v.x, v.y, v.z);
  const p: [number, number, number] = [v.x / d, v.y / d, v.z / d];
  addDiurnalAberration(f, p);
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
  const g = Astronomy.GeoVector(BODY_ENUM[body], f.astroTime, true);
  const d = Math.hypot(g.x, g.y, g.z);
  const v = mulVec([0, 0, 0], f.npb, [g.x / d, g.y / d, g.z / d]);
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
