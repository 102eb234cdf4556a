/**
 * Pure geometry handed to three.js: the ENU → world mapping, rings built from a pole, grids, picking rays,
 * star sprite sizes. No three, no DOM, no astronomy: every direction comes from the sky engine as an ENU
 * unit vector [east, north, up]; this file only turns those into vertex arrays.
 *
 * World frame (three.js, right-handed, y up): x = east, y = up, z = −north. The observer stands at the origin.
 */

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;

/** Radius of the drawn celestial sphere, world units. */
export const SPHERE_RADIUS = 100;

export type Vec3Like = ArrayLike<number> & { [i: number]: number };

/** ENU → world: x = east, y = up, z = −north. `out` may alias `enu`. */
export function enuToWorld(out: Vec3Like, enu: ArrayLike<number>, scale = 1): Vec3Like {
  const e = enu[0], n = enu[1], u = enu[2];
  out[0] = e * scale;
  out[1] = u * scale;
  out[2] = -n * scale;
  return out;
}

/** World → ENU (inverse of enuToWorld, scale 1). `out` may alias `w`. */
export function worldToEnu(out: Vec3Like, w: ArrayLike<number>): Vec3Like {
  const x = w[0], y = w[1], z = w[2];
  out[0] = x;
  out[1] = -z;
  out[2] = y;
  return out;
}

/** Horizontal unit vector: [sin az cos alt, cos az cos alt, sin alt]; azimuth from north through east. */
export function altAzToEnu(out: Vec3Like, azDeg: number, altDeg: number): Vec3Like {
  const ca = Math.cos(altDeg * DEG);
  out[0] = Math.sin(azDeg * DEG) * ca;
  out[1] = Math.cos(azDeg * DEG) * ca;
  out[2] = Math.sin(altDeg * DEG);
  return out;
}

export function enuToAltAz(enu: ArrayLike<number>): { azDeg: number; altDeg: number } {
  const e = enu[0], n = enu[1], u = enu[2];
  let az = Math.atan2(e, n) * RAD;
  if (az < 0) az += 360;
  return { azDeg: az, altDeg: Math.atan2(u, Math.hypot(e, n)) * RAD };
}

/** Row-major 3×3 times vector. `out` may alias `v`. */
export function mat3MulVec(out: Vec3Like, m: ArrayLike<number>, v: ArrayLike<number>): Vec3Like {
  const x = v[0], y = v[1], z = v[2];
  out[0] = m[0] * x + m[1] * y + m[2] * z;
  out[1] = m[3] * x + m[4] * y + m[5] * z;
  out[2] = m[6] * x + m[7] * y + m[8] * z;
  return out;
}

/** Transposed row-major 3×3 (the inverse of a rotation) times vector. */
export function mat3TMulVec(out: Vec3Like, m: ArrayLike<number>, v: ArrayLike<number>): Vec3Like {
  const x = v[0], y = v[1], z = v[2];
  out[0] = m[0] * x + m[3] * y + m[6] * z;
  out[1] = m[1] * x + m[4] * y + m[7] * z;
  out[2] = m[2] * x + m[5] * y + m[8] * z;
  return out;
}

export function normalize3(out: Vec3Like, v: ArrayLike<number>): Vec3Like {
  const r = Math.hypot(v[0], v[1], v[2]) || 1;
  out[0] = v[0] / r;
  out[1] = v[1] / r;
  out[2] = v[2] / r;
  return out;
}

export function cross3(out: Vec3Like, a: ArrayLike<number>, b: ArrayLike<number>): Vec3Like {
  const x = a[1] * b[2] - a[2] * b[1];
  const y = a[2] * b[0] - a[0] * b[2];
  const z = a[0] * b[1] - a[1] * b[0];
  out[0] = x;
  out[1] = y;
  out[2] = z;
  return out;
}

export function dot3(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** Angle between two vectors, degrees (atan2 form, robust near 0° and 180°). */
export function angleDeg(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const c = cross3([0, 0, 0], a, b);
  return Math.atan2(Math.hypot(c[0], c[1], c[2]), dot3(a, b)) * RAD;
}

/**
 * Two unit vectors u, v completing `axis` to a right-handed orthonormal basis (u × v = axis).
 * u is chosen towards the world-independent reference least aligned with the axis, so the basis is stable.
 */
export function basisAround(axis: ArrayLike<number>): { u: number[]; v: number[] } {
  const a = normalize3([0, 0, 0], axis);
  const ref = Math.abs(a[2]) < 0.9 ? [0, 0, 1] : [0, 1, 0];
  const u = normalize3([0, 0, 0], cross3([0, 0, 0], ref, a));
  const v = cross3([0, 0, 0], a, u);
  return { u: Array.from(u), v: Array.from(v) };
}

/**
 * Small circle of angular radius `radiusDeg` around the unit vector `centre`, as `segments + 1` points
 * (closed: the last repeats the first), in the same frame as `centre`. radiusDeg = 90 gives the great
 * circle whose pole is `centre`.
 */
export function smallCircle(centre: ArrayLike<number>, radiusDeg: number, segments: number): Float64Array {
  const { u, v } = basisAround(centre);
  const c = normalize3([0, 0, 0], centre);
  const cr = Math.cos(radiusDeg * DEG), sr = Math.sin(radiusDeg * DEG);
  const out = new Float64Array((segments + 1) * 3);
  for (let i = 0; i <= segments; i++) {
    const t = ((i % segments) / segments) * 2 * Math.PI;
    const ct = Math.cos(t), st = Math.sin(t);
    for (let k = 0; k < 3; k++) out[i * 3 + k] = c[k] * cr + sr * (u[k] * ct + v[k] * st);
  }
  return out;
}

/** Great circle whose pole is `poleEnu`, closed, ENU. */
export function greatCircle(poleEnu: ArrayLike<number>, segments: number): Float64Array {
  return smallCircle(poleEnu, 90, segments);
}

/** Maps a packed ENU point list to world positions (Float32Array for a BufferAttribute). */
export function enuListToWorld(enuPoints: ArrayLike<number>, radius = SPHERE_RADIUS, out?: Float32Array): Float32Array {
  const n = Math.floor(enuPoints.length / 3);
  const o = out && out.length >= n * 3 ? out : new Float32Array(n * 3);
  for (let i = 0; i < n; i++) {
    const e = enuPoints[i * 3], nn = enuPoints[i * 3 + 1], u = enuPoints[i * 3 + 2];
    o[i * 3] = e * radius;
    o[i * 3 + 1] = u * radius;
    o[i * 3 + 2] = -nn * radius;
  }
  return o;
}

/**
 * Unit normal of the plane through a closed ring of world points (Newell's method), oriented so that
 * it points along the hemisphere that `hint` (a world vector) is in, when given.
 */
export function ringNormal(points: ArrayLike<number>, hint?: ArrayLike<number>): number[] {
  const n = Math.floor(points.length / 3);
  let nx = 0, ny = 0, nz = 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const x0 = points[i * 3], y0 = points[i * 3 + 1], z0 = points[i * 3 + 2];
    const x1 = points[j * 3], y1 = points[j * 3 + 1], z1 = points[j * 3 + 2];
    nx += (y0 - y1) * (z0 + z1);
    ny += (z0 - z1) * (x0 + x1);
    nz += (x0 - x1) * (y0 + y1);
  }
  const r = Math.hypot(nx, ny, nz) || 1;
  let out = [nx / r, ny / r, nz / r];
  if (hint && dot3(out, hint) < 0) out = out.map((c) => -c);
  return out;
}

/** Largest distance of a ring's points from the plane through the origin with normal `normal` (world units). */
export function ringPlanarity(points: ArrayLike<number>, normal: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < points.length; i += 3) {
    worst = Math.max(worst, Math.abs(points[i] * normal[0] + points[i + 1] * normal[1] + points[i + 2] * normal[2]));
  }
  return worst;
}

/**
 * A coordinate grid as line segments (pairs of ENU points) plus label anchors. `toEnu(lonDeg, latDeg, out)`
 * maps the grid's own spherical coordinates to ENU (e.g. az/alt directly, or RA/Dec through the engine's
 * ICRS → ENU matrix). Parallels every `latStep` (poles excluded), meridians every `lonStep`.
 */
export interface GridLines {
  /** Packed ENU segment endpoints: [x0,y0,z0, x1,y1,z1, ...]. */
  segments: Float64Array;
  labels: { text: string; enu: [number, number, number] }[];
}

export function buildGrid(
  toEnu: (lonDeg: number, latDeg: number, out: Vec3Like) => Vec3Like,
  opts: { lonStep: number; latStep: number; stepDeg?: number; lonLabel: (lonDeg: number) => string; latLabel: (latDeg: number) => string; labelLon?: number; labelLat?: number },
): GridLines {
  const step = opts.stepDeg ?? 3;
  const segs: number[] = [];
  const a = [0, 0, 0], b = [0, 0, 0];
  const labels: GridLines['labels'] = [];
  for (let lat = -90 + opts.latStep; lat < 90 - 1e-9; lat += opts.latStep) {
    for (let lon = 0; lon < 360 - 1e-9; lon += step) {
      toEnu(lon, lat, a);
      toEnu(lon + step, lat, b);
      segs.push(a[0], a[1], a[2], b[0], b[1], b[2]);
    }
    const e = toEnu(opts.labelLon ?? 0, lat, [0, 0, 0]);
    labels.push({ text: opts.latLabel(lat), enu: [e[0], e[1], e[2]] });
  }
  const latMax = 90 - opts.latStep;
  for (let lon = 0; lon < 360 - 1e-9; lon += opts.lonStep) {
    for (let lat = -latMax; lat < latMax - 1e-9; lat += step) {
      toEnu(lon, lat, a);
      toEnu(lon, Math.min(lat + step, latMax), b);
      segs.push(a[0], a[1], a[2], b[0], b[1], b[2]);
    }
    const e = toEnu(lon, opts.labelLat ?? 0, [0, 0, 0]);
    labels.push({ text: opts.lonLabel(lon), enu: [e[0], e[1], e[2]] });
  }
  return { segments: Float64Array.from(segs), labels };
}

/** Unit vector from a longitude-like and latitude-like angle (RA/Dec, λ/β, l/b), degrees: the engine's. */
export { unitFromLonLat } from '../../lib/sky/math';

export function lonLatFromUnit(v: ArrayLike<number>): { lonDeg: number; latDeg: number } {
  let lon = Math.atan2(v[1], v[0]) * RAD;
  if (lon < 0) lon += 360;
  return { lonDeg: lon, latDeg: Math.atan2(v[2], Math.hypot(v[0], v[1])) * RAD };
}

/**
 * First intersection (t ≥ 0) of the ray origin + t·dir with the sphere |p| = radius centred on the origin.
 * Returns the unit direction from the centre to the hit point, or null when the ray misses.
 * From inside the sphere (Observer view) this is simply the far hit.
 */
export function raySphereDirection(origin: ArrayLike<number>, dir: ArrayLike<number>, radius: number): number[] | null {
  const d = normalize3([0, 0, 0], dir);
  const b = dot3(origin, d);
  const c = dot3(origin, origin) - radius * radius;
  const disc = b * b - c;
  if (disc < 0) return null;
  const s = Math.sqrt(disc);
  let t = -b - s;
  if (t < 0) t = -b + s;
  if (t < 0) return null;
  const p = [origin[0] + t * d[0], origin[1] + t * d[1], origin[2] + t * d[2]];
  return normalize3([0, 0, 0], p) as number[];
}

/** Point size in CSS pixels for a star of visual magnitude `vmag` (brighter → larger), clamped. */
export function starSizePx(vmag: number): number {
  return Math.max(1.2, Math.min(9, 5.2 - 0.75 * vmag));
}

/**
 * Star tint from magnitude alone (the catalogue we draw carries no colour index): the brightest stars a warm
 * white, faint ones a cool dim blue-grey. Returns linear-ish RGB in 0..1, also encoding brightness.
 */
export function starTint(vmag: number): [number, number, number] {
  const t = Math.max(0, Math.min(1, (vmag + 1.5) / 8));
  const bright = 1 - 0.55 * t;
  return [bright * (1 - 0.18 * t), bright * (0.98 - 0.08 * t), bright * (0.9 + 0.1 * t)];
}

/** Sixteen-point compass words for an azimuth (north through east). */
const COMPASS = ['north', 'north-northeast', 'northeast', 'east-northeast', 'east', 'east-southeast', 'southeast', 'south-southeast', 'south', 'south-southwest', 'southwest', 'west-southwest', 'west', 'west-northwest', 'northwest', 'north-northwest'];
export function compassWord(azDeg: number): string {
  const i = Math.round((((azDeg % 360) + 360) % 360) / 22.5) % 16;
  return COMPASS[i];
}

/** Words for an altitude, for the text summary. */
export function altitudeWords(altDeg: number): string {
  if (altDeg < 0) return 'below the horizon';
  if (altDeg < 10) return 'low on the horizon';
  if (altDeg < 35) return 'low in the sky';
  if (altDeg < 65) return 'halfway up';
  if (altDeg < 85) return 'high up';
  return 'near the zenith';
}

// ---------- angle formatting ----------

export function wrap360(d: number): number {
  const r = d % 360;
  return r < 0 ? r + 360 : r;
}
export function wrap24(h: number): number {
  const r = h % 24;
  return r < 0 ? r + 24 : r;
}

/** Sexagesimal hours "hh h mm m ss.s s" (with `decimals` on the seconds). */
export function formatHours(h: number, decimals = 1): string {
  const x = wrap24(h);
  const f = 10 ** decimals;
  let total = Math.round(x * 3600 * f) / f;
  if (total >= 86400) total -= 86400;
  const hh = Math.floor(total / 3600);
  const mm = Math.floor((total - hh * 3600) / 60);
  const ss = total - hh * 3600 - mm * 60;
  return `${String(hh).padStart(2, '0')}h ${String(mm).padStart(2, '0')}m ${ss.toFixed(decimals).padStart(decimals ? 3 + decimals : 2, '0')}s`;
}

/** Signed hours (hour angle) "+hh h mm m". */
export function formatSignedHours(h: number): string {
  const s = h < 0 ? '−' : '+';
  const a = Math.abs(h);
  let hh = Math.floor(a);
  let mm = Math.round((a - hh) * 60);
  if (mm === 60) {
    hh += 1;
    mm = 0;
  }
  return `${s}${String(hh).padStart(2, '0')}h ${String(mm).padStart(2, '0')}m`;
}

/** Signed degrees "+dd° mm′ ss″". */
export function formatDms(d: number, signed = true): string {
  const s = d < 0 ? '−' : signed ? '+' : '';
  let total = Math.round(Math.abs(d) * 3600);
  const dd = Math.floor(total / 3600);
  total -= dd * 3600;
  const mm = Math.floor(total / 60);
  const ss = total - mm * 60;
  return `${s}${dd}° ${String(mm).padStart(2, '0')}′ ${String(ss).padStart(2, '0')}″`;
}

export function formatDeg(d: number, decimals = 2): string {
  return `${d < 0 ? '−' : ''}${Math.abs(d).toFixed(decimals)}°`;
}

/**
 * The envelope tint shell: an alt-az grid over the visible hemisphere, `na` cells in azimuth × `nb` in
 * altitude (0°…90°), vertex (a, b) at index b·(na+1)+a. Triangles wind counter-clockwise seen from the
 * observer at the origin, so their front face (three's FrontSide) is the inner face.
 */
export function envelopeShell(na: number, nb: number, radius: number): { positions: Float32Array; indices: Uint32Array } {
  const positions = new Float32Array((na + 1) * (nb + 1) * 3);
  const v = [0, 0, 0];
  for (let b = 0; b <= nb; b++) {
    for (let a = 0; a <= na; a++) {
      enuToWorld(v, altAzToEnu(v, (a * 360) / na, (b * 90) / nb), radius);
      positions.set(v, (b * (na + 1) + a) * 3);
    }
  }
  const indices = new Uint32Array(na * nb * 6);
  let k = 0;
  for (let b = 0; b < nb; b++) {
    for (let a = 0; a < na; a++) {
      const i = b * (na + 1) + a;
      indices.set([i, i + 1, i + na + 1, i + 1, i + na + 2, i + na + 1], k);
      k += 6;
    }
  }
  return { positions, indices };
}

/**
 * Which face of the tint shell to draw: the inner one while the camera is inside the shell (Observer view),
 * the outer, near one from outside (Sphere view). One face costs half the fragments of a two-sided shell.
 */
export function envelopeTintFace(cameraDistance: number, shellRadius: number): 'inner' | 'outer' {
  return cameraDistance < shellRadius ? 'inner' : 'outer';
}

/**
 * Triangles of the tint shell (see envelopeShell) for the cells with at least one forbidden corner, written
 * to `out`; returns how many indices were written. Runs of wholly forbidden cells up one azimuth column are
 * merged into one quad of at most `maxRows` cells: its long sides are chords of a vertical circle, which from
 * the observer's place fall exactly on that circle, so nothing moves on screen. A software rasteriser pays
 * per triangle, and the forbidden regions are mostly wholly forbidden cells.
 */
export function tintIndices(forbidden: (vertex: number) => boolean, na: number, nb: number, out: Uint32Array, maxRows = 6): number {
  const row = na + 1;
  let k = 0;
  const quad = (a: number, b0: number, b1: number) => {
    const i0 = b0 * row + a, j0 = b1 * row + a;
    out[k++] = i0; out[k++] = i0 + 1; out[k++] = j0;
    out[k++] = i0 + 1; out[k++] = j0 + 1; out[k++] = j0;
  };
  for (let a = 0; a < na; a++) {
    let b = 0;
    while (b < nb) {
      const i = b * row + a;
      const c0 = forbidden(i), c1 = forbidden(i + 1), c2 = forbidden(i + row), c3 = forbidden(i + row + 1);
      if (!(c0 || c1 || c2 || c3)) {
        b++;
        continue;
      }
      if (!(c0 && c1 && c2 && c3)) {
        quad(a, b, b + 1);
        b++;
        continue;
      }
      let e = b + 1;
      while (e < nb && e - b < maxRows && forbidden((e + 1) * row + a) && forbidden((e + 1) * row + a + 1)) e++;
      quad(a, b, e);
      b = e;
    }
  }
  return k;
}
