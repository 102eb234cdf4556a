/**
 * One visual language: the palette is the only source of colour and line pattern for the sky view, its
 * legend, the exported PNG, the landing figure, the handout chart and the thumbnails.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { allInks, BODIES, CIRCLE_KEYS, CIRCLES, dashArray, daylightOf, GRIDS, LABELS, PLAN, PLAN_LINES, SERIES, SURFACE } from '../../../src/lib/style/palette';
import { CHART_LINE_SCALE, chartSvg, type ChartModel } from '../../../src/lib/handout/chart-svg';
import { CIRCLE_STYLES, COLORS, GRID_STYLES } from '../../../src/components/sphere/styles';

/** WCAG 2.1 relative luminance and contrast ratio (W3C, "relative luminance" definition). */
function luminance(hex: string): number {
  const n = parseInt(hex.slice(1), 16);
  const ch = [(n >> 16) & 255, (n >> 8) & 255, n & 255].map((v) => {
    const c = v / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * ch[0]! + 0.7152 * ch[1]! + 0.0722 * ch[2]!;
}
const contrast = (a: string, b: string) => {
  const [x, y] = [luminance(a), luminance(b)].sort((p, q) => q - p);
  return (x! + 0.05) / (y! + 0.05);
};

const chart: ChartModel = {
  frame: { R: 220, cx: 260, cy: 250 },
  size: { width: 520, height: 500 },
  rings: [{ alt: 30, r: 146.67 }, { alt: 60, r: 73.33 }],
  cardinals: [{ label: 'N', x: 260, y: 14 }],
  circles: [
    { name: 'equator', d: 'M100 100L200 200' },
    { name: 'ecliptic', d: 'M100 200L200 100' },
    { name: 'meridian', d: 'M260 30L260 470' },
  ],
  skyline: 'M0 0L10 0L10 10Z',
  minAltitudeR: 180,
  stars: [{ hr: 2491, name: 'Sirius <A&B>', x: 300, y: 300, r: 4, alt: 20, az: 180, mag: -1.46 }],
  bodies: [
    { id: 'sun', label: 'Sun', kind: 'body', x: 100, y: 100, alt: 10, az: 90 },
    { id: 'moon', label: 'Moon', kind: 'body', x: 120, y: 100, alt: 10, az: 80 },
    { id: 'mars', label: 'Mars', kind: 'body', x: 140, y: 100, alt: 10, az: 70 },
  ],
  targets: [{ id: 't1', label: 'Field "7"', kind: 'fixed', x: 200, y: 200, alt: 45, az: 200 }],
};

const attrValues = (svg: string, attr: string) => [...svg.matchAll(new RegExp(` ${attr}="([^"]*)"`, 'g'))].map((m) => m[1]!);

describe('palette', () => {
  it('gives every ring its own colour and its own pattern, on screen and on paper', () => {
    const screens = new Set(CIRCLE_KEYS.map((k) => CIRCLES[k].screen));
    const prints = new Set(CIRCLE_KEYS.map((k) => CIRCLES[k].print));
    const patterns = new Set(CIRCLE_KEYS.map((k) => CIRCLES[k].pattern.join(',')));
    expect(screens.size).toBe(CIRCLE_KEYS.length);
    expect(prints.size).toBe(CIRCLE_KEYS.length);
    expect(patterns.size).toBe(CIRCLE_KEYS.length);
    expect(new Set(SERIES.map((s) => s.pattern.join(','))).size).toBe(SERIES.length);
    for (const k of CIRCLE_KEYS) expect(CIRCLES[k].pattern.length).toBeLessThanOrEqual(8); // the line shader takes 4 on/off pairs
  });

  it('keeps lines and marks legible: 3:1 against the night sky on screen and against white on paper (WCAG 2.1 SC 1.4.11)', () => {
    const lines = [...CIRCLE_KEYS.map((k) => CIRCLES[k]), PLAN_LINES.envelopeFloor, PLAN_LINES.keepOut, ...SERIES, PLAN.target, PLAN.targetOutside, PLAN.pin, PLAN.comment, BODIES.planet, BODIES.sunEdge, LABELS.label, LABELS.labelDim, LABELS.cardinal];
    for (const c of lines) {
      expect(contrast(c.screen, SURFACE.sky.screen), `${c.screen} on the sky`).toBeGreaterThanOrEqual(3);
      expect(contrast(c.print, '#ffffff'), `${c.print} on paper`).toBeGreaterThanOrEqual(3);
    }
  });

  it('names the band of daylight by the USNO thresholds (common practice: −50′, −6°, −12°, −18°)', () => {
    expect(daylightOf(10)).toBe('day');
    expect(daylightOf(-0.5)).toBe('day');
    expect(daylightOf(-1)).toBe('civil');
    expect(daylightOf(-6.01)).toBe('nautical');
    expect(daylightOf(-12.5)).toBe('astronomical');
    expect(daylightOf(-30)).toBe('night');
  });

  it('dash arrays scale and solid lines have none', () => {
    expect(dashArray([14, 7], 0.5)).toBe('7 3.5');
    expect(dashArray([])).toBeUndefined();
  });
});

describe('consumers read the palette', () => {
  const inks = allInks();
  const isInk = (v: string) => v === 'none' || v.startsWith('url(') || inks.has(v.toLowerCase());

  for (const ink of ['print', 'screen'] as const) {
    it(`the chart (${ink}: handout and thumbnails) strokes and fills only palette inks, rings in their own pattern`, () => {
      const svg = chartSvg(chart, { ink, title: 'T & <t>', background: ink === 'screen' });
      const used = [...attrValues(svg, 'stroke'), ...attrValues(svg, 'fill')];
      expect(used.length).toBeGreaterThan(15);
      for (const v of used) expect(isInk(v), v).toBe(true);
      for (const k of ['equator', 'ecliptic', 'meridian'] as const) {
        const m = svg.match(new RegExp(`class="circle circle-${k}"[^>]*stroke="([^"]+)"[^>]*?(?:stroke-dasharray="([^"]+)")?/>`));
        expect(m?.[1]).toBe(CIRCLES[k][ink]);
        expect(m?.[2]).toBe(dashArray(CIRCLES[k].pattern, CHART_LINE_SCALE));
      }
      expect(svg).toContain(`class="horizon" cx="260" cy="250" r="220" fill="${SURFACE.sky[ink]}" stroke="${CIRCLES.horizon[ink]}"`);
      expect(svg).not.toContain('<A&B>'); // names are escaped
    });
  }

  it('the sky view, its legend and the PNG legend take the palette’s screen inks', () => {
    for (const k of CIRCLE_KEYS) {
      expect(CIRCLE_STYLES[k].color).toBe(CIRCLES[k].screen);
      expect(CIRCLE_STYLES[k].pattern).toEqual(CIRCLES[k].pattern);
    }
    for (const k of ['altAzGrid', 'raDecGrid', 'eclipticGrid'] as const) expect(GRID_STYLES[k].color).toBe(GRIDS[k].screen);
    for (const v of Object.values(COLORS)) expect(inks.has(v), v).toBe(true);
  });

  it('writes no colour of its own in the files that draw (landing figure, handout chart, PNG snapshot, legend, overlay)', () => {
    const files = ['src/pages/index.astro', 'src/components/handout/SkyChart.astro', 'src/lib/handout/chart-svg.ts', 'src/components/sphere/snapshot.ts', 'src/components/sphere/panels.tsx', 'src/components/sphere/overlay.ts'];
    for (const f of files) {
      const src = readFileSync(f, 'utf8');
      const hex = [...src.matchAll(/['"`=(\s](#[0-9a-fA-F]{3,8})\b/g)].map((m) => m[1]!.toLowerCase());
      // Text on the page itself (Tailwind classes) is the app's chrome, not the visual code; inline colour literals are not allowed.
      expect(hex.filter((h) => !inks.has(h)), f).toEqual([]);
    }
    expect(readFileSync('src/pages/index.astro', 'utf8')).toMatch(/from '..\/lib\/style\/palette'/);
  });
});

describe('favicon', () => {
  it('public/favicon.svg is the palette drawing, and favicon.ico holds it as 16, 32 and 48 px PNGs (ICONDIR/ICONDIRENTRY layout)', async () => {
    const { faviconSvg } = await import('../../../src/lib/style/favicon');
    expect(readFileSync('public/favicon.svg', 'utf8').trim()).toBe(faviconSvg()); // run `npm run favicon` if this fails
    const ico = readFileSync('public/favicon.ico');
    expect([ico.readUInt16LE(0), ico.readUInt16LE(2), ico.readUInt16LE(4)]).toEqual([0, 1, 3]);
    for (let i = 0; i < 3; i++) {
      const e = 6 + 16 * i;
      const [size, len, off] = [ico.readUInt8(e), ico.readUInt32LE(e + 8), ico.readUInt32LE(e + 12)];
      expect(size).toBe([16, 32, 48][i]);
      expect(ico.subarray(off + 1, off + 4).toString('latin1')).toBe('PNG');
      expect(ico.readUInt32BE(off + 16)).toBe(size); // IHDR width
      expect(off + len).toBeLessThanOrEqual(ico.length);
    }
  });
});
