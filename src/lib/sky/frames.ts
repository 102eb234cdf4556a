/**
 * Reference frames and the rotations between them (row-major 3×3, SOFA conventions).
 *
 * - 'icrs'            ICRS / J2000 equatorial (catalogue places).
 * - 'ofDate'          true equator and equinox of date: N · P · B (IAU 2000 frame bias, IAU 2006
 *                     precession as the P03 angles ψA, ωA, χA, IAU 2000B nutation).
 * - 'horizontal'      topocentric east-north-up: [east, north, up] = [sin A cos h, cos A cos h, sin h],
 *                     azimuth A from north through east, geodetic (WGS84) vertical, no polar motion.
 * - 'eclipticJ2000'   mean ecliptic and equinox of J2000.0: R1(ε0 = 84381.406″) · B.
 * - 'eclipticOfDate'  true ecliptic and equinox of date: R1(εA + Δε) · N · P · B.
 * - 'galactic'        IAU 1958 system in the ICRS as realised by the Hipparcos Catalogue (ESA 1997):
 *                     north galactic pole α 192.85948°, δ +27.12825°, l of the NCP 122.93192°.
 * These rotations carry directions only (no aberration, deflection or refraction): they are what a
 * drawing needs. Apparent places are in apparent.ts.
 */
import { ARCSEC, DEG, RAD, type Mat3, identity, mat3, mul, mulVec, rotX, rotY, rotZ, transpose, unitFromLonLat, wrap360 } from './math';
import { nutationIau2000b, meanObliquityRad } from './nutation';
import { DAYS_PER_CENTURY } from './constants';
import { gastHours, instantFromDate } from './timescales';

export type FrameName = 'icrs' | 'ofDate' | 'horizontal' | 'eclipticJ2000' | 'eclipticOfDate' | 'galactic';
export const FRAME_NAMES: readonly FrameName[] = ['icrs', 'ofDate', 'horizontal', 'eclipticJ2000', 'eclipticOfDate', 'galactic'];

export interface SiteInput {
  latDeg: number;
  lonDeg: number;
  heightM: number;
  /** UT1 − UTC in seconds (IERS Bulletin A/B value for the date; |DUT1| < 0.9 s). Default 0. */
  dut1Sec?: number;
  /** Polar motion: the pole's coordinates xp, yp in arcseconds (IERS). Default 0. */
  xpArcsec?: number;
  ypArcsec?: number;
}

/** Mean obliquity at J2000.0, IAU 2006: 84381.406″. */
export const OBLIQUITY_J2000_DEG = 84381.406 / 3600;

/** Frame bias ICRS → J2000 mean dynamical frame (IAU 2000: dψ −0.041775″, dε −0.0068192″, dα0 −0.0146″). */
export const BIAS: Mat3 = (() => {
  const m = identity(mat3());
  rotZ(m, -0.0146 * ARCSEC, m);
  rotY(m, -0.041775 * ARCSEC * Math.sin(84381.448 * ARCSEC), m);
  rotX(m, 0.0068192 * ARCSEC, m);
  return m;
})();

/** Precession J2000 mean → mean of date, IAU 2006 (P03) four-rotation form. out = P (without bias). */
export function precessionMatrix(out: Mat3, dTT: number): Mat3 {
  const t = dTT / DAYS_PER_CENTURY;
  const eps0 = 84381.406 * ARCSEC;
  const psiA = t * (5038.481507 + t * (-1.0790069 + t * (-0.00114045 + t * (0.000132851 + t * -0.0000000951)))) * ARCSEC;
  const omegaA = (84381.406 + t * (-0.025754 + t * (0.0512623 + t * (-0.00772503 + t * (-0.000000467 + t * 0.0000003337))))) * ARCSEC;
  const chiA = t * (10.556403 + t * (-2.3814292 + t * (-0.00121197 + t * (0.000170663 + t * -0.000000056)))) * ARCSEC;
  identity(out);
  rotX(out, eps0, out);
  rotZ(out, -psiA, out);
  rotX(out, -omegaA, out);
  rotZ(out, chiA, out);
  return out;
}

/** Nutation matrix mean of date → true of date. */
export function nutationMatrix(out: Mat3, dTT: number): Mat3 {
  const { dPsiRad, dEpsRad } = nutationIau2000b(dTT);
  const epsA = meanObliquityRad(dTT);
  identity(out);
  rotX(out, epsA, out);
  rotZ(out, -dPsiRad, out);
  rotX(out, -(epsA + dEpsRad), out);
  return out;
}

const scratchP = mat3();
const scratchN = mat3();
/** ICRS → true equator and equinox of date: N · P · B. */
export function npbMatrix(out: Mat3, dTT: number): Mat3 {
  precessionMatrix(scratchP, dTT);
  nutationMatrix(scratchN, dTT);
  mul(out, scratchP, BIAS);
  return mul(out, scratchN, out);
}

/**
 * True-of-date equatorial → ENU for a site, given the local apparent sidereal angle (degrees):
 * rows are the east, north and up directions expressed in the of-date frame.
 */
export function enuFromOfDateMatrix(out: Mat3, latDeg: number, lastDeg: number): Mat3 {
  const sl = Math.sin(lastDeg * DEG), cl = Math.cos(lastDeg * DEG);
  const sp = Math.sin(latDeg * DEG), cp = Math.cos(latDeg * DEG);
  out[0] = -sl; out[1] = cl; out[2] = 0;
  out[3] = -sp * cl; out[4] = -sp * sl; out[5] = cp;
  out[6] = cp * cl; out[7] = cp * sl; out[8] = sp;
  return out;
}

/**
 * True-of-date equatorial → ENU for a site at a Greenwich apparent sidereal angle (degrees), with polar
 * motion when the site carries it: ENU = E(φ, λ) · W · R3(GAST), W = R1(−yp) · R2(−xp) (IERS
 * Conventions 2010 eq. 5.3 without s′, which is < 0.1 mas a century; SOFA pom00). Without polar motion
 * this is enuFromOfDateMatrix at LAST = GAST + λ.
 */
export function enuFromOfDateForSite(out: Mat3, site: SiteInput, gastDeg: number): Mat3 {
  const xp = (site.xpArcsec ?? 0) * ARCSEC, yp = (site.ypArcsec ?? 0) * ARCSEC;
  if (xp === 0 && yp === 0) return enuFromOfDateMatrix(out, site.latDeg, wrap360(gastDeg + site.lonDeg));
  const w = identity(mat3());
  rotZ(w, gastDeg * DEG, w);
  rotY(w, -xp, w);
  rotX(w, -yp, w);
  // E(φ, λ): rows east, north, up of the site in the terrestrial frame (= enuFromOfDateMatrix at angle λ).
  const e = enuFromOfDateMatrix(mat3(), site.latDeg, site.lonDeg);
  return mul(out, e, w);
}

/** ICRS → mean ecliptic and equinox of J2000.0. */
export const ICRS_TO_ECLIPTIC_J2000: Mat3 = rotX(mat3(), OBLIQUITY_J2000_DEG * DEG, BIAS);

/** Galactic pole and zero point (Hipparcos Catalogue, ESA 1997, vol. 1 §1.5.3; as in IAU SOFA icrs2g). */
export const GALACTIC_POLE_RA_DEG = 192.85948;
export const GALACTIC_POLE_DEC_DEG = 27.12825;
export const GALACTIC_L_OF_NCP_DEG = 122.93192;

/** ICRS → galactic: rows are the galactic x (l = 0, b = 0), y (l = 90°) and z (NGP) axes in ICRS. */
export const ICRS_TO_GALACTIC: Mat3 = (() => {
  const z = unitFromLonLat([0, 0, 0], GALACTIC_POLE_RA_DEG, GALACTIC_POLE_DEC_DEG) as number[];
  // Direction in the galactic plane towards the north celestial pole's projection: longitude l_NCP.
  const ncpDotZ = z[2];
  const w = [-ncpDotZ * z[0], -ncpDotZ * z[1], 1 - ncpDotZ * z[2]];
  const wn = Math.hypot(w[0], w[1], w[2]);
  w[0] /= wn; w[1] /= wn; w[2] /= wn;
  const u = [z[1] * w[2] - z[2] * w[1], z[2] * w[0] - z[0] * w[2], z[0] * w[1] - z[1] * w[0]];
  const cl = Math.cos(GALACTIC_L_OF_NCP_DEG * DEG), sl = Math.sin(GALACTIC_L_OF_NCP_DEG * DEG);
  const x = [cl * w[0] - sl * u[0], cl * w[1] - sl * u[1], cl * w[2] - sl * u[2]];
  const y = [sl * w[0] + cl * u[0], sl * w[1] + cl * u[1], sl * w[2] + cl * u[2]];
  return Float64Array.of(x[0], x[1], x[2], y[0], y[1], y[2], z[0], z[1], z[2]);
})();

/** ICRS → `frame` for a site and instant. Time-independent frames ignore site and date. */
export function icrsToFrameMatrix(out: Mat3, frame: FrameName, site: SiteInput, date: Date): Mat3 {
  switch (frame) {
    case 'icrs':
      return identity(out);
    case 'eclipticJ2000':
      out.set(ICRS_TO_ECLIPTIC_J2000);
      return out;
    case 'galactic':
      out.set(ICRS_TO_GALACTIC);
      return out;
    default: {
      const t = instantFromDate(date, site.dut1Sec ?? 0);
      npbMatrix(out, t.dTT);
      if (frame === 'ofDate') return out;
      if (frame === 'eclipticOfDate') {
        const eps = meanObliquityRad(t.dTT) + nutationIau2000b(t.dTT).dEpsRad;
        return rotX(out, eps, out);
      }
      const s = enuFromOfDateForSite(mat3(), site, gastHours(t.dUT, t.dTT) * 15);
      return mul(out, s, out);
    }
  }
}

/** The rotation taking unit vectors of frame `from` to frame `to` at a site and instant. */
export function frameMatrix(from: FrameName, to: FrameName, site: SiteInput, date: Date, out: Mat3 = mat3()): Mat3 {
  const a = icrsToFrameMatrix(mat3(), from, site, date);
  const b = icrsToFrameMatrix(mat3(), to, site, date);
  return mul(out, b, transpose(a, a));
}

/**
 * Unit vector of a direction given in a frame's own angles: (RA, Dec), (λ, β), (l, b) as
 * longitude/latitude; for 'horizontal' the pair is (azimuth, altitude) with ENU components.
 */
export function vectorInFrame(out: Float64Array | number[], frame: FrameName, lonDeg: number, latDeg: number): Float64Array | number[] {
  if (frame !== 'horizontal') return unitFromLonLat(out, lonDeg, latDeg);
  const ch = Math.cos(latDeg * DEG);
  out[0] = Math.sin(lonDeg * DEG) * ch;
  out[1] = Math.cos(lonDeg * DEG) * ch;
  out[2] = Math.sin(latDeg * DEG);
  return out;
}

/** Angles of a vector in a frame: [lonDeg in 0..360, latDeg]; azimuth/altitude for 'horizontal'. */
export function anglesInFrame(frame: FrameName, v: ArrayLike<number>, out: number[] = [0, 0]): number[] {
  const r = Math.hypot(v[0], v[1]);
  let lon = frame === 'horizontal' ? Math.atan2(v[0], v[1]) * RAD : Math.atan2(v[1], v[0]) * RAD;
  if (r === 0) lon = 0;
  out[0] = wrap360(lon);
  out[1] = Math.atan2(v[2], r) * RAD;
  return out;
}

/** Converts one direction between frames (angles in degrees; horizontal = azimuth, altitude). */
export function convertDirection(from: FrameName, to: FrameName, lonDeg: number, latDeg: number, site: SiteInput, date: Date): { lonDeg: number; latDeg: number } {
  const m = frameMatrix(from, to, site, date);
  const v = vectorInFrame([0, 0, 0], from, lonDeg, latDeg);
  mulVec(v, m, v);
  const [lo, la] = anglesInFrame(to, v);
  return { lonDeg: lo, latDeg: la };
}

/**
 * Converts many directions with one rotation (allocation-free): inputs and outputs are parallel
 * arrays of longitude-like and latitude-like angles in degrees (azimuth/altitude for horizontal).
 */
export function convertDirections(
  m: ArrayLike<number>, from: FrameName, to: FrameName,
  inLonDeg: ArrayLike<number>, inLatDeg: ArrayLike<number>,
  outLonDeg: Float64Array | number[], outLatDeg: Float64Array | number[],
): void {
  const n = inLonDeg.length;
  const fromHor = from === 'horizontal', toHor = to === 'horizontal';
  const m0 = m[0], m1 = m[1], m2 = m[2], m3 = m[3], m4 = m[4], m5 = m[5], m6 = m[6], m7 = m[7], m8 = m[8];
  for (let i = 0; i < n; i++) {
    const lo = inLonDeg[i] * DEG, la = inLatDeg[i] * DEG;
    const cb = Math.cos(la);
    let x: number, y: number;
    if (fromHor) { x = Math.sin(lo) * cb; y = Math.cos(lo) * cb; } else { x = Math.cos(lo) * cb; y = Math.sin(lo) * cb; }
    const z = Math.sin(la);
    const X = m0 * x + m1 * y + m2 * z, Y = m3 * x + m4 * y + m5 * z, Z = m6 * x + m7 * y + m8 * z;
    let lon = (toHor ? Math.atan2(X, Y) : Math.atan2(Y, X)) * RAD;
    if (lon < 0) lon += 360;
    outLonDeg[i] = lon;
    outLatDeg[i] = Math.atan2(Z, Math.hypot(X, Y)) * RAD;
  }
}

/** Equatorial → ecliptic for a given obliquity (degrees): the textbook rotation R1(ε). */
export function equatorialToEcliptic(raDeg: number, decDeg: number, oblDeg: number): { lonDeg: number; latDeg: number } {
  const v = unitFromLonLat([0, 0, 0], raDeg, decDeg);
  const m = rotX(mat3(), oblDeg * DEG, identity(mat3()));
  mulVec(v, m, v);
  const [lo, la] = anglesInFrame('icrs', v);
  return { lonDeg: lo, latDeg: la };
}

/** ICRS (RA, Dec) → true ecliptic of date (λ, β), degrees. */
export function eclipticOfDate(raDeg: number, decDeg: number, date: Date): { lonDeg: number; latDeg: number } {
  const m = icrsToFrameMatrix(mat3(), 'eclipticOfDate', { latDeg: 0, lonDeg: 0, heightM: 0 }, date);
  const v = mulVec([0, 0, 0], m, unitFromLonLat([0, 0, 0], raDeg, decDeg));
  const [lo, la] = anglesInFrame('eclipticOfDate', v);
  return { lonDeg: lo, latDeg: la };
}

/** ICRS (RA, Dec) → galactic (l, b), degrees. */
export function galacticFromIcrs(raDeg: number, decDeg: number): { lDeg: number; bDeg: number } {
  const v = mulVec([0, 0, 0], ICRS_TO_GALACTIC, unitFromLonLat([0, 0, 0], raDeg, decDeg));
  const [l, b] = anglesInFrame('galactic', v);
  return { lDeg: l, bDeg: b };
}

/** Galactic (l, b) → ICRS (RA, Dec), degrees. */
export function icrsFromGalactic(lDeg: number, bDeg: number): { raDeg: number; decDeg: number } {
  const v = unitFromLonLat([0, 0, 0], lDeg, bDeg);
  const w = [0, 0, 0];
  const m = ICRS_TO_GALACTIC;
  w[0] = m[0] * v[0] + m[3] * v[1] + m[6] * v[2];
  w[1] = m[1] * v[0] + m[4] * v[1] + m[7] * v[2];
  w[2] = m[2] * v[0] + m[5] * v[1] + m[8] * v[2];
  const [ra, dec] = anglesInFrame('icrs', w);
  return { raDeg: ra, decDeg: dec };
}
