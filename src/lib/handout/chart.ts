/**
 * All-sky chart maths for the printed handout. Pure: numbers in, numbers and SVG path strings out.
 *
 * Zenithal equidistant projection of the sky dome as seen lying on one's back, looking up:
 *   r = (90° − alt) / 90° × R,  x = cx − r sin A,  y = cy − r cos A   (A = azimuth from north through east)
 * so the zenith is the centre, the horizon the circle of radius R, north is up and east is to the LEFT
 * (a map of the sky overhead is a mirror image of a map of the ground; common practice for star charts).
 */

export interface ChartFrame {
  /** Radius of the horizon circle. */
  R: number;
  cx: number;
  cy: number;
}

export interface XY {
  x: number;
  y: number;
}

const DEG = Math.PI / 180;

/** Chart radius of an altitude (degrees); 0 at the zenith, R on the horizon, > R below it. */
export function radiusOf(altDeg: number, R: number): number {
  return ((90 - altDeg) / 90) * R;
}

/** Projects altitude/azimuth (degrees) to chart coordinates (SVG: y grows downward). */
export function project(altDeg: number, azDeg: number, f: ChartFrame): XY {
  const r = radiusOf(altDeg, f.R);
  return { x: f.cx - r * Math.sin(azDeg * DEG), y: f.cy - r * Math.cos(azDeg * DEG) };
}

/** Inverse of `project`: chart coordinates → { alt, az } in degrees. */
export function unproject(x: number, y: number, f: ChartFrame): { alt: number; az: number } {
  const dx = f.cx - x;
  const dy = f.cy - y;
  const r = Math.hypot(dx, dy);
  const az = r === 0 ? 0 : ((Math.atan2(dx, dy) / DEG) % 360 + 360) % 360;
  return { alt: 90 - (r / f.R) * 90, az };
}

export const CARDINALS = [
  { label: 'N', az: 0 },
  { label: 'E', az: 90 },
  { label: 'S', az: 180 },
  { label: 'W', az: 270 },
] as const;

/** Where to print the cardinal letters: just outside the horizon circle. */
export function cardinalPositions(f: ChartFrame, offset = 14): { label: string; az: number; x: number; y: number }[] {
  return CARDINALS.map((c) => {
    const p = project(-(offset / f.R) * 90, c.az, f);
    return { label: c.label, az: c.az, ...p };
  });
}

const fmt = (n: number) => (Math.round(n * 100) / 100).toString();

/**
 * A polyline of alt/az points (degrees) → an SVG path that keeps only the parts above `minAlt`,
 * clipping each crossing exactly on the horizon circle. `closed` joins the last point to the first.
 */
export function skyPath(points: readonly { alt: number; az: number }[], f: ChartFrame, closed = false, minAlt = 0): string {
  if (points.length < 2) return '';
  const pts = closed ? [...points, points[0]!] : points;
  let d = '';
  let penDown = false;
  const cut = (a: { alt: number; az: number }, b: { alt: number; az: number }) => {
    const t = (minAlt - a.alt) / (b.alt - a.alt);
    // Interpolate along the shorter azimuth arc.
    let dAz = b.az - a.az;
    if (dAz > 180) dAz -= 360;
    if (dAz < -180) dAz += 360;
    return project(minAlt, a.az + t * dAz, f);
  };
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i]!;
    const above = p.alt >= minAlt;
    if (i === 0) {
      if (above) {
        const q = project(p.alt, p.az, f);
        d += `M${fmt(q.x)} ${fmt(q.y)}`;
        penDown = true;
      }
      continue;
    }
    const prev = pts[i - 1]!;
    const prevAbove = prev.alt >= minAlt;
    if (above && prevAbove) {
      const q = project(p.alt, p.az, f);
      d += `L${fmt(q.x)} ${fmt(q.y)}`;
    } else if (above && !prevAbove) {
      const c = cut(prev, p);
      const q = project(p.alt, p.az, f);
      d += `M${fmt(c.x)} ${fmt(c.y)}L${fmt(q.x)} ${fmt(q.y)}`;
      penDown = true;
    } else if (!above && prevAbove && penDown) {
      const c = cut(prev, p);
      d += `L${fmt(c.x)} ${fmt(c.y)}`;
    }
  }
  return d;
}

/**
 * Linear interpolation of a horizon mask [[azimuth, elevation], ...] at azimuth `az`, wrapping at 360°
 * (the API contract's rule). An empty mask is 0° everywhere.
 */
export function maskAltitude(mask: readonly (readonly [number, number])[], azDeg: number): number {
  if (mask.length === 0) return 0;
  if (mask.length === 1) return mask[0]![1];
  const sorted = [...mask].sort((a, b) => a[0] - b[0]);
  const a = ((azDeg % 360) + 360) % 360;
  for (let i = 0; i < sorted.length; i++) {
    const p = sorted[i]!;
    const q = sorted[(i + 1) % sorted.length]!;
    const span = i === sorted.length - 1 ? q[0] + 360 - p[0] : q[0] - p[0];
    let off = a - p[0];
    if (off < 0) off += 360;
    if (off <= span) return span === 0 ? p[1] : p[1] + ((q[1] - p[1]) * off) / span;
  }
  return sorted[0]![1];
}

/** The skyline of a horizon mask as a closed SVG region between the mask and the horizon circle. */
export function skylinePath(mask: readonly (readonly [number, number])[], f: ChartFrame, stepDeg = 2): string {
  if (mask.length === 0) return '';
  const outer: XY[] = [];
  const inner: XY[] = [];
  for (let az = 0; az < 360; az += stepDeg) {
    inner.push(project(Math.max(0, maskAltitude(mask, az)), az, f));
    outer.push(project(0, az, f));
  }
  const ring = (ps: XY[]) => `M${ps.map((p) => `${fmt(p.x)} ${fmt(p.y)}`).join('L')}Z`;
  // Even-odd fill of the two rings shades the band between the horizon and the skyline.
  return `${ring(outer)}${ring(inner)}`;
}

/** Dot radius for a star of visual magnitude `mag` (brighter = larger). */
export function starRadius(mag: number): number {
  return Math.max(0.6, Math.min(4.5, 3.4 - 0.55 * mag));
}

/** Altitude rings (e.g. 30° and 60°) as radii. */
export function altitudeRings(f: ChartFrame, alts: readonly number[] = [30, 60]): { alt: number; r: number }[] {
  return alts.map((alt) => ({ alt, r: radiusOf(alt, f.R) }));
}
