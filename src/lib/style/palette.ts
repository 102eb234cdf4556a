/**
 * Armilla's one visual language: the colour and line pattern of every element of the sky, the plan and
 * the charts, in one place. Read by the sky view (rings, grids, bodies, labels), its legend, the exported
 * PNG, the landing page's figure, the printed handout's chart, the dashboard thumbnails and the night
 * charts. Pure data + two helpers: no DOM, React, three or Astro.
 *
 * Each entry has two inks of one hue: `screen` for the dark sky background, `print` (darker, same hue)
 * for white paper. A ring is told apart by its pattern as well as its colour, so the code reads in
 * greyscale and for colour-blind viewers: solid horizon, long-dashed equator, dash-dot ecliptic, dotted
 * meridian, dash-dot-dot prime vertical, short-dashed galactic equator. Patterns are [on, off, ...]
 * lengths in CSS pixels at 1×; scale them with `dashArray(pattern, scale)`.
 *
 * These values are Armilla's own (chosen for contrast on #05070d and on white); they copy no other
 * program's colour code.
 */

export interface Ink {
  /** On the dark sky and the app's dark panels. */
  screen: string;
  /** On white paper (handout, print charts): the same hue, darker. */
  print: string;
}

export interface LineCode extends Ink {
  label: string;
  widthPx: number;
  /** [on, off, on, off, ...] in CSS pixels; empty = solid. At most 4 pairs (the sky view's shader limit). */
  pattern: number[];
  patternName: string;
  /** The colour in words, for captions and text alternatives. */
  hue: string;
}

export type CircleKey = 'horizon' | 'equator' | 'ecliptic' | 'meridian' | 'primeVertical' | 'galactic';
export type GridKey = 'altAzGrid' | 'raDecGrid' | 'eclipticGrid';

/** The great circles. */
export const CIRCLES: Record<CircleKey, LineCode> = {
  horizon: { label: 'Horizon', screen: '#e9c46a', print: '#8a6410', widthPx: 2.6, pattern: [], patternName: 'solid', hue: 'gold' },
  equator: { label: 'Celestial equator', screen: '#4cc9f0', print: '#0a6e93', widthPx: 2.2, pattern: [14, 7], patternName: 'long dashes', hue: 'sky blue' },
  ecliptic: { label: 'Ecliptic', screen: '#f4845f', print: '#b4431c', widthPx: 2.2, pattern: [12, 5, 2.5, 5], patternName: 'dash-dot', hue: 'coral' },
  meridian: { label: 'Local meridian', screen: '#b8a1ff', print: '#5b3fc4', widthPx: 2.2, pattern: [2.5, 5], patternName: 'dotted', hue: 'violet' },
  primeVertical: { label: 'Prime vertical', screen: '#57cc99', print: '#17774c', widthPx: 2.2, pattern: [12, 4, 2.5, 4, 2.5, 4], patternName: 'dash-dot-dot', hue: 'green' },
  galactic: { label: 'Galactic equator', screen: '#ff70a6', print: '#b0255c', widthPx: 2.2, pattern: [6, 6], patternName: 'short dashes', hue: 'pink' },
};

export const CIRCLE_KEYS = Object.keys(CIRCLES) as CircleKey[];

/** Coordinate grids: thin, translucent, the hue of the circle they are built on. */
export const GRIDS: Record<GridKey, Ink & { label: string; opacity: number }> = {
  altAzGrid: { label: 'Alt-az grid', screen: '#c8b27a', print: '#b9a57a', opacity: 0.32 },
  raDecGrid: { label: 'RA/Dec grid (J2000)', screen: '#6fb3d9', print: '#8cb9d4', opacity: 0.32 },
  eclipticGrid: { label: 'Ecliptic grid', screen: '#e39a7b', print: '#d9a590', opacity: 0.3 },
};

/** Sun, Moon, planets and stars. */
export const BODIES = {
  sun: { screen: '#ffd166', print: '#e0a100' },
  sunEdge: { screen: '#ff4d4d', print: '#b3261e' },
  moon: { screen: '#e8e6df', print: '#d6d3cc' },
  moonDark: { screen: '#2a2d33', print: '#4a4d55' },
  planet: { screen: '#f9e2ae', print: '#8a5a00' },
  star: { screen: '#f4f6fb', print: '#111827' },
} as const satisfies Record<string, Ink>;

/** Planet tints in the sky view (screen only: on paper every planet is the `planet` diamond). */
export const PLANET_TINTS: Record<string, string> = {
  mercury: '#d9c8b4', venus: '#fff4d6', mars: '#ff9f80', jupiter: '#f3deb8', saturn: '#ead9a4', uranus: '#b9f1ef', neptune: '#9fb8ff',
};

/** The plan: targets, the pointing envelope, the horizon mask, keep-out rings, pins and comments. */
export const PLAN = {
  target: { screen: '#7df9ff', print: '#0e6f7a' },
  targetOutside: { screen: '#ff8fa3', print: '#b3264a' },
  forbidden: { screen: '#ff3b5c', print: '#c81e3c' },
  mask: { screen: '#2d2218', print: '#a8a29e' },
  maskEdge: { screen: '#c08552', print: '#6b4a2b' },
  sunKeepOut: { screen: '#ff4d4d', print: '#b3261e' },
  moonKeepOut: { screen: '#a0a8ff', print: '#4550b8' },
  pin: { screen: '#ffe066', print: '#8a6d00' },
  comment: { screen: '#ffb703', print: '#a86b00' },
} as const satisfies Record<string, Ink>;

/** Lines of the plan that carry a pattern. */
export const PLAN_LINES: Record<'envelopeFloor' | 'keepOut' | 'altitudeRing', LineCode> = {
  envelopeFloor: { label: 'Envelope floor', screen: PLAN.forbidden.screen, print: PLAN.forbidden.print, widthPx: 1.8, pattern: [8, 5], patternName: 'dashes', hue: 'red' },
  keepOut: { label: 'Sun / Moon keep-out', screen: PLAN.sunKeepOut.screen, print: PLAN.sunKeepOut.print, widthPx: 2.2, pattern: [8, 5], patternName: 'dashes', hue: 'red' },
  altitudeRing: { label: 'Altitude ring', screen: '#64748b', print: '#c4c9d2', widthPx: 0.8, pattern: [3, 3], patternName: 'fine dashes', hue: 'grey' },
};

/** Names and marks on the sky. */
export const LABELS = {
  label: { screen: '#e6edf7', print: '#111827' },
  labelDim: { screen: '#93a1b5', print: '#4b5563' },
  cardinal: { screen: '#ffe8a3', print: '#111827' },
  referencePoint: { screen: '#f1f5f9', print: '#374151' },
  axis: { screen: '#dfe6f2', print: '#374151' },
} as const satisfies Record<string, Ink>;

/** Surfaces: the sky background at night, the ground, and the caption/legend panel of the exported PNG. */
export const SURFACE = {
  sky: { screen: '#05070d', print: '#ffffff' },
  groundObserver: { screen: '#141a12', print: '#e7e5e4' },
  groundSphere: { screen: '#3b4a2c', print: '#d6d3d1' },
  panel: { screen: '#0b1020', print: '#ffffff' },
  text: { screen: '#e6edf7', print: '#111827' },
  textMuted: { screen: '#b9c4d6', print: '#374151' },
  caution: { screen: '#b3261e', print: '#b3261e' },
  onCaution: { screen: '#ffffff', print: '#ffffff' },
} as const satisfies Record<string, Ink>;

/**
 * The sky by the Sun's altitude (USNO thresholds: the upper limb on the horizon at −50′, then −6°, −12°,
 * −18°): backgrounds of the sky view, bands of the night charts.
 */
export const DAYLIGHT = {
  day: { label: 'Day', screen: '#1d3557', print: '#dbeafe', minSunAltDeg: -50 / 60 },
  civil: { label: 'Civil twilight', screen: '#142640', print: '#bfdbfe', minSunAltDeg: -6 },
  nautical: { label: 'Nautical twilight', screen: '#0c1529', print: '#93c5fd', minSunAltDeg: -12 },
  astronomical: { label: 'Astronomical twilight', screen: '#080d1a', print: '#60a5fa', minSunAltDeg: -18 },
  night: { label: 'Night', screen: '#05070d', print: '#3b5b8c', minSunAltDeg: -90 },
} as const;

export type DaylightKey = keyof typeof DAYLIGHT;

/** Which band of DAYLIGHT a Sun altitude falls in. */
export function daylightOf(sunAltDeg: number): DaylightKey {
  if (sunAltDeg > DAYLIGHT.day.minSunAltDeg) return 'day';
  if (sunAltDeg > DAYLIGHT.civil.minSunAltDeg) return 'civil';
  if (sunAltDeg > DAYLIGHT.nautical.minSunAltDeg) return 'nautical';
  if (sunAltDeg > DAYLIGHT.astronomical.minSunAltDeg) return 'astronomical';
  return 'night';
}

/**
 * Series for charts with one curve per target (altitude against time, coverage): colour AND pattern, so
 * curves stay apart in greyscale. Cycles after eight; the Sun and Moon use BODIES, never a series.
 */
export const SERIES: LineCode[] = [
  { label: 'Series 1', screen: '#7df9ff', print: '#0e6f7a', widthPx: 2, pattern: [], patternName: 'solid', hue: 'cyan' },
  { label: 'Series 2', screen: '#c3a6ff', print: '#5b3fc4', widthPx: 2, pattern: [10, 4], patternName: 'dashes', hue: 'lavender' },
  { label: 'Series 3', screen: '#8ee88e', print: '#1f7a1f', widthPx: 2, pattern: [2, 4], patternName: 'dots', hue: 'green' },
  { label: 'Series 4', screen: '#ffb870', print: '#a4520a', widthPx: 2, pattern: [10, 3, 2, 3], patternName: 'dash-dot', hue: 'orange' },
  { label: 'Series 5', screen: '#ff8fc8', print: '#a3226a', widthPx: 2, pattern: [16, 5], patternName: 'long dashes', hue: 'pink' },
  { label: 'Series 6', screen: '#e8e36a', print: '#6e6a00', widthPx: 2, pattern: [6, 3, 2, 3, 2, 3], patternName: 'dash-dot-dot', hue: 'yellow' },
  { label: 'Series 7', screen: '#7fb2ff', print: '#1d4ed8', widthPx: 2, pattern: [4, 4], patternName: 'short dashes', hue: 'blue' },
  { label: 'Series 8', screen: '#f2f2f2', print: '#374151', widthPx: 2, pattern: [12, 3, 12, 8], patternName: 'paired dashes', hue: 'white' },
];

export const seriesAt = (i: number): LineCode => SERIES[((i % SERIES.length) + SERIES.length) % SERIES.length]!;

/** SVG / canvas dash array for a pattern at `scale` (undefined for solid, as SVG wants no attribute then). */
export function dashArray(pattern: readonly number[], scale = 1): string | undefined {
  return pattern.length ? pattern.map((p) => Math.round(p * scale * 100) / 100).join(' ') : undefined;
}

/** Every colour the palette defines (screen and print), for tests and for mapping the whole code at once. */
export function allInks(): Set<string> {
  const out = new Set<string>();
  const add = (v: unknown) => {
    if (typeof v === 'string' && v.startsWith('#')) out.add(v.toLowerCase());
    else if (v && typeof v === 'object') for (const x of Object.values(v)) add(x);
  };
  for (const group of [CIRCLES, GRIDS, BODIES, PLANET_TINTS, PLAN, PLAN_LINES, LABELS, SURFACE, DAYLIGHT, SERIES]) add(group);
  return out;
}
