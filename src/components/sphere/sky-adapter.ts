/**
 * Thin adapter between the view and the sky engine (src/lib/sky). Pure maths only: it renames, sorts and
 * composes what the engine computes; no astronomy is re-implemented here.
 */
import * as sky from '../../lib/sky';
import { altAzToEnu, enuToAltAz, lonLatFromUnit, mat3MulVec, mat3TMulVec } from './geometry';

/** A site for the engine; the Earth orientation values (UT1 − UTC, polar motion) are optional, with their date and source for display. */
export type SiteInput = {
  latDeg: number; lonDeg: number; heightM: number;
  dut1Sec?: number; xpArcsec?: number; ypArcsec?: number; eopDate?: string; eopSource?: string;
};
/** Space motion of a custom target (ICRS place at `epoch`). */
export type MotionLike = { epoch?: number; pmra?: number; pmdec?: number; parallax?: number; radialVelocity?: number };

export type SkyFrameLike = sky.SkyFrame;

export interface SkyBody {
  body: string;
  azDeg: number;
  altDeg: number;
  raDeg: number;
  decDeg: number;
  magnitude: number;
  illuminatedFraction?: number;
  phaseAngleDeg?: number;
  haHours?: number;
  decOfDateDeg?: number;
}

/** The engine's catalogue (the columns the view uses) re-ordered brightest first, plus an HR → index map. */
export type Catalogue = Pick<sky.Catalogue, 'count' | 'hr' | 'raDeg' | 'decDeg' | 'vmag' | 'designation' | 'name'> & { hrIndex: Map<number, number> };

export interface EnvelopeLike {
  name?: string;
  minAltitude?: number;
  maxAltitude?: number;
  azimuthRanges?: [number, number][];
  keyholeRadius?: number;
  sunAvoidance?: number;
  moonAvoidance?: number;
  horizonMask?: [number, number][];
  hourAngleLimits?: [number, number];
  declinationLimits?: [number, number];
}

export const skyFrame = (site: SiteInput, date: Date): sky.SkyFrame => sky.skyFrame(site, date);
export const greatCircles = (f: sky.SkyFrame) => sky.greatCirclesAt(f);
export const referencePoints = (f: sky.SkyFrame) => {
  const r = sky.referencePointsAt(f);
  const points = r as unknown as Record<string, { azDeg: number; altDeg: number; enu: ArrayLike<number> }>;
  return { points, poleAltitudeDeg: r.poleAltitudeDeg, eclipticHorizonAngleDeg: r.eclipticHorizonAngleDeg };
};
export const frameMatrix = (from: sky.FrameName, to: sky.FrameName, site: SiteInput, date: Date, out: Float64Array = new Float64Array(9)): Float64Array =>
  sky.frameMatrix(from, to, site, date, out);
/** Sun, Moon and planets at one frame: the engine's full description (magnitude, phase...). Slow-ish (the Moon's age search). */
export const bodies = (f: sky.SkyFrame): SkyBody[] => sky.BODY_NAMES.map((b) => sky.bodyPlace(f, b, 'standard'));

/**
 * Fast per-frame positions while time plays: the engine's apparent direction and horizontal description
 * of each body; photometric fields (magnitude, phase) are carried over from `prev` (they change slowly).
 */
export function bodiesMoved(f: sky.SkyFrame, prev: SkyBody[]): SkyBody[] {
  return prev.map((p) => {
    const bv = sky.bodyVector(f, p.body as sky.BodyName);
    const h = sky.describeEnu(f, bv.enu, 'standard');
    const ra = (Math.atan2(bv.icrs[1], bv.icrs[0]) * 180) / Math.PI;
    return { ...p, azDeg: h.azDeg, altDeg: h.altDeg, haHours: h.haHours, decOfDateDeg: h.decOfDateDeg, raDeg: ra < 0 ? ra + 360 : ra, decDeg: (Math.asin(bv.icrs[2]) * 180) / Math.PI };
  });
}
/** Apparent ENU (standard refraction) of every catalogue star, packed xyz. */
export const starsToEnu = (cat: sky.PositionSet, frame: sky.SkyFrame, out: Float32Array) => sky.starsToEnu(cat, frame, out);

let markFirst: (() => void) | null = null;
const firstFrame = new Promise<void>((r) => (markFirst = r));
/** Called by the canvas after each frame it draws; the first call releases `afterFirstFrame`. */
export function frameDrawn(): void {
  if (markFirst) {
    markFirst();
    markFirst = null;
  }
}
/**
 * Resolves once the view has drawn its first frame (or after `fallbackMs`, for a browser without WebGL,
 * where no frame is ever drawn): work the first frame does not need waits for it, so its bytes do not
 * compete with the view's code on the wire.
 */
export function afterFirstFrame(fallbackMs = 4000): Promise<void> {
  return Promise.race([firstFrame, new Promise<void>((r) => setTimeout(r, fallbackMs))]);
}

let catPromise: Promise<Catalogue> | null = null;
/**
 * Loads the engine's catalogue once and sorts it brightest first (so a magnitude limit is a draw range).
 * The catalogue (390 kB, 100 kB as brotli) is a chunk of its own, fetched once the first frame is drawn
 * (see afterFirstFrame): the first frame of the sky does not wait for it, and the stars appear a moment later.
 */
export function loadCatalogue(): Promise<Catalogue> {
  catPromise ??= afterFirstFrame().then(() => import('../../lib/sky/catalogue/index')).then((m) => {
    const c = m.loadCatalogue();
    const n: number = c.count;
    const key = (i: number) => (Number.isNaN(c.vmag[i]) ? 99 : c.vmag[i]);
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => key(a) - key(b));
    const out: Catalogue = {
      count: n,
      hr: new Int32Array(n),
      raDeg: new Float64Array(n),
      decDeg: new Float64Array(n),
      vmag: new Float32Array(n),
      designation: new Array(n),
      name: new Array(n),
      hrIndex: new Map(),
    };
    order.forEach((src, i) => {
      out.hr[i] = c.hr[src];
      out.raDeg[i] = c.raDeg[src];
      out.decDeg[i] = c.decDeg[src];
      out.vmag[i] = c.vmag[src];
      out.designation[i] = c.designation[src];
      out.name[i] = c.name[src];
      out.hrIndex.set(c.hr[src], i);
    });
    return out;
  });
  return catPromise;
}

/** Everything the hover readout shows for one direction (an ENU unit vector). */
export interface PointReadout {
  azDeg: number;
  altDeg: number;
  zdDeg: number;
  raDeg: number;
  decDeg: number;
  raDateDeg: number;
  decDateDeg: number;
  haHours: number;
  polarDistDeg: number;
  eclLonDeg: number;
  eclLatDeg: number;
  galLDeg: number;
  galBDeg: number;
  constellation: string;
}

const scratchM = new Float64Array(9);
/**
 * Readout of a drawn direction. The sphere shows apparent places (refraction lifts altitudes), so the
 * altitude is taken back to the true one with the engine's inverse refraction before rotating to the
 * equatorial, ecliptic and galactic frames (aberration, ≤ 21″, is not removed: a pointer readout).
 */
export function readoutAt(enu: ArrayLike<number>, site: SiteInput, date: Date, frame: sky.SkyFrame): PointReadout {
  const { azDeg, altDeg } = enuToAltAz(enu);
  const trueAlt = sky.trueAltitudeDeg(altDeg, 'standard');
  const t = altAzToEnu([0, 0, 0], azDeg, trueAlt);
  const v = [0, 0, 0];
  mat3TMulVec(v, frame.icrsToEnu, t);
  const icrs = lonLatFromUnit(v);
  const icrsV = [v[0], v[1], v[2]];
  const place = sky.describeEnu(frame, t, 'none');
  sky.frameMatrix('icrs', 'eclipticOfDate', site, date, scratchM);
  mat3MulVec(v, scratchM, icrsV);
  const ecl = lonLatFromUnit(v);
  mat3MulVec(v, sky.ICRS_TO_GALACTIC, icrsV);
  const gal = lonLatFromUnit(v);
  return {
    azDeg,
    altDeg,
    zdDeg: 90 - altDeg,
    raDeg: icrs.lonDeg,
    decDeg: icrs.latDeg,
    raDateDeg: place.raOfDateDeg,
    decDateDeg: place.decOfDateDeg,
    haHours: place.haHours,
    polarDistDeg: 90 - icrs.latDeg,
    eclLonDeg: ecl.lonDeg,
    eclLatDeg: ecl.latDeg,
    galLDeg: gal.lonDeg,
    galBDeg: gal.latDeg,
    constellation: sky.constellationOf(icrs.lonDeg, icrs.latDeg).abbr,
  };
}

export interface EnvelopeVerdict {
  inside: boolean;
  breaks: string[];
}

const LIMIT_WORDS: Record<string, string> = {
  minAltitude: 'below the lowest altitude',
  maxAltitude: 'above the highest altitude',
  azimuthRanges: 'outside the azimuth ranges',
  keyholeRadius: 'inside the zenith keyhole',
  sunAvoidance: 'too close to the Sun',
  moonAvoidance: 'too close to the Moon',
  horizonMask: 'behind the horizon mask',
  hourAngleLimits: 'outside the hour-angle limits',
  declinationLimits: 'outside the declination limits',
};

export interface PointingLike {
  azDeg: number;
  altDeg: number;
  haHours?: number;
  /** Apparent declination of date. */
  decDeg?: number;
}

/** Envelope check for one pointing through the engine's evaluateEnvelope; violations in words with the excess. */
export function checkEnvelope(env: EnvelopeLike, p: PointingLike, ctx: { sun: { azDeg: number; altDeg: number } | null; moon: { azDeg: number; altDeg: number } | null }): EnvelopeVerdict {
  const r = sky.evaluateEnvelope(env as any, p, { sun: ctx.sun, moon: ctx.moon });
  const breaks = r.violations.map((v) => `${LIMIT_WORDS[v.limit] ?? v.limit} by ${Math.abs(v.margin).toFixed(v.unit === 'h' ? 2 : 1)}${v.unit === 'h' ? ' h' : '°'}`);
  return { inside: r.allowed, breaks };
}

/** Apparent place of a catalogue position or body (the engine's observe()). */
export function observe(site: SiteInput, date: Date, target: { raDeg: number; decDeg: number; motion?: MotionLike } | { body: string }) {
  return sky.observe(site, date, target as any);
}

export interface EventLike {
  kind: string;
  time: Date;
}

type EngineTarget = { raDeg: number; decDeg: number } | { body: string };

export function riseTransitSet(site: SiteInput, target: EngineTarget, from: Date, to: Date): EventLike[] {
  return sky.riseTransitSet(site, target as sky.Target, from, to);
}

export function riseTransitSetDetailed(site: SiteInput, target: EngineTarget, from: Date, to: Date): { events: EventLike[]; alwaysUp: boolean; alwaysDown: boolean } {
  return sky.riseTransitSetDetailed(site, target as sky.Target, from, to);
}

export function twilightEvents(site: SiteInput, from: Date, to: Date): EventLike[] {
  return sky.twilightEvents(site, from, to);
}

/** Horizon-mask altitude at an azimuth (the engine's interpolation). */
export function maskAltitude(mask: [number, number][], azDeg: number): number {
  return sky.maskAltitudeDeg(sky.prepareMask(mask), azDeg);
}

/** Kasten & Young (1989) airmass at an apparent altitude; null below the horizon. */
export function airmassAt(altDeg: number): number | null {
  return sky.airmassKastenYoung(altDeg);
}
