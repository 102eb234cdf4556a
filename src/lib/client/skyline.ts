/**
 * The skyline profile of a horizon mask, as SVG path data: azimuth 0–360° (north through east) on x,
 * elevation on y, the mask line and the area below it filled. Pure, framework-free.
 * The mask is interpolated linearly in azimuth and wraps at 360° (the API contract's rule), so the
 * profile starts and ends at the elevation the wrap gives at north.
 */

export type MaskPoint = readonly [number, number];

export interface SkylineBox {
  width: number;
  height: number;
  /** Elevation at the bottom and top edges of the plot (degrees). */
  elMin: number;
  elMax: number;
}

export interface Skyline {
  /** The mask line, left (az 0) to right (az 360). */
  line: string;
  /** The closed area below the line, down to the bottom edge. */
  fill: string;
  /** The plotted points, [x, y] in plot units (for markers or tests). */
  points: [number, number][];
}

const wrap = (a: number) => ((a % 360) + 360) % 360;

/** Elevation of the mask at `az` (degrees from north through east), linear, wrapping at 360°. Null for an empty mask. */
export function maskElevationAt(mask: readonly MaskPoint[], az: number): number | null {
  if (mask.length === 0) return null;
  if (mask.length === 1) return mask[0]![1];
  const pts = [...mask].map(([a, e]) => [wrap(a), e] as const).sort((p, q) => p[0] - q[0]);
  const a = wrap(az);
  const first = pts[0]!;
  const last = pts[pts.length - 1]!;
  if (a < first[0] || a >= last[0]) {
    // Between the last point and the first one, through north.
    const a0 = last[0];
    const a1 = first[0] + 360;
    const aa = a < first[0] ? a + 360 : a;
    return a1 === a0 ? last[1] : last[1] + ((first[1] - last[1]) * (aa - a0)) / (a1 - a0);
  }
  for (let i = 0; i + 1 < pts.length; i++) {
    const [a0, e0] = pts[i]!;
    const [a1, e1] = pts[i + 1]!;
    if (a >= a0 && a < a1) return e0 + ((e1 - e0) * (a - a0)) / (a1 - a0);
  }
  return last[1];
}

/** A y range that holds the mask and the horizon (0°), rounded out to tens of degrees, at least 0…30°. */
export function elevationRange(mask: readonly MaskPoint[]): [number, number] {
  let lo = 0;
  let hi = 30;
  for (const [, e] of mask) {
    lo = Math.min(lo, Math.floor(e / 10) * 10);
    hi = Math.max(hi, Math.ceil(e / 10) * 10);
  }
  return [Math.max(-90, lo), Math.min(90, hi)];
}

const r2 = (n: number) => Math.round(n * 100) / 100;

/** Path data for the mask line and the filled area below it. Empty strings for an empty mask. */
export function skylinePath(mask: readonly MaskPoint[], box: SkylineBox): Skyline {
  if (mask.length === 0) return { line: '', fill: '', points: [] };
  const { width, height, elMin, elMax } = box;
  const x = (az: number) => r2((az / 360) * width);
  const y = (el: number) => r2(height - ((Math.min(elMax, Math.max(elMin, el)) - elMin) / (elMax - elMin)) * height);
  const inner = [...mask].map(([a, e]) => [wrap(a), e] as const).filter(([a]) => a > 0).sort((p, q) => p[0] - q[0]);
  const north = maskElevationAt(mask, 0)!;
  const pts: [number, number][] = [[x(0), y(north)], ...inner.map(([a, e]) => [x(a), y(e)] as [number, number]), [x(360), y(north)]];
  const line = pts.map(([px, py], i) => `${i ? 'L' : 'M'}${px} ${py}`).join(' ');
  const fill = `M0 ${r2(height)} ${pts.map(([px, py]) => `L${px} ${py}`).join(' ')} L${r2(width)} ${r2(height)} Z`;
  return { line, fill, points: pts };
}

/** Azimuth ticks of the profile: the cardinal points and every 45° between. */
export const AZIMUTH_TICKS: { az: number; label: string }[] = [
  { az: 0, label: 'N' },
  { az: 45, label: '45°' },
  { az: 90, label: 'E' },
  { az: 135, label: '135°' },
  { az: 180, label: 'S' },
  { az: 225, label: '225°' },
  { az: 270, label: 'W' },
  { az: 315, label: '315°' },
  { az: 360, label: 'N' },
];
