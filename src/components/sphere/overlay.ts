/**
 * Text and markers drawn on a 2D canvas laid over the WebGL canvas, re-projected every rendered frame
 * (names, cardinal points, grid numbers, targets, comments). Being a plain canvas, it is also composited
 * straight into the PNG snapshot.
 */
import * as THREE from 'three';
import type { Layers } from '../../lib/contracts/scene-doc';
import type { CommentAnchor, PinLike, Selection } from './context';
import { altAzToEnu, enuToWorld, mat3MulVec, SPHERE_RADIUS, unitFromLonLat } from './geometry';
import type { SkyModel } from './model';
import { COLORS, GRID_STYLES } from './styles';

export type LabelKind = 'cardinal' | 'ref' | 'star' | 'body' | 'grid' | 'target' | 'pin' | 'comment';

export interface LabelItem {
  kind: LabelKind;
  text: string;
  /** World position (on the sphere). */
  x: number;
  y: number;
  z: number;
  color: string;
  marker: 'none' | 'dot' | 'ring' | 'comment' | 'cross';
  /** Fixed to the landscape (cardinals) or to the sky. */
  bold?: boolean;
  warn?: boolean;
}

const R = SPHERE_RADIUS;

function push(list: LabelItem[], kind: LabelKind, text: string, enu: ArrayLike<number>, color: string, marker: LabelItem['marker'] = 'none', extra: Partial<LabelItem> = {}) {
  const w = enuToWorld([0, 0, 0], enu, R);
  list.push({ kind, text, x: w[0], y: w[1], z: w[2], color, marker, ...extra });
}

const BODY_NAMES: Record<string, string> = {
  sun: 'Sun', moon: 'Moon', mercury: 'Mercury', venus: 'Venus', mars: 'Mars', jupiter: 'Jupiter', saturn: 'Saturn', uranus: 'Uranus', neptune: 'Neptune',
};
export const bodyName = (b: string) => BODY_NAMES[b] ?? b;

/** Which grid labels to place: numbers along one meridian and around the equator of each grid. */
function gridLabels(list: LabelItem[], toEnu: (lon: number, lat: number, out: number[]) => ArrayLike<number>, color: string, lonFmt: (l: number) => string, latFmt: (b: number) => string, lonStep: number, latStep: number, labelLon: number) {
  const v = [0, 0, 0];
  for (let lat = -90 + latStep; lat < 90; lat += latStep) {
    if (lat === 0) continue;
    push(list, 'grid', latFmt(lat), toEnu(labelLon, lat, v), color);
  }
  for (let lon = 0; lon < 360; lon += lonStep) push(list, 'grid', lonFmt(lon), toEnu(lon, 0, v), color);
}

export function collectLabels(model: SkyModel, layers: Required<Layers>, pins: PinLike[], comments: CommentAnchor[], selected: Selection | null): LabelItem[] {
  const list: LabelItem[] = [];
  const v = [0, 0, 0];
  if (layers.horizon || layers.ground) {
    for (const [t, az] of [['N', 0], ['E', 90], ['S', 180], ['W', 270]] as const) push(list, 'cardinal', t, altAzToEnu(v, az, 0), COLORS.cardinal, 'none', { bold: true });
  }
  if (layers.referencePoints) {
    for (const p of model.refs) {
      if (p.key === 'east' || p.key === 'west') continue; // the cardinal letters mark them
      push(list, 'ref', p.label, p.enu, COLORS.referencePoint, 'cross');
    }
  }
  if (layers.altAzGrid) {
    gridLabels(list, (az, alt, o) => altAzToEnu(o, az, alt), GRID_STYLES.altAzGrid.color, (a) => `${a}°`, (b) => `${b}°`, 30, 15, 180);
  }
  if (layers.raDecGrid) {
    const m = model.frame.icrsToEnu;
    gridLabels(list, (ra, dec, o) => mat3MulVec(o, m, unitFromLonLat(o, ra, dec)), GRID_STYLES.raDecGrid.color, (ra) => `${Math.round(ra / 15)}h`, (d) => `${d > 0 ? '+' : '−'}${Math.abs(d)}°`, 30, 15, 0);
  }
  if (layers.eclipticGrid && model.eclToEnu) {
    const m = model.eclToEnu;
    gridLabels(list, (l, b, o) => mat3MulVec(o, m, unitFromLonLat(o, l, b)), GRID_STYLES.eclipticGrid.color, (l) => `λ${l}°`, (b) => `β${b > 0 ? '+' : '−'}${Math.abs(b)}°`, 30, 15, 90);
  }
  if (layers.stars && layers.starLabels && model.cat) {
    const c = model.cat;
    const lim = Math.min(layers.limitingMagnitude, 1.6);
    for (let i = 0; i < c.count && c.vmag[i] <= lim; i++) {
      const name = c.name[i];
      if (!name) continue;
      v[0] = model.starEnu[i * 3];
      v[1] = model.starEnu[i * 3 + 1];
      v[2] = model.starEnu[i * 3 + 2];
      push(list, 'star', name, v, COLORS.labelDim);
    }
  }
  if (layers.bodies && layers.bodyLabels) {
    for (const b of model.bodies) {
      const phase = b.body === 'moon' && b.illuminatedFraction !== undefined ? ` ${Math.round(b.illuminatedFraction * 100)}%` : '';
      push(list, 'body', bodyName(b.body) + phase, b.enu, b.body === 'sun' ? COLORS.sun : COLORS.label);
    }
  }
  if (layers.targets) {
    for (const t of model.targets) {
      const danger = model.envelope?.sunAvoidance !== undefined ? t.sunSepDeg < model.envelope.sunAvoidance : t.sunSepDeg < 15;
      const color = t.inside === false ? COLORS.targetOutside : COLORS.target;
      push(list, 'target', (danger ? '☀ ' : '') + t.name, t.enu, danger ? COLORS.sunKeepOut : color, 'ring', { warn: danger, bold: selected?.kind === 'target' && selected.id === t.id });
    }
  }
  if (layers.pins) {
    for (const p of pins) {
      if (!p.label || !p.points.length) continue;
      const [a, b] = p.points[0];
      const enu = p.frame === 'horizontal' ? altAzToEnu(v, a, b) : model.icrsToEnu(a, b, v);
      push(list, 'pin', p.label, enu, p.color ?? COLORS.pin, p.kind === 'label' ? 'dot' : 'none');
    }
  }
  if (layers.comments) {
    comments.forEach((c, i) => {
      let enu: ArrayLike<number> | null = null;
      if (c.ra !== undefined && c.dec !== undefined) enu = model.icrsToEnu(c.ra, c.dec, v);
      else if (c.azimuth !== undefined && c.altitude !== undefined) enu = altAzToEnu(v, c.azimuth, c.altitude);
      if (enu) push(list, 'comment', c.label ?? `#${i + 1}`, enu, c.resolved ? COLORS.labelDim : COLORS.comment, 'comment');
    });
  }
  return list;
}

const FONTS: Record<LabelKind, string> = {
  cardinal: '700 18px "Space Grotesk", system-ui, sans-serif',
  ref: '500 11px "Space Grotesk", system-ui, sans-serif',
  star: '400 11px "Space Grotesk", system-ui, sans-serif',
  body: '600 13px "Space Grotesk", system-ui, sans-serif',
  grid: '400 10px "Space Grotesk", system-ui, sans-serif',
  target: '600 12px "Space Grotesk", system-ui, sans-serif',
  pin: '600 12px "Space Grotesk", system-ui, sans-serif',
  comment: '600 11px "Space Grotesk", system-ui, sans-serif',
};

/** Font sizes of FONTS, CSS px (the height of a label's box). */
const FONT_PX: Record<LabelKind, number> = { cardinal: 18, ref: 11, star: 11, body: 13, grid: 10, target: 12, pin: 12, comment: 11 };

const scratch = new THREE.Vector3();

/** Which label wins a place when two would overlap: lower first. Labels on the far side of the sphere come last. */
export const LABEL_PRIORITY: Record<LabelKind, number> = { cardinal: 0, target: 1, body: 2, comment: 3, pin: 4, ref: 5, star: 6, grid: 7 };
const FAR = 10;

/** A label placed on screen (CSS pixels). */
export interface PlacedLabel {
  item: LabelItem;
  sx: number;
  sy: number;
  far: boolean;
  /** Text drawn (false: only the marker, the name would overlap a label of higher priority). */
  text: boolean;
}

/** Where a label's text is written for a marker at (sx, sy): x of its left edge (centre for cardinal points), y of its middle. */
function textAnchor(it: LabelItem, sx: number, sy: number): [number, number] {
  if (it.kind === 'cardinal') return [sx, sy - 14];
  return [sx + markerOffset(it), it.marker === 'comment' ? sy - 12 : sy - 1];
}

/** Axis-aligned box of a label's text, CSS pixels: where it is drawn by drawOverlay. */
export function labelBox(it: LabelItem, sx: number, sy: number, width: number): [number, number, number, number] {
  const half = FONT_PX[it.kind] / 2;
  const [tx, ty] = textAnchor(it, sx, sy);
  const x0 = it.kind === 'cardinal' ? tx - width / 2 : tx;
  return [x0, ty - half, x0 + width, ty + half];
}

function markerOffset(it: LabelItem): number {
  switch (it.marker) {
    case 'ring':
      return 11;
    case 'comment':
      return 19;
    case 'dot':
    case 'cross':
      return 7;
    default:
      return it.kind === 'cardinal' ? 0 : 6;
  }
}

/** Half the size of each marker's box, CSS px (see the drawing in drawOverlay). */
function markerBox(it: LabelItem, sx: number, sy: number): [number, number, number, number] | null {
  switch (it.marker) {
    case 'ring':
      return [sx - 8.5, sy - 8.5, sx + 8.5, sy + 8.5];
    case 'dot':
      return [sx - 3, sy - 3, sx + 3, sy + 3];
    case 'cross':
      return [sx - 4.5, sy - 4.5, sx + 4.5, sy + 4.5];
    case 'comment':
      return [sx - 2, sy - 17, sx + 16, sy];
    default:
      return null;
  }
}

/** Gap kept between a written name and any other name or marker, CSS px. */
export const LABEL_GAP = 2;

/**
 * Decides which names are written: in priority order (cardinal points, targets, bodies, comments, pins,
 * reference points, stars, grid numbers; the near side of the sphere before the far side; a selected
 * target first), a name is written only where its box keeps LABEL_GAP px from every name already
 * written and from the marker of every label placed before it. Markers are always drawn, so a name of
 * lower priority never covers the ring or flag of a higher one. Pure: `measure(item)` gives the text
 * width in CSS pixels. Runs every frame, so the rule holds at any zoom and in both views.
 */
export function declutter(placed: PlacedLabel[], measure: (it: LabelItem) => number): PlacedLabel[] {
  const order = placed
    .map((p, i) => ({ p, i, k: LABEL_PRIORITY[p.item.kind] + (p.far ? FAR : 0) - (p.item.bold ? 1 : 0) }))
    .sort((a, b) => a.k - b.k || a.i - b.i);
  const boxes: number[] = [];
  const pad = LABEL_GAP;
  const hits = (x0: number, y0: number, x1: number, y1: number) => {
    for (let j = 0; j < boxes.length; j += 4) {
      if (x0 - pad < boxes[j + 2] && x1 + pad > boxes[j] && y0 - pad < boxes[j + 3] && y1 + pad > boxes[j + 1]) return true;
    }
    return false;
  };
  for (const { p } of order) {
    const [x0, y0, x1, y1] = labelBox(p.item, p.sx, p.sy, measure(p.item));
    const free = !hits(x0, y0, x1, y1);
    p.text = free;
    if (free) boxes.push(x0, y0, x1, y1);
    const m = markerBox(p.item, p.sx, p.sy);
    if (m) boxes.push(m[0], m[1], m[2], m[3]);
  }
  return order.map((o) => o.p);
}

/**
 * Text widths by font and text (the same names come back every frame). Widths measured before the web
 * font has loaded are those of the fallback font: the cache starts again whenever fonts finish loading,
 * or names measured narrow would be written over their neighbours.
 */
const widths = new Map<string, number>();
let fontsHooked = false;
function hookFonts() {
  fontsHooked = true;
  const fonts = typeof document !== 'undefined' ? document.fonts : undefined;
  fonts?.addEventListener?.('loadingdone', () => widths.clear());
}
function measureWith(ctx: CanvasRenderingContext2D) {
  if (!fontsHooked) hookFonts();
  return (it: LabelItem) => {
    const key = it.kind + '\u0000' + it.text;
    let w = widths.get(key);
    if (w === undefined) {
      ctx.font = FONTS[it.kind];
      w = ctx.measureText(it.text).width;
      if (widths.size > 5000) widths.clear();
      widths.set(key, w);
    }
    return w;
  };
}

/**
 * Draws the labels for the camera. `hideBelowHorizon`: in the Observer view the ground hides what is below.
 * `t` (0 Observer … 1 Sphere) dims labels on the far side of the sphere. Overlapping names are thinned out
 * by `declutter`; returns how many names were written.
 */
export function drawOverlay(ctx: CanvasRenderingContext2D, cssW: number, cssH: number, dpr: number, camera: THREE.Camera, items: LabelItem[], hideBelowHorizon: boolean, t: number): number {
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.clearRect(0, 0, cssW, cssH);
  ctx.textBaseline = 'middle';
  const camPos = camera.position;
  const placed: PlacedLabel[] = [];
  for (const it of items) {
    if (hideBelowHorizon && it.y < -0.8 && it.kind !== 'cardinal') continue;
    scratch.set(it.x, it.y, it.z).applyMatrix4(camera.matrixWorldInverse);
    if (scratch.z >= -0.5) continue;
    scratch.applyMatrix4(camera.projectionMatrix);
    if (scratch.x < -1.1 || scratch.x > 1.1 || scratch.y < -1.1 || scratch.y > 1.1) continue;
    const sx = (scratch.x * 0.5 + 0.5) * cssW;
    const sy = (-scratch.y * 0.5 + 0.5) * cssH;
    const far = t > 0.5 && it.x * camPos.x + it.y * camPos.y + it.z * camPos.z < 0;
    placed.push({ item: it, sx, sy, far, text: true });
  }
  let written = 0;
  let font = '', fill = '', alpha = -1;
  for (const { item: it, sx, sy, far, text } of declutter(placed, measureWith(ctx))) {
    if (!text && it.marker === 'none') continue;
    const a = far ? 0.45 : 1;
    if (a !== alpha) ctx.globalAlpha = alpha = a;
    if (FONTS[it.kind] !== font) ctx.font = font = FONTS[it.kind];
    if (it.color !== fill) {
      ctx.fillStyle = ctx.strokeStyle = fill = it.color;
    }
    switch (it.marker) {
      case 'ring':
        ctx.lineWidth = it.bold ? 2.5 : 1.6;
        ctx.beginPath();
        ctx.arc(sx, sy, 7, 0, Math.PI * 2);
        ctx.stroke();
        break;
      case 'dot':
        ctx.beginPath();
        ctx.arc(sx, sy, 3, 0, Math.PI * 2);
        ctx.fill();
        break;
      case 'cross':
        ctx.lineWidth = 1.2;
        ctx.beginPath();
        ctx.moveTo(sx - 4, sy);
        ctx.lineTo(sx + 4, sy);
        ctx.moveTo(sx, sy - 4);
        ctx.lineTo(sx, sy + 4);
        ctx.stroke();
        break;
      case 'comment':
        ctx.beginPath();
        ctx.moveTo(sx, sy);
        ctx.lineTo(sx + 5, sy - 7);
        ctx.lineTo(sx + 16, sy - 7);
        ctx.lineTo(sx + 16, sy - 17);
        ctx.lineTo(sx - 2, sy - 17);
        ctx.lineTo(sx - 2, sy - 7);
        ctx.closePath();
        ctx.fill();
        break;
    }
    if (!text) continue;
    written++;
    const [tx, ty] = textAnchor(it, sx, sy);
    if (it.kind === 'cardinal') {
      ctx.textAlign = 'center';
      ctx.lineWidth = 3;
      ctx.strokeStyle = 'rgba(5,7,13,0.85)';
      ctx.strokeText(it.text, tx, ty);
      ctx.fillText(it.text, tx, ty);
      ctx.textAlign = 'left';
      fill = ''; // the outline changed the stroke style
    } else {
      // No text outline for the many small labels: stroking text is slow on a software rasteriser.
      ctx.fillText(it.text, tx, ty);
    }
  }
  ctx.globalAlpha = 1;
  return written;
}
