/** Angular separation and position angle on the sphere (degrees). */
import { DEG, RAD, wrap360 } from './math';

/** Great-circle distance between two (lon, lat) points — Vincenty form, exact at all separations. */
export function separationDeg(lon1Deg: number, lat1Deg: number, lon2Deg: number, lat2Deg: number): number {
  const dl = (lon2Deg - lon1Deg) * DEG;
  const p1 = lat1Deg * DEG, p2 = lat2Deg * DEG;
  const s1 = Math.sin(p1), c1 = Math.cos(p1), s2 = Math.sin(p2), c2 = Math.cos(p2);
  const sdl = Math.sin(dl), cdl = Math.cos(dl);
  const num = Math.hypot(c2 * sdl, c1 * s2 - s1 * c2 * cdl);
  const den = s1 * s2 + c1 * c2 * cdl;
  return Math.atan2(num, den) * RAD;
}

/** Position angle of point 2 as seen from point 1, from north through east, [0, 360). */
export function positionAngleDeg(ra1Deg: number, dec1Deg: number, ra2Deg: number, dec2Deg: number): number {
  const da = (ra2Deg - ra1Deg) * DEG;
  const d1 = dec1Deg * DEG, d2 = dec2Deg * DEG;
  const y = Math.sin(da) * Math.cos(d2);
  const x = Math.cos(d1) * Math.sin(d2) - Math.sin(d1) * Math.cos(d2) * Math.cos(da);
  return wrap360(Math.atan2(y, x) * RAD);
}
