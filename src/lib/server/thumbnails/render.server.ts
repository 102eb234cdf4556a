/**
 * Sky thumbnails made on the server: the scene's all-sky chart at its time and site (the handout's chart,
 * drawn by chartSvg in the palette's screen inks, the sky disc tinted by the Sun's altitude) rasterised
 * to a small PNG by resvg. Made on the first request after a scene changes and kept in memory, keyed by
 * the scene's version; see README.md in this folder for why.
 */
import { createHash } from 'node:crypto';
import { Resvg } from '@resvg/resvg-js';
import type { SceneOut } from '../../contracts/scene';
import { buildChart } from '../../handout/handout';
import { chartSvg } from '../../handout/chart-svg';
import { DAYLIGHT, daylightOf } from '../../style/palette';

/** Edge of the square thumbnail, px: 2× the dashboard's 80 CSS px tile, so it stays sharp on a HiDPI screen. */
export const THUMB_PX = 160;
/** Fainter stars would fill a small picture. */
const THUMB_STAR_LIMIT = 3.5;
/** Bumped when the drawing changes, so ETags of old drawings stop matching. */
const DRAWING = 'sky-thumb-2';

/** The thumbnail as SVG: the horizon disc and a small margin, no text (unreadable at this size). */
export function thumbnailSvg(scene: SceneOut): string {
  const { model, places } = buildChart(scene);
  const on = (k: string) => (scene.layers as Record<string, unknown> | undefined)?.[k] !== false;
  const chart = {
    ...model,
    circles: model.circles.filter((c) => on(c.name)),
    stars: on('stars') ? model.stars.filter((s) => s.mag <= THUMB_STAR_LIMIT) : [],
    bodies: on('bodies') ? model.bodies : [],
    targets: on('targets') ? model.targets : [],
  };
  const { R, cx, cy } = model.frame;
  const m = 6;
  return chartSvg(chart, {
    ink: 'screen',
    title: scene.title,
    id: 'thumb',
    labels: false,
    background: true,
    width: THUMB_PX,
    height: THUMB_PX,
    viewBox: [cx - R - m, cy - R - m, 2 * (R + m), 2 * (R + m)],
    starScale: 1.2,
    lineScale: 1.6,
    skyFill: DAYLIGHT[daylightOf(places.sun.altDeg)].screen,
  });
}

export function renderPng(svg: string): Uint8Array {
  // No text is drawn, so no fonts are loaded (loading the system's fonts costs ~100 ms per call).
  const r = new Resvg(svg, { fitTo: { mode: 'width', value: THUMB_PX }, font: { loadSystemFonts: false }, shapeRendering: 2 });
  return r.render().asPng();
}

/** What a thumbnail depends on: the scene's id, version and last change (a team envelope's in-place edit included). */
export function thumbnailKey(scene: Pick<SceneOut, 'id' | 'version' | 'updatedAt' | 'envelope'>): string {
  const env = scene.envelope ? createHash('sha1').update(JSON.stringify(scene.envelope)).digest('base64url').slice(0, 12) : '';
  return `${DRAWING}:${scene.id}:${scene.version}:${scene.updatedAt}:${env}`;
}

export const thumbnailEtag = (key: string) => `"t-${createHash('sha256').update(key).digest('base64url').slice(0, 22)}"`;

/** Made thumbnails by scene id, each with the key it was made for; at most CACHE_BYTES of PNG. */
const CACHE_BYTES = 8 * 1024 * 1024;
const cache = new Map<string, { key: string; png: Uint8Array }>();
let cachedBytes = 0;

export function cachedThumbnail(id: string, key: string): Uint8Array | null {
  const hit = cache.get(id);
  if (!hit || hit.key !== key) return null;
  cache.delete(id);
  cache.set(id, hit); // most recently used last
  return hit.png;
}

function remember(id: string, key: string, png: Uint8Array) {
  const old = cache.get(id);
  if (old) {
    cachedBytes -= old.png.length;
    cache.delete(id);
  }
  while (cachedBytes + png.length > CACHE_BYTES && cache.size) {
    const [first, v] = cache.entries().next().value!;
    cache.delete(first);
    cachedBytes -= v.png.length;
  }
  cache.set(id, { key, png });
  cachedBytes += png.length;
}

/** The scene's sky thumbnail as PNG bytes, made now or taken from the cache. */
export function skyThumbnail(scene: SceneOut): { png: Uint8Array; etag: string } {
  const key = thumbnailKey(scene);
  let png = cachedThumbnail(scene.id, key);
  if (!png) {
    png = renderPng(thumbnailSvg(scene));
    remember(scene.id, key, png);
  }
  return { png, etag: thumbnailEtag(key) };
}
