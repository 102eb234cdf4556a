/**
 * The sky view's names for the palette (`src/lib/style/palette.ts`, the one colour and line-pattern code
 * of the product): each great circle has a colour AND a line pattern, so the rings read in greyscale and
 * for colour-blind viewers. Patterns are on/off lengths in CSS pixels.
 */
import type { LayerKey } from '../../lib/contracts/scene-doc';

import { BODIES, CIRCLE_KEYS as KEYS, CIRCLES, GRIDS, LABELS, PLAN, SURFACE, type CircleKey } from '../../lib/style/palette';

export type { CircleKey };

export interface LineStyle {
  label: string;
  color: string;
  widthPx: number;
  /** [on, off, on, off, ...] in CSS pixels; empty = solid. At most 4 pairs. */
  pattern: number[];
  patternName: string;
}

/** The palette's rings in the sky view's terms (screen inks). */
export const CIRCLE_STYLES = Object.fromEntries(
  KEYS.map((k) => [k, { label: CIRCLES[k].label, color: CIRCLES[k].screen, widthPx: CIRCLES[k].widthPx, pattern: CIRCLES[k].pattern, patternName: CIRCLES[k].patternName }]),
) as Record<CircleKey, LineStyle>;

export const CIRCLE_KEYS = KEYS;

export const GRID_STYLES = {
  altAzGrid: { label: GRIDS.altAzGrid.label, color: GRIDS.altAzGrid.screen, opacity: GRIDS.altAzGrid.opacity },
  raDecGrid: { label: GRIDS.raDecGrid.label, color: GRIDS.raDecGrid.screen, opacity: GRIDS.raDecGrid.opacity },
  eclipticGrid: { label: GRIDS.eclipticGrid.label, color: GRIDS.eclipticGrid.screen, opacity: GRIDS.eclipticGrid.opacity },
} as const;

export const COLORS = {
  background: SURFACE.sky.screen,
  groundObserver: SURFACE.groundObserver.screen,
  groundSphere: SURFACE.groundSphere.screen,
  groundEdge: CIRCLES.horizon.screen,
  axis: LABELS.axis.screen,
  referencePoint: LABELS.referencePoint.screen,
  sun: BODIES.sun.screen,
  moonLit: BODIES.moon.screen,
  moonDark: BODIES.moonDark.screen,
  planet: BODIES.planet.screen,
  target: PLAN.target.screen,
  targetOutside: PLAN.targetOutside.screen,
  forbidden: PLAN.forbidden.screen,
  mask: PLAN.mask.screen,
  maskEdge: PLAN.maskEdge.screen,
  sunKeepOut: PLAN.sunKeepOut.screen,
  moonKeepOut: PLAN.moonKeepOut.screen,
  pin: PLAN.pin.screen,
  comment: PLAN.comment.screen,
  label: LABELS.label.screen,
  labelDim: LABELS.labelDim.screen,
  cardinal: LABELS.cardinal.screen,
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
export { dashArray } from '../../lib/style/palette';
