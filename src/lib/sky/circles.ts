/**
 * Great circles and reference points of the sphere for a site and instant, in ENU (geometric: no
 * aberration or refraction — they are drawn, not pointed at). The equator, equinoxes and ecliptic
 * are those of date (true equator and equinox, true obliquity).
 */
import { RAD, wrap360 } from './math';
import { ICRS_TO_GALACTIC, type SiteInput } from './frames';
import { skyFrame, type SkyFrame } from './apparent';
import { meanObliquityRad, nutationIau2000b } from './nutation';

export type Enu = [number, number, number];
export type CircleName = 'horizon' | 'equator' | 'ecliptic' | 'meridian' | 'primeVertical' | 'galactic';
export const CIRCLE_NAMES: readonly CircleName[] = ['horizon', 'equator', 'ecliptic', 'meridian', 'primeVertical', 'galactic'];

export interface GreatCircle {
  /** Pole of the circle (unit ENU vector); the circle is every direction perpendicular to it. */
  poleEnu: Enu;
  poleAzDeg: number;
  poleAltDeg: number;
}

export interface SkyPoint {
  azDeg: number;
  altDeg: number;
  enu: Enu;
}

const ofDateToEnu = (f: SkyFrame, v: readonly number[]): Enu => {
  const m = f.enuFromOfDate;
  return [m[0] * v[0] + m[1] * v[1] + m[2] * v[2], m[3] * v[0] + m[4] * v[1] + m[5] * v[2], m[6] * v[0] + m[7] * v[1] + m[8] * v[2]];
};
const icrsToEnu = (f: SkyFrame, v: ArrayLike<number>): Enu => {
  const m = f.icrsToEnu;
  return [m[0] * v[0] + m[1] * v[1] + m[2] * v[2], m[3] * v[0] + m[4] * v[1] + m[5] * v[2], m[6] * v[0] + m[7] * v[1] + m[8] * v[2]];
};

export function pointFromEnu(enu: Enu): SkyPoint {
  const h = Math.hypot(enu[0], enu[1]);
  return { azDeg: h < 1e-12 ? 0 : wrap360(Math.atan2(enu[0], enu[1]) * RAD), altDeg: Math.atan2(enu[2], h) * RAD, enu };
}

const trueObliquityRad = (f: SkyFrame) => meanObliquityRad(f.dTT) + nutationIau2000b(f.dTT).dEpsRad;

function circle(poleEnu: Enu): GreatCircle {
  const p = pointFromEnu(poleEnu);
  return { poleEnu, poleAzDeg: p.azDeg, poleAltDeg: p.altDeg };
}

export function greatCirclesAt(f: SkyFrame): Record<CircleName, GreatCircle> {
  const eps = trueObliquityRad(f);
  const g = ICRS_TO_GALACTIC;
  return {
    horizon: circle([0, 0, 1]),
    equator: circle(ofDateToEnu(f, [0, 0, 1])),
    ecliptic: circle(ofDateToEnu(f, [0, -Math.sin(eps), Math.cos(eps)])),
    meridian: circle([1, 0, 0]),
    primeVertical: circle([0, 1, 0]),
    galactic: circle(icrsToEnu(f, [g[6], g[7], g[8]])),
  };
}

/** The six great circles of a site and instant, each as its pole. */
export function greatCircles(site: SiteInput, date: Date): Record<CircleName, GreatCircle> {
  return greatCirclesAt(skyFrame(site, date));
}

/**
 * n points evenly spaced around the great circle with the given pole, packed [e, n, u, ...].
 * The first point is where the circle rises through the horizon's east side when that is defined
 * (pole × up direction), else north.
 */
export function circlePoints(poleEnu: ArrayLike<number>, n: number, out: Float64Array | Float32Array = new Float64Array(3 * n)): Float64Array | Float32Array {
  const pl = Math.hypot(poleEnu[0], poleEnu[1], poleEnu[2]) || 1;
  const px = poleEnu[0] / pl, py = poleEnu[1] / pl, pz = poleEnu[2] / pl;
  // a = normalize(ref × pole) with ref = up, or north when the pole is near the zenith.
  let ax: number, ay: number, az: number;
  if (Math.abs(pz) < 0.9) { ax = -py; ay = px; az = 0; } else { ax = pz; ay = 0; az = -px; }
  const al = Math.hypot(ax, ay, az);
  ax /= al; ay /= al; az /= al;
  const bx = py * az - pz * ay, by = pz * ax - px * az, bz = px * ay - py * ax;
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    const c = Math.cos(t), s = Math.sin(t);
    out[3 * i] = c * ax + s * bx;
    out[3 * i + 1] = c * ay + s * by;
    out[3 * i + 2] = c * az + s * bz;
  }
  return out;
}

export type ReferencePointName =
  | 'zenith' | 'nadir' | 'ncp' | 'scp' | 'nep' | 'sep'
  | 'marchEquinox' | 'septemberEquinox' | 'juneSolstice' | 'decemberSolstice'
  | 'east' | 'west' | 'eclipticHorizon1' | 'eclipticHorizon2';

export const REFERENCE_POINT_NAMES: readonly ReferencePointName[] = [
  'zenith', 'nadir', 'ncp', 'scp', 'nep', 'sep', 'marchEquinox', 'septemberEquinox', 'juneSolstice',
  'decemberSolstice', 'east', 'west', 'eclipticHorizon1', 'eclipticHorizon2',
];

/** The named points (flat: `rp.zenith`, `rp.ncp`, ...) plus two angles. */
export type ReferencePoints = Record<ReferencePointName, SkyPoint> & {
  /** Altitude of the elevated celestial pole = |latitude| (geodetic). */
  poleAltitudeDeg: number;
  /** Altitude of the north celestial pole (= latitude; negative in the south). */
  ncpAltitudeDeg: number;
  /** Angle between the ecliptic and the horizon planes, 0..90°. */
  eclipticHorizonAngleDeg: number;
};

export function referencePointsAt(f: SkyFrame): ReferencePoints {
  const eps = trueObliquityRad(f);
  const se = Math.sin(eps), ce = Math.cos(eps);
  const ncp = ofDateToEnu(f, [0, 0, 1]);
  const nep = ofDateToEnu(f, [0, -se, ce]);
  const neg = (v: Enu): Enu => [-v[0], -v[1], -v[2]];
  // Ecliptic ∩ horizon: ± (up × nep) normalised; "1" is the one on the eastern side.
  let ix = -nep[1], iy = nep[0];
  const il = Math.hypot(ix, iy);
  let i1: Enu;
  if (il < 1e-12) i1 = [1, 0, 0];
  else {
    ix /= il; iy /= il;
    i1 = ix >= 0 ? [ix, iy, 0] : [-ix, -iy, 0];
  }
  const points: Record<ReferencePointName, SkyPoint> = {
    zenith: pointFromEnu([0, 0, 1]),
    nadir: pointFromEnu([0, 0, -1]),
    ncp: pointFromEnu(ncp),
    scp: pointFromEnu(neg(ncp)),
    nep: pointFromEnu(nep),
    sep: pointFromEnu(neg(nep)),
    marchEquinox: pointFromEnu(ofDateToEnu(f, [1, 0, 0])),
    septemberEquinox: pointFromEnu(ofDateToEnu(f, [-1, 0, 0])),
    juneSolstice: pointFromEnu(ofDateToEnu(f, [0, ce, se])),
    decemberSolstice: pointFromEnu(ofDateToEnu(f, [0, -ce, -se])),
    east: pointFromEnu([1, 0, 0]),
    west: pointFromEnu([-1, 0, 0]),
    eclipticHorizon1: pointFromEnu(i1),
    eclipticHorizon2: pointFromEnu(neg(i1)),
  };
  const ncpAlt = points.ncp.altDeg;
  return {
    ...points,
    poleAltitudeDeg: Math.abs(ncpAlt),
    ncpAltitudeDeg: ncpAlt,
    eclipticHorizonAngleDeg: Math.acos(Math.min(1, Math.abs(nep[2]))) * RAD,
  };
}

/** Named reference points of a site and instant, with the pole altitude and ecliptic–horizon angle. */
export function referencePoints(site: SiteInput, date: Date): ReferencePoints {
  return referencePointsAt(skyFrame(site, date));
}
