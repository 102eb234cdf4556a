/**
 * Space motion of a star from the epoch of its catalogue place to an observation date, as IAU SOFA's
 * starpm/pmsafe do it: the position and velocity vectors in space (parallax, proper motion, radial velocity),
 * moved along a straight line with the light-time terms, the radial velocity taken as observed (the
 * relativistic Doppler correction of starpv). This is not a linear shift in RA/Dec, so stars near the pole and
 * fast, near stars come out right; check: ERFA pmsafe and atco13 over 50 years (motion.test.ts).
 * Without a parallax the star is taken as infinitely far: its direction moves by the proper motion along
 * the tangent plane (the radial velocity then has no effect).
 */
import { DEG, RAD } from './math';
import { C_AU_PER_DAY } from './constants';

export interface SpaceMotion {
  /** Julian year (TT) of the catalogue position; default 2000. */
  epoch?: number;
  /** Proper motion in RA, μα cos δ, milliarcseconds a year. */
  pmra?: number;
  /** Proper motion in Dec, milliarcseconds a year. */
  pmdec?: number;
  /** Parallax, milliarcseconds. */
  parallax?: number;
  /** Radial velocity, km/s (positive receding). */
  radialVelocity?: number;
}

const MAS = DEG / 3600000;
const AU_KM = 149597870.7;
const DR2AS = 206264.80624709636;

export const hasMotion = (m: SpaceMotion | undefined): m is SpaceMotion =>
  !!m && !!(m.pmra || m.pmdec || m.parallax || m.radialVelocity || (m.epoch !== undefined && m.epoch !== 2000));

/** A star moved to a date: unit vector (ICRS), and its distance in au (Infinity without a parallax). */
export interface MovedStar {
  u: [number, number, number];
  distanceAu: number;
}

/** Moves a catalogue place (ICRS degrees at `m.epoch`) to TT Julian date `jdTT`. */
export function moveStar(raDeg: number, decDeg: number, m: SpaceMotion, jdTT: number): MovedStar {
  const ra = raDeg * DEG, dec = decDeg * DEG;
  const ca = Math.cos(ra), sa = Math.sin(ra), cd = Math.cos(dec), sd = Math.sin(dec);
  const epochJd = 2451545.0 + ((m.epoch ?? 2000) - 2000) * 365.25;
  const dt = jdTT - epochJd; // days
  // Proper motion as rates of the tangent-plane directions, radians a day.
  const pa = ((m.pmra ?? 0) * MAS) / 365.25, pd = ((m.pmdec ?? 0) * MAS) / 365.25;
  // East and north unit vectors at the star.
  const ex = -sa, ey = ca;
  const nx = -sd * ca, ny = -sd * sa, nz = cd;
  if (!(m.parallax && m.parallax > 0)) {
    const x = ca * cd + dt * (pa * ex + pd * nx), y = sa * cd + dt * (pa * ey + pd * ny), z = sd + dt * pd * nz;
    const n = Math.hypot(x, y, z);
    return { u: [x / n, y / n, z / n], distanceAu: Infinity };
  }
  const r = DR2AS / (m.parallax / 1000); // au
  const c = C_AU_PER_DAY;
  // Observed velocity, au/day: radial (rv) and transverse (r × proper motion).
  const vsr = ((m.radialVelocity ?? 0) * 86400) / AU_KM;
  const tx = r * (pa * ex + pd * nx), ty = r * (pa * ey + pd * ny), tz = r * pd * nz;
  // starpv: observed → inertial (special-relativistic Doppler), iterated.
  const betsr = vsr / c, betst = Math.hypot(tx, ty, tz) / c;
  let betr = betsr, bett = betst, d = 1, del = 0;
  for (let i = 0; i < 20; i++) {
    d = 1 + betr;
    const w = betr * betr + bett * bett;
    del = -w / (Math.sqrt(1 - w) + 1);
    const nb = d * betsr + del, nt = d * betst;
    if (Math.abs(nb - betr) < 1e-15 && Math.abs(nt - bett) < 1e-15) break;
    betr = nb; bett = nt;
  }
  const ur = c * (d * betsr + del);
  const px = r * cd * ca, py = r * cd * sa, pz = r * sd;
  const vx = ur * cd * ca + tx * d, vy = ur * cd * sa + ty * d, vz = ur * sd + tz * d;
  // starpm: light time at the first epoch, then at the new place.
  const tl1 = r / c;
  const qx = px + vx * (dt + tl1), qy = py + vy * (dt + tl1), qz = pz + vz * (dt + tl1);
  const r2 = qx * qx + qy * qy + qz * qz, rdv = qx * vx + qy * vy + qz * vz, v2 = vx * vx + vy * vy + vz * vz;
  const c2mv2 = c * c - v2;
  const tl2 = (-rdv + Math.sqrt(rdv * rdv + c2mv2 * r2)) / c2mv2;
  const k = dt + tl1 - tl2;
  const x = px + vx * k, y = py + vy * k, z = pz + vz * k;
  const n = Math.hypot(x, y, z);
  return { u: [x / n, y / n, z / n], distanceAu: n };
}

/** The moved place as ICRS degrees (for display and the constellation lookup). */
export function movedRaDec(s: MovedStar): { raDeg: number; decDeg: number } {
  const ra = Math.atan2(s.u[1], s.u[0]) * RAD;
  return { raDeg: ra < 0 ? ra + 360 : ra, decDeg: Math.asin(Math.max(-1, Math.min(1, s.u[2]))) * RAD };
}
