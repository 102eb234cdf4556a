/**
 * Sky thumbnails made on the server: a real picture of the scene's sky (the chart at its time and site),
 * small, in the palette's inks, cached by version.
 */
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { renderPng, skyThumbnail, THUMB_PX, thumbnailKey, thumbnailSvg } from '../../../../src/lib/server/thumbnails/render.server';
import { CHART } from '../../../../src/lib/handout/handout';
import { DAYLIGHT, PLAN } from '../../../../src/lib/style/palette';
import { e1Scene } from '../../exports/fixtures';

const rgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
function pixels(svg: string) {
  const img = new Resvg(svg, { fitTo: { mode: 'width', value: THUMB_PX }, font: { loadSystemFonts: false } }).render();
  return { w: img.width, h: img.height, px: img.pixels };
}
/** The most common colour inside the inner 80 % of the sky disc: the sky's fill. */
function skyColour(svg: string): number[] {
  const { w, h, px } = pixels(svg);
  const counts = new Map<string, number>();
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      if (Math.hypot(x - w / 2, y - h / 2) > 0.4 * w) continue;
      const k = `${px[(y * w + x) * 4]},${px[(y * w + x) * 4 + 1]},${px[(y * w + x) * 4 + 2]}`;
      counts.set(k, (counts.get(k) ?? 0) + 1);
    }
  return [...counts.entries()].sort((a, b) => b[1] - a[1])[0]![0].split(',').map(Number);
}

describe('sky thumbnail', () => {
  it('is a small PNG (well inside 2048 × 2048)', () => {
    const png = renderPng(thumbnailSvg(e1Scene()));
    expect([...png.slice(1, 4)].map((c) => String.fromCharCode(c)).join('')).toBe('PNG');
    const dv = new DataView(png.buffer, png.byteOffset);
    expect([dv.getUint32(16), dv.getUint32(20)]).toEqual([THUMB_PX, THUMB_PX]);
    expect(png.length).toBeLessThan(64 * 1024);
  });

  it('tints the sky by the Sun: night at 22:00 UTC in January at φ 51.5°, day at 12:00 UTC (Sun ≈ 18° up; common practice)', () => {
    expect(skyColour(thumbnailSvg(e1Scene()))).toEqual(rgb(DAYLIGHT.night.screen));
    expect(skyColour(thumbnailSvg(e1Scene({ time: '2024-01-15T12:00:00Z' })))).toEqual(rgb(DAYLIGHT.day.screen));
  });

  it('draws the target ring where Sirius is (E1: alt 20.279789°, A 162.938748°, ERFA atco13)', () => {
    const { w, px } = pixels(thumbnailSvg(e1Scene()));
    // Chart: r = (90 − alt)/90 · R, x = cx − r sin A, y = cy − r cos A; the thumbnail shows [cx − R − 6, cx + R + 6].
    const r = ((90 - 20.279789) / 90) * CHART.R;
    const A = (162.938748 * Math.PI) / 180;
    const s = THUMB_PX / (2 * (CHART.R + 6));
    const tx = (CHART.cx - r * Math.sin(A) - (CHART.cx - CHART.R - 6)) * s;
    const ty = (CHART.cy - r * Math.cos(A) - (CHART.cy - CHART.R - 6)) * s;
    const want = rgb(PLAN.target.screen);
    let best = Infinity;
    for (let y = Math.floor(ty - 4); y <= ty + 4; y++)
      for (let x = Math.floor(tx - 4); x <= tx + 4; x++) {
        const i = (y * w + x) * 4;
        best = Math.min(best, Math.abs(px[i]! - want[0]!) + Math.abs(px[i + 1]! - want[1]!) + Math.abs(px[i + 2]! - want[2]!));
      }
    expect(best).toBeLessThan(120); // an anti-aliased ring pixel of the target's cyan
    // And nowhere near the opposite side of the chart.
    const ox = THUMB_PX - tx, oy = THUMB_PX - ty;
    const i = (Math.round(oy) * w + Math.round(ox)) * 4;
    expect(Math.abs(px[i]! - want[0]!) + Math.abs(px[i + 1]! - want[1]!) + Math.abs(px[i + 2]! - want[2]!)).toBeGreaterThan(200);
  });

  it('is made again when the scene changes, and taken from the cache when it does not', () => {
    const a = skyThumbnail(e1Scene());
    expect(skyThumbnail(e1Scene()).png).toBe(a.png); // the same bytes object: cached
    const b = skyThumbnail(e1Scene({ version: 2, updatedAt: '2024-01-02T00:00:00.000Z', time: '2024-01-16T03:00:00Z' }));
    expect(b.etag).not.toBe(a.etag);
    expect(Buffer.from(b.png).equals(Buffer.from(a.png))).toBe(false);
    expect(thumbnailKey(e1Scene({ envelope: { name: 'E', minAltitude: 20 } }))).not.toBe(thumbnailKey(e1Scene()));
  });
});
