/** Pure helpers between the scene document and what the view shows (steps, picks, comment markers). */
import type { Camera, Layers, Pin, Step } from '../contracts/scene-doc';
import type { Anchor, CommentOut } from '../contracts/comment';
import type { SceneOut } from '../contracts/scene';

export interface SceneLike {
  title: string;
  site: SceneOut['site'];
  time: string;
  layers: Layers;
  camera: Camera;
  envelope: SceneOut['envelope'];
  targets: SceneOut['targets'];
  pins: Pin[];
  steps: Step[];
}

export function toSceneLike(s: Pick<SceneOut, keyof SceneLike>): SceneLike {
  return { title: s.title, site: s.site, time: s.time, layers: s.layers, camera: s.camera, envelope: s.envelope, targets: s.targets, pins: s.pins, steps: s.steps };
}

/**
 * The scene as one step shows it: the step's time, its camera and layers over the scene's own, and when
 * the step focuses a horizontal pin, the camera turned toward the pin's first point.
 */
export function sceneAtStep(s: SceneLike, step: Step | undefined, timeOverride?: string | null): SceneLike {
  if (!step) return timeOverride ? { ...s, time: timeOverride } : s;
  const camera: Camera = { ...s.camera, ...(step.camera ?? {}) } as Camera;
  const pin = step.pinId ? s.pins.find((p) => p.id === step.pinId) : undefined;
  if (pin && pin.frame === 'horizontal' && pin.points[0] && !step.camera?.azDeg) {
    camera.azDeg = pin.points[0][0];
    camera.altDeg = Math.max(-90, Math.min(90, pin.points[0][1]));
  }
  return { ...s, time: timeOverride ?? step.time, camera, layers: { ...s.layers, ...(step.layers ?? {}) } };
}

const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

/**
 * Turns whatever the view reports for a clicked point into a comment/pin anchor. Prefers the
 * equatorial place (a comment on a star should stay on the star as time moves), else horizontal.
 */
export function anchorFromPick(p: unknown): Anchor | null {
  if (!p || typeof p !== 'object') return null;
  const o = p as Record<string, unknown>;
  const ra = num(o.ra) ?? num(o.raDeg);
  const dec = num(o.dec) ?? num(o.decDeg);
  if (ra !== undefined && dec !== undefined && dec >= -90 && dec <= 90) return { ra: ((ra % 360) + 360) % 360, dec };
  const az = num(o.azimuth) ?? num(o.azDeg) ?? num(o.az);
  const alt = num(o.altitude) ?? num(o.altDeg) ?? num(o.alt);
  if (az !== undefined && alt !== undefined && alt >= -90 && alt <= 90) return { azimuth: ((az % 360) + 360) % 360, altitude: alt };
  return null;
}

/** The point of a pick in a pin's frame: [azimuth, altitude] or [ra, dec]; null when the pick lacks that frame. */
export function pinPointFromPick(p: unknown, frame: Pin['frame']): [number, number] | null {
  if (!p || typeof p !== 'object') return null;
  const o = p as Record<string, unknown>;
  if (frame === 'equatorial') {
    const ra = num(o.ra) ?? num(o.raDeg);
    const dec = num(o.dec) ?? num(o.decDeg);
    return ra !== undefined && dec !== undefined ? [((ra % 360) + 360) % 360, dec] : null;
  }
  const az = num(o.azimuth) ?? num(o.azDeg) ?? num(o.az);
  const alt = num(o.altitude) ?? num(o.altDeg) ?? num(o.alt);
  return az !== undefined && alt !== undefined ? [((az % 360) + 360) % 360, alt] : null;
}

export const MIN_POINTS: Record<Pin['kind'], number> = { label: 1, arrow: 2, arc: 2, region: 3 };

export function describeAnchor(a: Anchor | null | undefined): string {
  if (!a) return '';
  if ('chart' in a) return `${a.target} at ${a.time.slice(11, 16)} UTC on the altitude chart`;
  if ('ra' in a) return `RA ${a.ra.toFixed(2)}°, Dec ${a.dec >= 0 ? '+' : ''}${a.dec.toFixed(2)}°`;
  return `Az ${a.azimuth.toFixed(1)}°, Alt ${a.altitude.toFixed(1)}°`;
}

/** Comment markers for the view: top-level comments with a sky anchor. */
export function commentMarkers(comments: CommentOut[]) {
  return comments
    .filter((c) => !c.parentId && c.anchor)
    .map((c, i) => ({ c, i }))
    .filter(({ c }) => !('chart' in (c.anchor as Anchor)))
    .map(({ c, i }) => ({ id: c.id, label: `#${i + 1} ${c.author.name}`, resolved: c.resolved, ...(c.anchor as Exclude<Anchor, { chart: 'altitude' }>) }));
}

/** Threads: top-level comments in time order, each with its replies. */
export function threads(comments: CommentOut[]): { root: CommentOut; replies: CommentOut[] }[] {
  const byParent = new Map<string, CommentOut[]>();
  for (const c of comments) if (c.parentId) byParent.set(c.parentId, [...(byParent.get(c.parentId) ?? []), c]);
  return comments.filter((c) => !c.parentId).map((root) => ({ root, replies: byParent.get(root.id) ?? [] }));
}

export function moveItem<T>(list: readonly T[], from: number, to: number): T[] {
  if (from < 0 || from >= list.length || to < 0 || to >= list.length || from === to) return [...list];
  const next = [...list];
  const [x] = next.splice(from, 1);
  next.splice(to, 0, x!);
  return next;
}

/** A short random id for targets, pins and steps (unique within a scene). */
export function newId(prefix: string): string {
  const a = new Uint8Array(6);
  crypto.getRandomValues(a);
  return prefix + '-' + Array.from(a, (b) => b.toString(36).padStart(2, '0')).join('').slice(0, 10);
}

/** Formats an instant in a time zone, e.g. "20 Mar 2026, 13:30 MDT". */
export function formatInZone(iso: string, timeZone: string, withZone = true): string {
  try {
    return new Intl.DateTimeFormat('en-GB', {
      timeZone,
      day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit',
      ...(withZone ? { timeZoneName: 'short' } : {}),
    }).format(new Date(iso));
  } catch {
    return iso;
  }
}

/** "YYYY-MM-DDTHH:MM" for a datetime-local input showing UTC, and back. */
export const isoToInputUtc = (iso: string) => new Date(iso).toISOString().slice(0, 16);
export function inputUtcToIso(v: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(v)) return null;
  const d = new Date(v + (v.length === 16 ? ':00' : '') + 'Z');
  return Number.isNaN(d.getTime()) ? null : d.toISOString().replace('.000Z', 'Z');
}

export function timeAgo(iso: string | null | undefined, now = Date.now()): string {
  if (!iso) return 'never';
  const s = Math.round((now - Date.parse(iso)) / 1000);
  if (!Number.isFinite(s)) return '';
  const abs = Math.abs(s);
  const fmt = (n: number, u: string) => (s >= 0 ? `${n} ${u}${n === 1 ? '' : 's'} ago` : `in ${n} ${u}${n === 1 ? '' : 's'}`);
  if (abs < 60) return s >= 0 ? 'just now' : 'in under a minute';
  if (abs < 3600) return fmt(Math.round(abs / 60), 'minute');
  if (abs < 86400) return fmt(Math.round(abs / 3600), 'hour');
  return fmt(Math.round(abs / 86400), 'day');
}
