/**
 * Scene targets and sites → the sky engine's inputs. Pure.
 * Custom targets carry ICRS positions at `epoch` (default J2000.0) and optional proper motions (mas/yr),
 * parallax (mas) and radial velocity (km/s); the engine moves them by their space motion to the instant
 * observed (src/lib/sky/motion.ts, checked against ERFA pmsafe/atco13). A site may carry the IERS Earth
 * orientation values (UT1 − UTC, polar motion) for its date.
 */
import type { Site, Target as SceneTarget } from '../contracts/scene-doc';
import { findByHr, loadCatalogue, type SiteInput, type Target as SkyTarget } from '../sky';
import { hasMotion, moveStar, movedRaDec, type SpaceMotion } from '../sky/motion';
import { instantFromDate } from '../sky/timescales';

const JULIAN_YEAR_MS = 365.25 * 86400000;
const J2000_MS = Date.UTC(2000, 0, 1, 12, 0, 0);

export const siteInput = (s: Site): SiteInput => ({
  latDeg: s.lat, lonDeg: s.lon, heightM: s.height ?? 0,
  ...(s.earthOrientation ? { dut1Sec: s.earthOrientation.dut1, xpArcsec: s.earthOrientation.xp, ypArcsec: s.earthOrientation.yp } : {}),
});

/** Julian epoch (e.g. 2015.5) → Date. */
export const dateOfEpoch = (epoch: number) => new Date(J2000_MS + (epoch - 2000) * JULIAN_YEAR_MS);

type CustomLike = { ra: number; dec: number; epoch?: number; pmra?: number; pmdec?: number; parallax?: number; radialVelocity?: number };

/** The space motion of a custom target (undefined when it has none). */
export function customMotion(t: CustomLike): SpaceMotion | undefined {
  const m: SpaceMotion = { epoch: t.epoch ?? 2000, pmra: t.pmra, pmdec: t.pmdec, parallax: t.parallax, radialVelocity: t.radialVelocity };
  return hasMotion(m) ? m : undefined;
}

/** ICRS (barycentric) position of a custom target at `date`, moved by its space motion from its epoch. */
export function customPositionAt(t: CustomLike, date: Date): { raDeg: number; decDeg: number } {
  const m = customMotion(t);
  if (!m) return { raDeg: t.ra, decDeg: t.dec };
  return movedRaDec(moveStar(t.ra, t.dec, m, instantFromDate(date).jdTT));
}

/** The sky engine's target for a scene target at `date`; null for a catalogue star that is not found. */
export function skyTarget(t: SceneTarget, _date?: Date): SkyTarget | null {
  if (t.kind === 'body') return { body: t.body };
  if (t.kind === 'star') {
    const i = findByHr(t.hr);
    if (i < 0) return null;
    const cat = loadCatalogue();
    return { raDeg: cat.raDeg[i]!, decDeg: cat.decDeg[i]! };
  }
  const motion = customMotion(t);
  return motion ? { raDeg: t.ra, decDeg: t.dec, motion } : { raDeg: t.ra, decDeg: t.dec };
}

/** ICRS/J2000 position as catalogued (no proper motion applied), for tables; null for bodies. */
export function cataloguePosition(t: SceneTarget): { ra: number; dec: number } | null {
  if (t.kind === 'custom') return { ra: t.ra, dec: t.dec };
  const s = skyTarget(t, new Date(J2000_MS));
  return s && 'raDeg' in s ? { ra: s.raDeg, dec: s.decDeg } : null;
}
