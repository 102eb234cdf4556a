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
    ctx.setLineDash(pin.frame === 'horizontal' ? [] : [6, 3]);
    ctx.beginPath();
    let pen = false;
    let prev: [number, number] | null = null;
    let last: [number, number] | null = null;
    for (const p of path) {
      const s = project(p);
      if (!s) {
        pen = false;
        continue;
      }
      if (pen) ctx.lineTo(s[0], s[1]);
      else ctx.moveTo(s[0], s[1]);
      pen = true;
      prev = last;
      last = s;
    }
    if (closed) {
      ctx.closePath();
      ctx.globalAlpha = 0.12;
      ctx.fill();
      ctx.globalAlpha = 1;
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
