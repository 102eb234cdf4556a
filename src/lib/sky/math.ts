/**
 * Small vector and 3×3 matrix helpers (row-major Float64Array(9)), gl-matrix style:
 * results go into an `out` argument, nothing is allocated on the hot path.
 */
export type Mat3 = Float64Array;
export type Vec3 = Float64Array;

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;
export const ARCSEC = DEG / 3600;
export const HOURS_TO_DEG = 15;

export const mat3 = (): Mat3 => new Float64Array(9);
export const vec3 = (x = 0, y = 0, z = 0): Vec3 => Float64Array.of(x, y, z);

export function identity(out: Mat3): Mat3 {
  out.fill(0);
  out[0] = out[4] = out[8] = 1;
  return out;
}

/** out = a · b (out may alias a or b). */
export function mul(out: Mat3, a: ArrayLike<number>, b: ArrayLike<number>): Mat3 {
  const a0 = a[0], a1 = a[1], a2 = a[2], a3 = a[3], a4 = a[4], a5 = a[5], a6 = a[6], a7 = a[7], a8 = a[8];
  const b0 = b[0], b1 = b[1], b2 = b[2], b3 = b[3], b4 = b[4], b5 = b[5], b6 = b[6], b7 = b[7], b8 = b[8];
  out[0] = a0 * b0 + a1 * b3 + a2 * b6;
  out[1] = a0 * b1 + a1 * b4 + a2 * b7;
  out[2] = a0 * b2 + a1 * b5 + a2 * b8;
  out[3] = a3 * b0 + a4 * b3 + a5 * b6;
  out[4] = a3 * b1 + a4 * b4 + a5 * b7;
  out[5] = a3 * b2 + a4 * b5 + a5 * b8;
  out[6] = a6 * b0 + a7 * b3 + a8 * b6;
  out[7] = a6 * b1 + a7 * b4 + a8 * b7;
  out[8] = a6 * b2 + a7 * b5 + a8 * b8;
  return out;
}

export function transpose(out: Mat3, a: ArrayLike<number>): Mat3 {
  const a1 = a[1], a2 = a[2], a5 = a[5];
  out[0] = a[0]; out[4] = a[4]; out[8] = a[8];
  out[1] = a[3]; out[3] = a1;
  out[2] = a[6]; out[6] = a2;
  out[5] = a[7]; out[7] = a5;
  return out;
}

/** out = m · v (out may alias v). */
export function mulVec(out: Float64Array | number[], m: ArrayLike<number>, v: ArrayLike<number>): Float64Array | number[] {
  const x = v[0], y = v[1], z = v[2];
  out[0] = m[0] * x + m[1] * y + m[2] * z;
  out[1] = m[3] * x + m[4] * y + m[5] * z;
  out[2] = m[6] * x + m[7] * y + m[8] * z;
  return out;
}

/** out = mᵀ · v. */
export function mulVecT(out: Float64Array | number[], m: ArrayLike<number>, v: ArrayLike<number>): Float64Array | number[] {
  const x = v[0], y = v[1], z = v[2];
  out[0] = m[0] * x + m[3] * y + m[6] * z;
  out[1] = m[1] * x + m[4] * y + m[7] * z;
  out[2] = m[2] * x + m[5] * y + m[8] * z;
  return out;
}

/**
 * Frame rotations in the SOFA sense (rotate the axes, not the vector): R1 about x, R2 about y,
 * R3 about z, each applied on the left: out = R(angle) · m.
 */
export function rotX(out: Mat3, angleRad: number, m: ArrayLike<number>): Mat3 {
  const s = Math.sin(angleRad), c = Math.cos(angleRad);
  const a3 = c * m[3] + s * m[6], a4 = c * m[4] + s * m[7], a5 = c * m[5] + s * m[8];
  const a6 = -s * m[3] + c * m[6], a7 = -s * m[4] + c * m[7], a8 = -s * m[5] + c * m[8];
  out[0] = m[0]; out[1] = m[1]; out[2] = m[2];
  out[3] = a3; out[4] = a4; out[5] = a5; out[6] = a6; out[7] = a7; out[8] = a8;
  return out;
}
export function rotY(out: Mat3, angleRad: number, m: ArrayLike<number>): Mat3 {
  const s = Math.sin(angleRad), c = Math.cos(angleRad);
  const a0 = c * m[0] - s * m[6], a1 = c * m[1] - s * m[7], a2 = c * m[2] - s * m[8];
  const a6 = s * m[0] + c * m[6], a7 = s * m[1] + c * m[7], a8 = s * m[2] + c * m[8];
  out[3] = m[3]; out[4] = m[4]; out[5] = m[5];
  out[0] = a0; out[1] = a1; out[2] = a2; out[6] = a6; out[7] = a7; out[8] = a8;
  return out;
}
export function rotZ(out: Mat3, angleRad: number, m: ArrayLike<number>): Mat3 {
  const s = Math.sin(angleRad), c = Math.cos(angleRad);
  const a0 = c * m[0] + s * m[3], a1 = c * m[1] + s * m[4], a2 = c * m[2] + s * m[5];
  const a3 = -s * m[0] + c * m[3], a4 = -s * m[1] + c * m[4], a5 = -s * m[2] + c * m[5];
  out[6] = m[6]; out[7] = m[7]; out[8] = m[8];
  out[0] = a0; out[1] = a1; out[2] = a2; out[3] = a3; out[4] = a4; out[5] = a5;
  return out;
}

/** Unit vector from longitude-like and latitude-like angles in degrees (RA/Dec, l/b, λ/β). */
export function unitFromLonLat<T extends { [i: number]: number }>(out: T, lonDeg: number, latDeg: number): T {
  const cl = Math.cos(latDeg * DEG);
  out[0] = cl * Math.cos(lonDeg * DEG);
  out[1] = cl * Math.sin(lonDeg * DEG);
  out[2] = Math.sin(latDeg * DEG);
  return out;
}

/** Longitude in [0, 360) and latitude in degrees of a (not necessarily unit) vector. */
export function lonLatFromVec(v: ArrayLike<number>): { lonDeg: number; latDeg: number } {
  const x = v[0], y = v[1], z = v[2];
  const r = Math.hypot(x, y);
  let lon = r === 0 ? 0 : Math.atan2(y, x) * RAD;
  if (lon < 0) lon += 360;
  if (lon >= 360) lon -= 360;
  return { lonDeg: lon, latDeg: Math.atan2(z, r) * RAD };
}

export function norm3(v: ArrayLike<number>): number {
  return Math.hypot(v[0], v[1], v[2]);
}

export function normalize(out: Float64Array | number[], v: ArrayLike<number>): Float64Array | number[] {
  const r = Math.hypot(v[0], v[1], v[2]) || 1;
  out[0] = v[0] / r; out[1] = v[1] / r; out[2] = v[2] / r;
  return out;
}

export function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

export function cross(out: Float64Array | number[], a: ArrayLike<number>, b: ArrayLike<number>): Float64Array | number[] {
  const x = a[1] * b[2] - a[2] * b[1];
  const y = a[2] * b[0] - a[0] * b[2];
  const z = a[0] * b[1] - a[1] * b[0];
  out[0] = x; out[1] = y; out[2] = z;
  return out;
}

/** Angle in [0, 360). */
export function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}
/** Angle in (-180, 180]. */
export function wrap180(deg: number): number {
  const r = wrap360(deg);
  return r > 180 ? r - 360 : r;
}
/** Hours in [0, 24). */
export function wrap24(h: number): number {
  const r = h % 24;
  return r < 0 ? r + 24 : r;
}
/** Hours in [-12, 12). */
export function wrap12(h: number): number {
  const r = wrap24(h + 12) - 12;
  return r;
}

/** Angle between two vectors in radians, robust near 0 and π (atan2 of |a×b| and a·b). */
export function angleBetween(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const cx = a[1] * b[2] - a[2] * b[1];
  const cy = a[2] * b[0] - a[0] * b[2];
  const cz = a[0] * b[1] - a[1] * b[0];
  return Math.atan2(Math.hypot(cx, cy, cz), a[0] * b[0] + a[1] * b[1] + a[2] * b[2]);
}
