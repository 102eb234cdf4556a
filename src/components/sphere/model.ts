/**
 * SkyModel: everything the view draws for one site and one instant, computed by the sky engine and kept
 * in preallocated arrays. `update(ms)` is called when the instant or site changes (each frame while time
 * plays); layers compare `version` in useFrame and refresh their buffers only when it moved.
 * No three.js here, so it is testable in Node.
 */
import * as engine from './sky-adapter';
import type { Catalogue, EnvelopeLike, SiteInput, SkyBody, SkyFrameLike } from './sky-adapter';
import { altAzToEnu, angleDeg, greatCircle, mat3MulVec, smallCircle, unitFromLonLat } from './geometry';
import type { CircleKey } from './styles';

export interface SceneSiteLike {
  name: string;
  lat: number;
  lon: number;
  height?: number;
  timeZone?: string;
}

export type TargetLike =
  | { id: string; kind: 'star'; name: string; hr: number }
  | { id: string; kind: 'body'; name: string; body: string }
  | { id: string; kind: 'custom'; name: string; ra: number; dec: number; epoch?: number; pmra?: number; pmdec?: number; parallax?: number; radialVelocity?: number };

export interface TargetState {
  id: string;
  name: string;
  kind: string;
  enu: [number, number, number];
  azDeg: number;
  altDeg: number;
  raDeg: number;
  decDeg: number;
  magnitude: number | null;
  haHours: number;
  decOfDateDeg: number;
  /** Angular distance from the Sun, degrees. */
  sunSepDeg: number;
  /** Envelope verdict (null when there is no envelope). */
  inside: boolean | null;
  breaks: string[];
}

export interface RefPoint {
  key: string;
  label: string;
  enu: [number, number, number];
  azDeg: number;
  altDeg: number;
}

const REF_LABELS: Record<string, string> = {
  zenith: 'Zenith',
  nadir: 'Nadir',
  ncp: 'N. celestial pole',
  scp: 'S. celestial pole',
  nep: 'N. ecliptic pole',
  sep: 'S. ecliptic pole',
  marchEquinox: 'March equinox',
  septemberEquinox: 'September equinox',
  juneSolstice: 'June solstice',
  decemberSolstice: 'December solstice',
  east: 'East point',
  west: 'West point',
  eclipticHorizon1: 'Ecliptic ∩ horizon',
  eclipticHorizon2: 'Ecliptic ∩ horizon',
};

/**
 * Points per great circle. Seen from the sphere's centre (Observer view) a great circle is a straight
 * line whatever the count; from outside (Sphere view) a 2.8° chord departs from the circle by 3e-4 of
 * the radius, a tenth of a pixel. Fewer vertices is what a software rasteriser needs most.
 */
export const RING_SEGMENTS = 128;

export class SkyModel {
  site: SiteInput;
  ms = 0;
  version = 0;
  frame!: SkyFrameLike;
  /** Ring poles (ENU) and their closed point lists (ENU, RING_SEGMENTS + 1 points). */
  ringPoles = {} as Record<CircleKey, [number, number, number]>;
  rings = {} as Record<CircleKey, Float64Array>;
  refs: RefPoint[] = [];
  poleAltitudeDeg = 0;
  eclipticHorizonAngleDeg = 0;
  bodies: (SkyBody & { enu: [number, number, number] })[] = [];
  private bodiesFullWall = -Infinity;
  sun: (SkyBody & { enu: [number, number, number] }) | null = null;
  moon: (SkyBody & { enu: [number, number, number] }) | null = null;
  /** Stars, sorted by magnitude (brightest first), ENU unit vectors packed xyz. */
  cat: Catalogue | null = null;
  starEnu: Float32Array = new Float32Array(0);
  targets: TargetState[] = [];
  envelope: EnvelopeLike | null = null;
  targetDefs: TargetLike[] = [];
  sunKeepOut: Float64Array | null = null;
  moonKeepOut: Float64Array | null = null;
  /** Ecliptic (true, of date) → ENU rotation, row-major, from the engine. */
  eclToEnu: Float64Array | null = null;
  /** Set by the view when the ecliptic grid is shown (its rotation costs a nutation evaluation). */
  needEcliptic = false;
  /** Stars fainter than this are not transformed (the view sets it from the limiting-magnitude control). */
  starLimit = 8;
  private starSubset: { n: number; set: { raDeg: Float64Array; decDeg: Float64Array } } | null = null;
  /** Horizontal (ENU) → true equator of date. */
  horToOfDate: Float64Array = new Float64Array(9);

  constructor(site: SiteInput, ms: number) {
    this.site = site;
    this.update(ms);
  }

  setCatalogue(cat: Catalogue) {
    this.cat = cat;
    this.starEnu = new Float32Array(cat.count * 3);
    this.computeStars();
    this.version++;
  }

  setSite(site: SiteInput) {
    this.site = site;
    this.update(this.ms, true);
  }

  setPlan(envelope: EnvelopeLike | null, targets: TargetLike[]) {
    this.envelope = envelope;
    this.targetDefs = targets;
    this.computeTargets();
    this.version++;
  }

  update(ms: number, force = false) {
    if (!force && ms === this.ms && this.frame) return;
    const prevMs = this.ms;
    this.ms = ms;
    const date = new Date(ms);
    this.frame = engine.skyFrame(this.site, date);
    // ENU → of date is the transpose of the engine's of-date → ENU rotation for this frame.
    const e = this.frame.enuFromOfDate, h = this.horToOfDate;
    h[0] = e[0]; h[1] = e[3]; h[2] = e[6]; h[3] = e[1]; h[4] = e[4]; h[5] = e[7]; h[6] = e[2]; h[7] = e[5]; h[8] = e[8];
    if (this.needEcliptic) this.eclToEnu = engine.frameMatrix('eclipticOfDate', 'horizontal', this.site, date, this.eclToEnu ?? new Float64Array(9));
    const gc = engine.greatCircles(this.frame);
    for (const k of ['horizon', 'equator', 'ecliptic', 'meridian', 'primeVertical', 'galactic'] as CircleKey[]) {
      const p = gc[k].poleEnu;
      const pole: [number, number, number] = [p[0], p[1], p[2]];
      this.ringPoles[k] = pole;
      this.rings[k] = greatCircle(pole, RING_SEGMENTS);
    }
    const rp = engine.referencePoints(this.frame);
    this.refs = Object.keys(REF_LABELS)
      .filter((k) => rp.points[k])
      .map((k) => {
        const p = rp.points[k];
        return { key: k, label: REF_LABELS[k], enu: [p.enu[0], p.enu[1], p.enu[2]], azDeg: p.azDeg, altDeg: p.altDeg };
      });
    this.poleAltitudeDeg = rp.poleAltitudeDeg;
    this.eclipticHorizonAngleDeg = rp.eclipticHorizonAngleDeg;
    // Full body descriptions when the instant jumps (> 10 min) or every 2 s of wall time; otherwise only
    // the positions move (magnitude and phase change slowly).
    const wall = typeof performance !== 'undefined' ? performance.now() : Date.now();
    const full = force || this.bodies.length === 0 || Math.abs(ms - prevMs) > 600_000 || wall - this.bodiesFullWall > 2000;
    if (full) this.bodiesFullWall = wall;
    const raw = full ? engine.bodies(this.frame) : engine.bodiesMoved(this.frame, this.bodies);
    this.bodies = raw.map((b) => {
      const v = altAzToEnu([0, 0, 0], b.azDeg, b.altDeg);
      return { ...b, enu: [v[0], v[1], v[2]] as [number, number, number] };
    });
    this.sun = this.bodies.find((b) => b.body === 'sun') ?? null;
    this.moon = this.bodies.find((b) => b.body === 'moon') ?? null;
    const env = this.envelope;
    this.sunKeepOut = env?.sunAvoidance && this.sun ? smallCircle(this.sun.enu, env.sunAvoidance, 96) : null;
    this.moonKeepOut = env?.moonAvoidance && this.moon ? smallCircle(this.moon.enu, env.moonAvoidance, 96) : null;
    this.computeStars();
    this.computeTargets();
    this.version++;
  }

  private computeStars() {
    if (!this.cat || !this.frame) return;
    // Only the stars the view draws (catalogue sorted brightest first → a prefix); the subset object is
    // kept while the count is unchanged so the engine's unit-vector cache holds.
    const n = this.starCountTo(this.starLimit);
    if (!this.starSubset || this.starSubset.n !== n) this.starSubset = { n, set: { raDeg: this.cat.raDeg.subarray(0, n), decDeg: this.cat.decDeg.subarray(0, n) } };
    engine.starsToEnu(this.starSubset.set as engine.Catalogue, this.frame, this.starEnu);
  }

  /** Changes the star limit; recomputes at once when more stars become visible. */
  setStarLimit(limit: number) {
    if (limit === this.starLimit) return;
    const grow = limit > this.starLimit;
    this.starLimit = limit;
    if (grow) {
      this.computeStars();
      this.version++;
    }
  }

  /** ICRS (J2000) unit vector → ENU through the engine's rotation for this instant. */
  icrsToEnu(raDeg: number, decDeg: number, out: number[] = [0, 0, 0]): number[] {
    unitFromLonLat(out, raDeg, decDeg);
    return mat3MulVec(out, this.frame.icrsToEnu, out) as number[];
  }

  computeTargets() {
    if (!this.frame) return;
    const date = new Date(this.ms);
    this.targets = this.targetDefs.map((t) => {
      let raDeg = 0, decDeg = 0;
      let magnitude: number | null = null;
      let place: { azDeg: number; altDeg: number; haHours: number; decOfDateDeg: number } | null = null;
      if (t.kind === 'body') {
        const b = this.bodies.find((x) => x.body === t.body);
        if (b) {
          raDeg = b.raDeg;
          decDeg = b.decDeg;
          magnitude = b.magnitude ?? null;
          place = { azDeg: b.azDeg, altDeg: b.altDeg, haHours: b.haHours ?? 0, decOfDateDeg: b.decOfDateDeg ?? b.decDeg };
        }
      } else {
        if (t.kind === 'star') {
          const i = this.cat ? this.cat.hrIndex.get(t.hr) : undefined;
          if (i !== undefined && this.cat) {
            raDeg = this.cat.raDeg[i];
            decDeg = this.cat.decDeg[i];
            magnitude = this.cat.vmag[i];
          }
        } else {
          raDeg = t.ra;
          decDeg = t.dec;
        }
        if (t.kind === 'custom') {
          const { epoch, pmra, pmdec, parallax, radialVelocity } = t;
          const motion = pmra || pmdec || parallax || radialVelocity ? { epoch, pmra, pmdec, parallax, radialVelocity } : undefined;
          place = engine.observe(this.site, date, { raDeg, decDeg, motion });
        } else if (magnitude !== null) place = engine.observe(this.site, date, { raDeg, decDeg });
      }
      if (!place) place = { azDeg: 0, altDeg: -90, haHours: 0, decOfDateDeg: 0 };
      const { azDeg, altDeg } = place;
      const v = altAzToEnu([0, 0, 0], azDeg, altDeg);
      const enu: [number, number, number] = [v[0], v[1], v[2]];
      const sunSepDeg = this.sun ? angleDeg(enu, this.sun.enu) : 180;
      let inside: boolean | null = null;
      let breaks: string[] = [];
      if (this.envelope) {
        const r = engine.checkEnvelope(this.envelope, { azDeg, altDeg, haHours: place.haHours, decDeg: place.decOfDateDeg }, this);
        inside = r.inside;
        breaks = r.breaks;
      }
      return { id: t.id, name: t.name, kind: t.kind, enu, azDeg, altDeg, raDeg, decDeg, haHours: place.haHours, decOfDateDeg: place.decOfDateDeg, magnitude, sunSepDeg, inside, breaks };
    });
  }

  /** Hour angle (h) and declination of date (°) of an ENU direction, through the engine's horizontal → of-date rotation. */
  haDecOfDate(enu: ArrayLike<number>, out = { haHours: 0, decDeg: 0 }) {
    const m = this.horToOfDate;
    const x = m[0] * enu[0] + m[1] * enu[1] + m[2] * enu[2];
    const y = m[3] * enu[0] + m[4] * enu[1] + m[5] * enu[2];
    const z = m[6] * enu[0] + m[7] * enu[1] + m[8] * enu[2];
    const ra = (Math.atan2(y, x) * 180) / Math.PI / 15;
    let ha = (((this.frame.lstHours - ra) % 24) + 24) % 24;
    if (ha >= 12) ha -= 24;
    out.haHours = ha;
    out.decDeg = (Math.atan2(z, Math.hypot(x, y)) * 180) / Math.PI;
    return out;
  }

  /** Index range of stars not fainter than `limit` (catalogue sorted by magnitude). */
  starCountTo(limit: number): number {
    const c = this.cat;
    if (!c) return 0;
    let lo = 0, hi = c.count;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (c.vmag[mid] <= limit) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }
}
