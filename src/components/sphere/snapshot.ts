/**
 * PNG snapshot: the WebGL frame and the label overlay composited on a 2D canvas, with a caption (scene,
 * site, time in the zone and UTC, sidereal time, view) and the legend of what is shown, line patterns included.
 */
import type { Layers } from '../../lib/contracts/scene-doc';
import { CIRCLE_KEYS, CIRCLE_STYLES, GRID_STYLES } from './styles';
import { LABELS, SURFACE } from '../../lib/style/palette';

export interface SnapshotCaption {
  title: string;
  site: string;
  local: string;
  utc: string;
  lst: string;
  view: string;
}

function loadImage(src: string): Promise<HTMLImageElement> {
  return new Promise((res, rej) => {
    const im = new Image();
    im.onload = () => res(im);
    im.onerror = () => rej(new Error('snapshot image failed to load'));
    im.src = src;
  });
}

export async function composeSnapshot(glDataUrl: string, overlay: HTMLCanvasElement | null, caption: SnapshotCaption, layers: Required<Layers>, sunUp: boolean): Promise<string> {
  const img = await loadImage(glDataUrl);
  const W = img.width, H = img.height;
  const scale = Math.max(1, W / 1280);
  const legendW = Math.round(320 * scale);
  const headH = Math.round(64 * scale);
  const c = document.createElement('canvas');
  c.width = W + legendW;
  c.height = H + headH;
  const ctx = c.getContext('2d');
  if (!ctx) throw new Error('2D canvas unavailable');
  ctx.fillStyle = SURFACE.panel.screen;
  ctx.fillRect(0, 0, c.width, c.height);
  ctx.drawImage(img, 0, headH);
  if (overlay && overlay.width) ctx.drawImage(overlay, 0, headH, W, H);
  const f = (px: number, w = 400) => `${w} ${Math.round(px * scale)}px "Space Grotesk", system-ui, sans-serif`;
  ctx.fillStyle = SURFACE.text.screen;
  ctx.textBaseline = 'top';
  ctx.font = f(18, 700);
  ctx.fillText(`${caption.title} — ${caption.view}`, 14 * scale, 10 * scale);
  ctx.font = f(13);
  ctx.fillStyle = SURFACE.textMuted.screen;
  ctx.fillText(`${caption.site}   ·   ${caption.local}   ·   ${caption.utc}   ·   LST ${caption.lst}`, 14 * scale, 36 * scale);
  // Legend.
  let y = headH + 14 * scale;
  const x0 = W + 14 * scale;
  ctx.font = f(14, 700);
  ctx.fillStyle = SURFACE.text.screen;
  ctx.fillText('Legend', x0, y);
  y += 24 * scale;
  ctx.font = f(12);
  for (const k of CIRCLE_KEYS) {
    if (!layers[k]) continue;
    const st = CIRCLE_STYLES[k];
    ctx.strokeStyle = st.color;
    ctx.lineWidth = st.widthPx * scale;
    ctx.setLineDash(st.pattern.map((p) => p * scale));
    ctx.beginPath();
    ctx.moveTo(x0, y + 7 * scale);
    ctx.lineTo(x0 + 46 * scale, y + 7 * scale);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.fillStyle = SURFACE.text.screen;
    ctx.fillText(`${st.label} (${st.patternName})`, x0 + 54 * scale, y);
    y += 20 * scale;
  }
  for (const k of ['altAzGrid', 'raDecGrid', 'eclipticGrid'] as const) {
    if (!layers[k]) continue;
    ctx.strokeStyle = GRID_STYLES[k].color;
    ctx.lineWidth = 1;
    ctx.beginPath();
    ctx.moveTo(x0, y + 7 * scale);
    ctx.lineTo(x0 + 46 * scale, y + 7 * scale);
    ctx.stroke();
    ctx.fillStyle = SURFACE.text.screen;
    ctx.fillText(GRID_STYLES[k].label, x0 + 54 * scale, y);
    y += 20 * scale;
  }
  const others: string[] = [];
  if (layers.stars) others.push(`Stars to magnitude ${layers.limitingMagnitude.toFixed(1)}`);
  if (layers.bodies) others.push('Sun, Moon (lit as its phase), planets');
  if (layers.envelope) others.push('Red tint: outside the pointing envelope');
  if (layers.targets) others.push('Rings: targets');
  for (const o of others) {
    ctx.fillText(o, x0, y);
    y += 18 * scale;
  }
  y += 10 * scale;
  ctx.fillStyle = LABELS.labelDim.screen;
  ctx.font = f(11);
  for (const line of ['Computed positions and times are for planning;', 'local rules and instrument interlocks', 'take precedence.']) {
    ctx.fillText(line, x0, y);
    y += 15 * scale;
  }
  if (sunUp) {
    y += 8 * scale;
    ctx.fillStyle = SURFACE.caution.screen;
    ctx.fillRect(x0 - 4 * scale, y - 4 * scale, legendW - 20 * scale, 58 * scale);
    ctx.fillStyle = SURFACE.onCaution.screen;
    ctx.font = f(11, 700);
    for (const line of ['Never point optics at the Sun', 'without a certified full-aperture', 'solar filter.']) {
      ctx.fillText(line, x0, y);
      y += 16 * scale;
    }
  }
  return c.toDataURL('image/png');
}
