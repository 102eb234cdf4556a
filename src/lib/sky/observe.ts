/** observe(): the apparent topocentric place of a catalogue position or a body, as the API reports it. */
import { observeIcrs, skyFrame, type SkyFrame } from './apparent';
import { bodyPlace, type BodyName } from './bodies';
import { airmassKastenYoung } from './airmass';
import { constellationOf } from './constellation';
import type { SiteInput } from './frames';
import type { RefractionMode } from './refraction';
import { hasMotion, moveStar, movedRaDec, type SpaceMotion } from './motion';

/** A catalogue position (ICRS at `motion.epoch`, default J2000.0, with optional space motion) or a body. */
export type Target = { raDeg: number; decDeg: number; motion?: SpaceMotion } | { body: BodyName };

export interface ObserveOptions {
  refraction?: RefractionMode;
}

export interface ObserveResult {
  azDeg: number;
  /** Apparent altitude (refracted unless refraction 'none'). */
  altDeg: number;
  /** Hour angle in hours, −12..12. */
  haHours: number;
  raOfDateDeg: number;
  decOfDateDeg: number;
  /** Local apparent sidereal time, hours. */
  lstHours: number;
  /** Kasten & Young (1989) airmass at the apparent altitude; null below the horizon. */
  airmass: number | null;
  /** IAU constellation abbreviation. */
  constellation: string;
  distanceKm?: number;
  magnitude?: number;
  illuminatedFraction?: number;
  phaseAngleDeg?: number;
  elongationDeg?: number;
}

export function observeAt(f: SkyFrame, target: Target, opts: ObserveOptions = {}): ObserveResult {
  const mode = opts.refraction ?? 'standard';
  if ('body' in target) {
    const p = bodyPlace(f, target.body, mode);
    const r: ObserveResult = {
      azDeg: p.azDeg, altDeg: p.altDeg, haHours: p.haHours, raOfDateDeg: p.raOfDateDeg, decOfDateDeg: p.decOfDateDeg,
      lstHours: f.lstHours, airmass: airmassKastenYoung(p.altDeg), constellation: constellationOf(p.raDeg, p.decDeg).abbr,
      distanceKm: p.distanceKm, magnitude: p.magnitude,
    };
    if (p.illuminatedFraction !== undefined) r.illuminatedFraction = p.illuminatedFraction;
    if (p.phaseAngleDeg !== undefined) r.phaseAngleDeg = p.phaseAngleDeg;
    if (p.elongationDeg !== undefined) r.elongationDeg = p.elongationDeg;
    return r;
  }
  const p = observeIcrs(f, target.raDeg, target.decDeg, mode, target.motion);
  const here = hasMotion(target.motion) ? movedRaDec(moveStar(target.raDeg, target.decDeg, target.motion, f.jdTT)) : target;
  return {
    azDeg: p.azDeg, altDeg: p.altDeg, haHours: p.haHours, raOfDateDeg: p.raOfDateDeg, decOfDateDeg: p.decOfDateDeg,
    lstHours: f.lstHours, airmass: airmassKastenYoung(p.altDeg), constellation: constellationOf(here.raDeg, here.decDeg).abbr,
  };
}

/** Apparent topocentric place of a target for a site and instant. */
export function observe(site: SiteInput, date: Date, target: Target, opts: ObserveOptions = {}): ObserveResult {
  return observeAt(skyFrame(site, date), target, opts);
}
