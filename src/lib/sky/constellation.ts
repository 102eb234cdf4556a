/**
 * The IAU constellation containing a position (Delporte 1930 boundaries, CDS VI/42 / VI/49), via
 * astronomy-engine's Constellation(), which precesses the J2000 position to B1875 itself.
 */
import { Astronomy } from './astronomy';

export interface ConstellationResult {
  /** IAU three-letter abbreviation, e.g. "Ori". */
  abbr: string;
  name: string;
}

export function constellationOf(raDeg: number, decDeg: number): ConstellationResult {
  let raH = (raDeg / 15) % 24;
  if (raH < 0) raH += 24;
  const c = Astronomy.Constellation(raH, Math.max(-90, Math.min(90, decDeg)));
  return { abbr: c.symbol, name: c.name };
}
