/**
 * Armilla's own look for the sphere: each great circle has a colour AND a line pattern, so the rings
 * read in greyscale and for colour-blind viewers. Patterns are on/off lengths in CSS pixels.
 */
import type { LayerKey } from '../../lib/contracts/scene-doc';

export type CircleKey = 'horizon' | 'equator' | 'ecliptic' | 'meridian' | 'primeVertical' | 'galactic';

export interface LineStyle {
  label: string;
  color: string;
  widthPx: number;
  /** [on, off, on, off, ...] in CSS pixels; empty = solid. At most 4 pairs. */
  pattern: number[];
  patternName: string;
}

export const CIRCLE_STYLES: Record<CircleKey, LineStyle> = {
  horizon: { label: 'Horizon', color: '#e9c46a', widthPx: 2.6, pattern: [], patternName: 'solid' },
  equator: { label: 'Celestial equator', color: '#4cc9f0', widthPx: 2.2, pattern: [14, 7], patternName: 'long dashes' },
  ecliptic: { label: 'Ecliptic', color: '#f4845f', widthPx: 2.2, pattern: [12, 5, 2.5, 5], patternName: 'dash-dot' },
  meridian: { label: 'Local meridian', color: '#b8a1ff', widthPx: 2.2, pattern: [2.5, 5], patternName: 'dotted' },
  primeVertical: { label: 'Prime vertical', color: '#57cc99', widthPx: 2.2, pattern: [12, 4, 2.5, 4, 2.5, 4], patternName: 'dash-dot-dot' },
  galactic: { label: 'Galactic equator', color: '#ff70a6', widthPx: 2.2, pattern: [6, 6], patternName: 'short dashes' },
};

export const CIRCLE_KEYS = Object.keys(CIRCLE_STYLES) as CircleKey[];

export const GRID_STYLES = {
  altAzGrid: { label: 'Alt-az grid', color: '#c8b27a', opacity: 0.32 },
  raDecGrid: { label: 'RA/Dec grid (J2000)', color: '#6fb3d9', opacity: 0.32 },
  eclipticGrid: { label: 'Ecliptic grid', color: '#e39a7b', opacity: 0.3 },
} as const;

export const COLORS = {
  background: '#05070d',
  groundObserver: '#141a12',
  groundSphere: '#3b4a2c',
  groundEdge: '#e9c46a',
  axis: '#dfe6f2',
  referencePoint: '#f1f5f9',
  sun: '#ffd166',
  moonLit: '#e8e6df',
  moonDark: '#2a2d33',
  planet: '#f9e2ae',
  target: '#7df9ff',
  targetOutside: '#ff8fa3',
  forbidden: '#ff3b5c',
  mask: '#2d2218',
  maskEdge: '#c08552',
  sunKeepOut: '#ff4d4d',
  moonKeepOut: '#a0a8ff',
  pin: '#ffe066',
  comment: '#ffb703',
  label: '#e6edf7',
  labelDim: '#93a1b5',
  cardinal: '#ffe8a3',
} as const;

/** Legend rows: layer key → label; circles carry their own style. */
export const LEGEND: { key: LayerKey; label: string; group: 'Rings' | 'Grids' | 'Sky' | 'Plan' }[] = [
  ...CIRCLE_KEYS.map((k) => ({ key: k as LayerKey, label: CIRCLE_STYLES[k].label, group: 'Rings' as const })),
  { key: 'altAzGrid', label: GRID_STYLES.altAzGrid.label, group: 'Grids' },
  { key: 'raDecGrid', label: GRID_STYLES.raDecGrid.label, group: 'Grids' },
  { key: 'eclipticGrid', label: GRID_STYLES.eclipticGrid.label, group: 'Grids' },
  { key: 'referencePoints', label: 'Reference points', group: 'Sky' },
  { key: 'stars', label: 'Stars', group: 'Sky' },
  { key: 'starLabels', label: 'Star names', group: 'Sky' },
  { key: 'bodies', label: 'Sun, Moon, planets', group: 'Sky' },
  { key: 'bodyLabels', label: 'Body names', group: 'Sky' },
  { key: 'ground', label: 'Ground', group: 'Sky' },
  { key: 'envelope', label: 'Pointing envelope', group: 'Plan' },
  { key: 'targets', label: 'Targets', group: 'Plan' },
  { key: 'pins', label: 'Pins', group: 'Plan' },
  { key: 'comments', label: 'Comments', group: 'Plan' },
];

/** SVG stroke-dasharray for a pattern (legend swatches). */
export function dashArray(pattern: number[]): string | undefined {
  return pattern.length ? pattern.join(' ') : undefined;
}
