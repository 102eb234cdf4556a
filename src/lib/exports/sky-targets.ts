/**
 * Scene targets and sites → the sky engine's inputs. Pure.
 * Custom targets carry ICRS positions at `epoch` (default J2000.0) and optional proper motions in mas/yr;
 * they are moved linearly to the instant observed (ample for planning: the neglected terms are
 * second order in μΔt and below 0.1″ for any star over a century).
 */
import type { Site, Target as SceneTarget } from '../contracts/scene-doc';
import { findByHr, loadCatalogue, type SiteInput, type Target as SkyTarget } from '../sky';

const JULIAN_YEAR_MS = 365.25 * 86400000;
const J2000_MS = Date.UTC(2000, 0, 1, 12, 0, 0);

export const siteInput = (s: Site): SiteInput => ({ latDeg: s.lat, lonDeg: s.lon, heightM: s.height ?? 0 });

/** Julian epoch (e.g. 2015.5) → Date. */
export const dateOfEpoch = (epoch: number) => new Date(J2000_MS + (epoch - 2000) * JULIAN_YEAR_MS);

/** ICRS position of a custom target at `date`, with its proper motion applied from its epoch. */
export function customPositionAt(t: { ra: number; dec: number; epoch?: number; pmra?: number; pmdec?: number }, date: Date): { raDeg: number; decDeg: number } {
  if (!t.pmra && !t.pmdec) return { raDeg: t.ra, decDeg: t.dec };
  const years = (date.getTime() - dateOfEpoch(t.epoch ?? 2000).getTime()) / JULIAN_YEAR_MS;
  const cosDec = Math.cos((t.dec * Math.PI) / 180);
  let dec = t.dec + ((t.pmdec ?? 0) * years) / 3.6e6;
  let ra = t.ra + (cosDec > 1e-9 ? ((t.pmra ?? 0) * years) / 3.6e6 / cosDec : 0);
  if (dec > 90) {
    dec = 180 - dec;
    ra += 180;
  } else if (dec < -90) {
    dec = -180 - dec;
    ra += 180;
  }
  return { raDeg: ((ra % 360) + 360) % 360, decDeg: dec };
}

/** The sky engine's target for a scene target at `date`; null for a catalogue star that is not found. */
export function skyTarget(t: SceneTarget, date: Date): SkyTarget | null {
  if (t.kind === 'body') return { body: t.body };
  if (t.kind === 'star') {
    const i = findByHr(t.hr);
    if (i < 0) return null;
    const cat = loadCatalogue();
    return { raDeg: cat.raDeg[i]!, decDeg: cat.decDeg[i]! };
  }
  return customPositionAt(t, date);
}

/** ICRS/J2000 position as catalogued (no proper motion applied), for tables; null for bodies. */
export function cataloguePosition(t: SceneTarget): { ra: number; dec: number } | null {
  if (t.kind === 'custom') return { ra: t.ra, dec: t.dec };
  const s = skyTarget(t, new Date(J2000_MS));
  return s && 'raDeg' in s ? { ra: s.raDeg, dec: s.decDeg } : null;
}
