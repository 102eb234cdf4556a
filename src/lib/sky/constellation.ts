/**
 * The IAU constellation containing a position (Delporte 1930 boundaries, CDS VI/42 / VI/49), defined on the
 * mean equator and equinox of B1875.0.
 *
 * The boundary table and its lookup are astronomy-engine's Constellation(). Its own J2000 → B1875 step
 * (Rotation_EQJ_EQD) includes the nutation of 1875, up to ~17″, which misplaces points a few arcseconds
 * from an edge; so the position is taken to the B1875 mean equator here (this engine's frame bias and IAU
 * 2006 precession, no nutation) and handed to the lookup through the inverse of its rotation, so the table
 * sees the mean B1875 place. Check: points 5″ and 30″ from edges, precessed with ERFA pmat76
 * (constellation.test.ts).
 */
import { Astronomy } from './astronomy';
import { BIAS, precessionMatrix } from './frames';
import { RAD, mat3, mul, mulVec, mulVecT, unitFromLonLat } from './math';

export interface ConstellationResult {
  /** IAU three-letter abbreviation, e.g. "Ori". */
  abbr: string;
  name: string;
}

/** B1875.0 = JD 2405889.25855 (TT), days from J2000.0. */
const B1875_DTT = -45655.741449525;
/** The UT day count astronomy-engine itself uses for the B1875 epoch in Constellation(). */
const LIB_B1875_UT = -45655.74141261017;
let toB1875: ReturnType<typeof mat3> | null = null;
let libRot: Astronomy.RotationMatrix | null = null;

export function constellationOf(raDeg: number, decDeg: number): ConstellationResult {
  if (!toB1875) {
    toB1875 = mul(mat3(), precessionMatrix(mat3(), B1875_DTT), BIAS);
    libRot = Astronomy.Rotation_EQJ_EQD(Astronomy.MakeTime(LIB_B1875_UT));
  }
  const v = unitFromLonLat([0, 0, 0], raDeg, Math.max(-90, Math.min(90, decDeg)));
  const m = mulVec([0, 0, 0], toB1875, v);
  // The library rotates its input by libRot; give it libRotᵀ · (mean B1875 vector).
  const r = libRot!.rot;
  const flat = [r[0][0], r[1][0], r[2][0], r[0][1], r[1][1], r[2][1], r[0][2], r[1][2], r[2][2]];
  const w = mulVecT([0, 0, 0], flat, m);
  let raH = (Math.atan2(w[1], w[0]) * RAD) / 15;
  if (raH < 0) raH += 24;
  const dec = Math.asin(Math.max(-1, Math.min(1, w[2]))) * RAD;
  const c = Astronomy.Constellation(raH, dec);
  return { abbr: c.symbol, name: c.name };
}
