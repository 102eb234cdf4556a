/**
 * Relative airmass from the apparent altitude.
 *
 * - Kasten & Young (1989, Applied Optics 28, 4735): X = 1 / [cos z + 0.50572 (96.07995° − z)^−1.6364].
 *   Shown everywhere a single airmass number appears (observe(), the API's `airmass`, the CSV export,
 *   envelope limits expressed as airmass).
 * - Pickering (2002, DIO 12, 1): X = 1 / sin(h + 244 / (165 + 47 h^1.1)). Offered alongside for
 *   low-altitude work (it is the better fit to the horizon: 38.75 at h = 0).
 * Both return null below the horizon (apparent altitude < 0), as the API contract asks.
 */
import { DEG } from './math';

export function airmassKastenYoung(altDeg: number): number | null {
  if (!(altDeg >= 0)) return null;
  const z = 90 - Math.min(altDeg, 90);
  return 1 / (Math.cos(z * DEG) + 0.50572 * Math.pow(96.07995 - z, -1.6364));
}

export function airmassPickering(altDeg: number): number | null {
  if (!(altDeg >= 0)) return null;
  const h = Math.min(altDeg, 90);
  return 1 / Math.sin((h + 244 / (165 + 47 * Math.pow(h, 1.1))) * DEG);
}

/** Plane-parallel secant airmass (for comparison only; diverges at the horizon). */
export function airmassSecant(altDeg: number): number | null {
  if (!(altDeg > 0)) return null;
  return 1 / Math.sin(Math.min(altDeg, 90) * DEG);
}
