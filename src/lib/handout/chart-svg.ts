/**
 * The all-sky chart as an SVG string: zenithal equidistant, north up, east LEFT (as seen looking up).
 * One drawing for two uses: the printed handout (`ink: 'print'`, on white paper) and the scene thumbnails
 * (`ink: 'screen'`, the dark sky; rasterised on the server, see src/lib/server/thumbnails/README.md). Every
 * colour and line pattern comes from the palette (src/lib/style/palette.ts).
 *
 * Every mark carries data-alt / data-az so a reader (or a test) can check it against the projection
 * r = (90° − alt) / 90° × R printed in data-r on the <svg>. Pure: a chart model in, a string out.
 */
import { BODIES, CIRCLES, dashArray, LABELS, PLAN, PLAN_LINES, SURFACE, type Ink, type LineCode } from '../style/palette';
import type { HandoutModel } from './handout';

export type ChartModel = HandoutModel['chart'];

export interface ChartSvgOptions {
  ink: 'print' | 'screen';
  /** Accessible title (the handout's scene title). */
  title: string;
  /** id of the <svg> (and prefix of its inner ids): two charts on one page need two. */
  id?: string;
  /** Star names, body and target names, the footer line (false for a thumbnail). Default true. */
  labels?: boolean;
  /** Width and height attributes (thumbnails are rasterised at this size); default: none, viewBox only. */
  width?: number;
  height?: number;
  /** Fill of the whole picture (thumbnails); default none. */
  background?: boolean;
  /** Part of the chart to show, [x, y, w, h] in chart units; default the whole chart. */
  viewBox?: [number, number, number, number];
  /** Star dots drawn this much larger (a small thumbnail); default 1. */
  starScale?: number;
  /** Width and pattern scale of the rings against the sky view's CSS px; default CHART_LINE_SCALE. */
  lineScale?: number;
  /** Fill of the sky disc (a palette ink: the daylight band of the scene's time); default the night sky. */
  skyFill?: string;
}

/** The chart's lines are drawn at about half the sky view's widths: patterns scale with them. */
export const CHART_LINE_SCALE = 0.5;

const f2 = (n: number) => Math.round(n * 100) / 100;

export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** stroke, stroke-width and stroke-dasharray attributes of a line code. */
export function strokeAttrs(c: LineCode, ink: 'print' | 'screen', scale = CHART_LINE_SCALE): string {
  const dash = dashArray(c.pattern, scale);
  return `stroke="${c[ink]}" stroke-width="${f2(c.widthPx * scale)}"${dash ? ` stroke-dasharray="${dash}"` : ''}`;
}

export function chartSvg(chart: ChartModel, opts: ChartSvgOptions): string {
  const ink = opts.ink;
  const k = (c: Ink) => c[ink];
  const id = opts.id ?? 'sky-chart';
  const labels = opts.labels ?? true;
  const { frame, size } = chart;
  const o: string[] = [];
  const sizeAttrs = opts.width && opts.height ? ` width="${opts.width}" height="${opts.height}"` : '';
  const vb = opts.viewBox ?? [0, 0, size.width, size.height];
  const starScale = opts.starScale ?? 1;
  const ls = opts.lineScale ?? CHART_LINE_SCALE;
  o.push(
    `<svg id="${id}" xmlns="http://www.w3.org/2000/svg" viewBox="${vb.join(' ')}"${sizeAttrs} data-r="${frame.R}" data-cx="${frame.cx}" data-cy="${frame.cy}" role="img" aria-labelledby="${id}-title ${id}-desc">`,
    `<title id="${id}-title">All-sky chart: ${escapeXml(opts.title)}</title>`,
    `<desc id="${id}-desc">Zenithal equidistant projection of the sky above the site. Zenith at the centre, horizon on the outer circle, north up and east to the left, as seen lying down looking up. Rings at 30° and 60° altitude.</desc>`,
    `<defs><clipPath id="${id}-clip"><circle cx="${frame.cx}" cy="${frame.cy}" r="${frame.R}"/></clipPath></defs>`,
  );
  if (opts.background) o.push(`<rect x="${vb[0]}" y="${vb[1]}" width="${vb[2]}" height="${vb[3]}" fill="${k(SURFACE.panel)}"/>`);
  o.push(`<circle class="horizon" cx="${frame.cx}" cy="${frame.cy}" r="${frame.R}" fill="${opts.skyFill ?? k(SURFACE.sky)}" ${strokeAttrs(CIRCLES.horizon, ink, ls)}/>`);
  for (const r of chart.rings) {
    o.push(`<g class="ring"><circle cx="${frame.cx}" cy="${frame.cy}" r="${r.r}" fill="none" ${strokeAttrs(PLAN_LINES.altitudeRing, ink, 1)}/>`);
    if (labels) o.push(`<text x="${frame.cx + 3}" y="${f2(frame.cy - r.r - 2)}" font-size="8" fill="${k(LABELS.labelDim)}">${r.alt}°</text>`);
    o.push('</g>');
  }
  if (chart.skyline) o.push(`<path class="skyline" d="${chart.skyline}" fill="${k(PLAN.mask)}" fill-opacity="0.55" fill-rule="evenodd" stroke="${k(PLAN.maskEdge)}" stroke-width="0.6"/>`);
  if (chart.minAltitudeR !== null) {
    o.push(`<circle class="envelope-floor" cx="${frame.cx}" cy="${frame.cy}" r="${chart.minAltitudeR}" fill="none" ${strokeAttrs(PLAN_LINES.envelopeFloor, ink, ls)}/>`);
  }
  o.push(`<g clip-path="url(#${id}-clip)">`);
  for (const c of chart.circles) o.push(`<path class="circle circle-${c.name}" d="${c.d}" fill="none" ${strokeAttrs(CIRCLES[c.name], ink, ls)}/>`);
  o.push('</g>');
  o.push('<g class="stars">');
  for (const s of chart.stars) {
    o.push(
      `<circle class="star" cx="${s.x}" cy="${s.y}" r="${f2(s.r * starScale)}" fill="${k(BODIES.star)}" data-hr="${s.hr}"${s.name ? ` data-name="${escapeXml(s.name)}"` : ''} data-alt="${s.alt.toFixed(4)}" data-az="${s.az.toFixed(4)}"/>`,
    );
  }
  if (labels) {
    for (const s of chart.stars) {
      if (s.name && s.mag <= 1.6) o.push(`<text x="${f2(s.x + s.r + 2)}" y="${f2(s.y + 3)}" font-size="8" fill="${k(LABELS.labelDim)}">${escapeXml(s.name)}</text>`);
    }
  }
  o.push('</g><g class="bodies">');
  for (const b of chart.bodies) {
    const data = `data-alt="${b.alt.toFixed(4)}" data-az="${b.az.toFixed(4)}"`;
    if (b.id === 'sun') {
      o.push(
        `<g class="body body-sun" ${data}><circle cx="${b.x}" cy="${b.y}" r="7" fill="${k(BODIES.sun)}" stroke="${k(BODIES.sunEdge)}" stroke-width="1.5"/><circle cx="${b.x}" cy="${b.y}" r="1.5" fill="${k(BODIES.sunEdge)}"/>` +
          (labels ? `<text x="${b.x + 9}" y="${b.y + 3}" font-size="9" font-weight="700" fill="${k(BODIES.sunEdge)}">Sun</text>` : '') +
          '</g>',
      );
    } else if (b.id === 'moon') {
      o.push(
        `<g class="body body-moon" ${data}><circle cx="${b.x}" cy="${b.y}" r="6" fill="${k(BODIES.moon)}" stroke="${k(BODIES.moonDark)}" stroke-width="1"/>` +
          (labels ? `<text x="${b.x + 8}" y="${b.y + 3}" font-size="9" fill="${k(LABELS.label)}">Moon</text>` : '') +
          '</g>',
      );
    } else {
      o.push(
        `<g class="body body-${b.id}" ${data}><path d="M${b.x} ${b.y - 4}L${b.x + 4} ${b.y}L${b.x} ${b.y + 4}L${b.x - 4} ${b.y}Z" fill="${k(BODIES.planet)}"/>` +
          (labels ? `<text x="${b.x + 6}" y="${b.y + 3}" font-size="8" fill="${k(BODIES.planet)}">${escapeXml(b.label)}</text>` : '') +
          '</g>',
      );
    }
  }
  o.push('</g><g class="targets">');
  for (const t of chart.targets) {
    const c = k(PLAN.target);
    o.push(
      `<g class="target-mark"><circle class="target" cx="${t.x}" cy="${t.y}" r="5" fill="none" stroke="${c}" stroke-width="1.4" data-name="${escapeXml(t.label)}" data-alt="${t.alt.toFixed(4)}" data-az="${t.az.toFixed(4)}"/>` +
        `<line x1="${t.x - 8}" y1="${t.y}" x2="${t.x - 5}" y2="${t.y}" stroke="${c}" stroke-width="1.2"/><line x1="${t.x + 5}" y1="${t.y}" x2="${t.x + 8}" y2="${t.y}" stroke="${c}" stroke-width="1.2"/>` +
        (labels ? `<text x="${t.x + 9}" y="${t.y - 5}" font-size="8.5" fill="${c}">${escapeXml(t.label)}</text>` : '') +
        '</g>',
    );
  }
  o.push('</g>');
  for (const c of labels ? chart.cardinals : []) {
    o.push(`<text class="cardinal" x="${c.x}" y="${c.y + 5}" text-anchor="middle" font-size="15" font-weight="700" fill="${k(LABELS.cardinal)}">${c.label}</text>`);
  }
  if (labels) {
    o.push(`<text x="6" y="${size.height - 8}" font-size="9" fill="${k(LABELS.labelDim)}">North up · east LEFT (as seen looking up) · zenith at centre · horizon = outer circle</text>`);
  }
  o.push('</svg>');
  return o.join('');
}
