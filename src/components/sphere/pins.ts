/**
 * Pins drawn on the overlay: labels, arrows, arcs and regions. Horizontal pins are fixed to the landscape
 * (azimuth/altitude); equatorial pins (RA/Dec, ICRS) turn with the sky through the engine's rotation.
 * Between vertices the path follows the great circle (slerp), so arcs and region edges lie on the sphere.
 */
import * as THREE from 'three';
import type { PinLike } from './context';
import { altAzToEnu, enuToWorld, SPHERE_RADIUS } from './geometry';
import type { SkyModel } from './model';
import { COLORS } from './styles';

const R = SPHERE_RADIUS;

/** Points along the great-circle arc from unit a to unit b, every ~`stepDeg`, excluding b. */
export function slerpPath(a: ArrayLike<number>, b: ArrayLike<number>, stepDeg: number, out: number[][] = []): number[][] {
  const dot = Math.max(-1, Math.min(1, a[0] * b[0] + a[1] * b[1] + a[2] * b[2]));
  const ang = Math.acos(dot);
  const n = Math.max(1, Math.ceil((ang * 180) / Math.PI / stepDeg));
  const s = Math.sin(ang);
  for (let i = 0; i < n; i++) {
    const t = i / n;
    if (s < 1e-9) {
      out.push([a[0], a[1], a[2]]);
      continue;
    }
    const wa = Math.sin((1 - t) * ang) / s, wb = Math.sin(t * ang) / s;
    out.push([wa * a[0] + wb * b[0], wa * a[1] + wb * b[1], wa * a[2] + wb * b[2]]);
  }
  return out;
}

export function pinEnuPoints(model: SkyModel, pin: PinLike): number[][] {
  return pin.points.map(([p, q]) => (pin.frame === 'horizontal' ? (altAzToEnu([0, 0, 0], p, q) as number[]) : model.icrsToEnu(p, q, [0, 0, 0])));
}

const v = new THREE.Vector3();

/**
 * Liang–Barsky: the part of segment a→b inside the rectangle, as parameters [t0, t1] along it, or null.
 * Pins are stroked only where they can be seen: a dashed stroke along a path that runs 10⁵ px off the
 * canvas (a point just in front of the camera projects far out) costs the rasteriser every dash.
 */
export function clipSegment(ax: number, ay: number, bx: number, by: number, xmin: number, ymin: number, xmax: number, ymax: number): [number, number] | null {
  const dx = bx - ax, dy = by - ay;
  let t0 = 0, t1 = 1;
  const edges: Array<[number, number]> = [
    [-dx, ax - xmin],
    [dx, xmax - ax],
    [-dy, ay - ymin],
    [dy, ymax - ay],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const r = q / p;
    if (p < 0) {
      if (r > t1) return null;
      if (r > t0) t0 = r;
    } else {
      if (r < t0) return null;
      if (r < t1) t1 = r;
    }
  }
  return [t0, t1];
}

/** Sutherland–Hodgman: a polygon (x, y pairs) clipped to the rectangle; the result may be empty. */
export function clipPolygon(poly: Array<[number, number]>, xmin: number, ymin: number, xmax: number, ymax: number): Array<[number, number]> {
  const planes: Array<[(p: [number, number]) => boolean, (a: [number, number], b: [number, number]) => [number, number]]> = [
    [(p) => p[0] >= xmin, (a, b) => [xmin, a[1] + ((b[1] - a[1]) * (xmin - a[0])) / (b[0] - a[0])]],
    [(p) => p[0] <= xmax, (a, b) => [xmax, a[1] + ((b[1] - a[1]) * (xmax - a[0])) / (b[0] - a[0])]],
    [(p) => p[1] >= ymin, (a, b) => [a[0] + ((b[0] - a[0]) * (ymin - a[1])) / (b[1] - a[1]), ymin]],
    [(p) => p[1] <= ymax, (a, b) => [a[0] + ((b[0] - a[0]) * (ymax - a[1])) / (b[1] - a[1]), ymax]],
  ];
  let out = poly;
  for (const [inside, cut] of planes) {
    const src = out;
    out = [];
    for (let i = 0; i < src.length; i++) {
      const cur = src[i], prev = src[(i + src.length - 1) % src.length];
      if (inside(cur)) {
        if (!inside(prev)) out.push(cut(prev, cur));
        out.push(cur);
      } else if (inside(prev)) out.push(cut(prev, cur));
    }
    if (!out.length) break;
  }
  return out;
}

/** Margin (CSS px) around the canvas inside which pin paths are kept: line caps and joins stay whole. */
const CLIP_MARGIN = 24;

export function drawPins(ctx: CanvasRenderingContext2D, w: number, h: number, camera: THREE.Camera, model: SkyModel, pins: PinLike[], hideBelow: boolean) {
  const world = [0, 0, 0];
  const project = (enu: ArrayLike<number>): [number, number] | null => {
    if (hideBelow && enu[2] < -0.01) return null;
    enuToWorld(world, enu, R);
    v.set(world[0], world[1], world[2]).applyMatrix4(camera.matrixWorldInverse);
    if (v.z >= -0.5) return null;
    v.applyMatrix4(camera.projectionMatrix);
    return [(v.x * 0.5 + 0.5) * w, (-v.y * 0.5 + 0.5) * h];
  };
  const x0 = -CLIP_MARGIN, y0 = -CLIP_MARGIN, x1 = w + CLIP_MARGIN, y1 = h + CLIP_MARGIN;
  for (const pin of pins) {
    if (pin.kind === 'label' || pin.points.length < 2) continue;
    const pts = pinEnuPoints(model, pin);
    const path: number[][] = [];
    const closed = pin.kind === 'region';
    for (let i = 0; i < pts.length - (closed ? 0 : 1); i++) slerpPath(pts[i], pts[(i + 1) % pts.length], 1, path);
    if (!closed) path.push(pts[pts.length - 1]);
    const color = pin.color ?? COLORS.pin;
    ctx.strokeStyle = color;
    ctx.fillStyle = color;
    ctx.lineWidth = 2;
    const screen = path.map(project);
    if (closed) {
      // The fill: the visible vertices as one polygon, clipped to the canvas.
      const poly = clipPolygon(screen.filter((p): p is [number, number] => p !== null), x0, y0, x1, y1);
      if (poly.length >= 3) {
        ctx.beginPath();
        ctx.moveTo(poly[0][0], poly[0][1]);
        for (let i = 1; i < poly.length; i++) ctx.lineTo(poly[i][0], poly[i][1]);
        ctx.closePath();
        ctx.globalAlpha = 0.12;
        ctx.fill();
        ctx.globalAlpha = 1;
      }
      screen.push(screen[0]);
    }
    // The outline: each visible segment clipped to the canvas; the pen lifts where the path leaves it.
    ctx.setLineDash(pin.frame === 'horizontal' ? [] : [6, 3]);
    ctx.beginPath();
    let penAt: [number, number] | null = null;
    let prev: [number, number] | null = null;
    let last: [number, number] | null = null;
    for (let i = 1; i < screen.length; i++) {
      const a = screen[i - 1], b = screen[i];
      if (!a || !b) continue;
      const t = clipSegment(a[0], a[1], b[0], b[1], x0, y0, x1, y1);
      if (!t) continue;
      const sx = a[0] + (b[0] - a[0]) * t[0], sy = a[1] + (b[1] - a[1]) * t[0];
      const ex = a[0] + (b[0] - a[0]) * t[1], ey = a[1] + (b[1] - a[1]) * t[1];
      if (!penAt || penAt[0] !== sx || penAt[1] !== sy) ctx.moveTo(sx, sy);
      ctx.lineTo(ex, ey);
      penAt = [ex, ey];
      prev = [sx, sy];
      last = t[1] === 1 && i === screen.length - 1 ? [ex, ey] : null;
    }
    ctx.stroke();
    ctx.setLineDash([]);
    if (pin.kind === 'arrow' && last && prev) {
      const ang = Math.atan2(last[1] - prev[1], last[0] - prev[0]);
      ctx.beginPath();
      ctx.moveTo(last[0], last[1]);
      ctx.lineTo(last[0] - 11 * Math.cos(ang - 0.4), last[1] - 11 * Math.sin(ang - 0.4));
      ctx.lineTo(last[0] - 11 * Math.cos(ang + 0.4), last[1] - 11 * Math.sin(ang + 0.4));
      ctx.closePath();
      ctx.fill();
    }
  }
}
