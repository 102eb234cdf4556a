/**
 * The skyline profile of a horizon mask and the export links. The rule checked: a horizon mask is a list of
 * azimuth/elevation pairs, azimuth from north through east, interpolated linearly in azimuth and wrapping
 * at 360° (/work/shared/domain-facts.md "Horizon masks"; API contract, envelope section).
 */
import { describe, expect, it } from 'vitest';
import { AZIMUTH_TICKS, elevationRange, maskElevationAt, skylinePath } from '../../../src/lib/client/skyline';
import { parseHorizonCsv } from '../../../src/lib/imports/horizon-csv';
import { exportLinks } from '../../../src/components/scenes/ExportPanel';

// Obstacle elevation = atan(height / distance): a 10 m wall 20 m away blocks below 26.57°
// (domain-facts.md, derived: atan(0.5) = 26.565°).
const WALL = (Math.atan(10 / 20) * 180) / Math.PI;

describe('maskElevationAt', () => {
  it('interpolates linearly between points', () => {
    expect(maskElevationAt([[0, 0], [90, WALL], [180, 0], [270, 10]], 45)).toBeCloseTo(WALL / 2, 9);
    expect(maskElevationAt([[0, 0], [90, WALL]], 90)).toBeCloseTo(26.57, 2);
  });
  it('wraps through north (350° → 10°)', () => {
    const mask: [number, number][] = [[10, 4], [180, 0], [350, 8]];
    // Halfway between 350° (8°) and 370° (4°) is north: 6°.
    expect(maskElevationAt(mask, 0)).toBeCloseTo(6, 9);
    expect(maskElevationAt(mask, 360)).toBeCloseTo(6, 9);
    expect(maskElevationAt(mask, 355)).toBeCloseTo(7, 9);
    expect(maskElevationAt(mask, 5)).toBeCloseTo(5, 9);
  });
  it('handles one point and no points', () => {
    expect(maskElevationAt([[120, 12]], 300)).toBe(12);
    expect(maskElevationAt([], 10)).toBeNull();
  });
});

describe('skylinePath', () => {
  const box = { width: 360, height: 100, elMin: 0, elMax: 50 };
  it('runs from azimuth 0 to 360 across the plot, with the wrap value at both ends', () => {
    const sk = skylinePath([[90, 10], [270, 30]], box);
    // At north: halfway from 270° (30°) to 450° (10°) → 20°, i.e. y = 100 − 20/50·100 = 60.
    expect(sk.points[0]).toEqual([0, 60]);
    expect(sk.points.at(-1)).toEqual([360, 60]);
    expect(sk.points).toEqual([[0, 60], [90, 80], [270, 40], [360, 60]]);
    expect(sk.line).toBe('M0 60 L90 80 L270 40 L360 60');
  });
  it('fills the area below the line down to the bottom edge and closes it', () => {
    const sk = skylinePath([[0, 25], [180, 25]], box);
    expect(sk.fill.startsWith('M0 100 L0 50')).toBe(true);
    expect(sk.fill.endsWith('L360 100 Z')).toBe(true);
  });
  it('keeps the path inside the plot when the mask goes beyond the range', () => {
    const sk = skylinePath([[0, -20], [180, 80]], box);
    for (const [, y] of sk.points) expect(y >= 0 && y <= 100).toBe(true);
  });
  it('is empty for an empty mask', () => {
    expect(skylinePath([], box)).toEqual({ line: '', fill: '', points: [] });
  });
  it('draws a file read in the "south" convention where north-east puts it (A_N = A_S + 180)', () => {
    // 0° from south is azimuth 180° from north (horizon-csv.ts; common practice for south-based surveys).
    const { mask, errors } = parseHorizonCsv('azimuth,elevation\n0,20\n180,5\n', 'south');
    expect(errors).toEqual([]);
    expect(mask).toEqual([[0, 5], [180, 20]]);
    const sk = skylinePath(mask, box);
    expect(sk.points[0]).toEqual([0, 90]);
    expect(sk.points[1]).toEqual([180, 60]);
  });
});

describe('elevationRange and ticks', () => {
  it('covers the horizon and the mask, in tens of degrees', () => {
    expect(elevationRange([[0, 8], [240, 22], [260, 26]])).toEqual([0, 30]);
    expect(elevationRange([[0, -4], [90, 47]])).toEqual([-10, 50]);
  });
  it('marks N, E, S, W at 0, 90, 180, 270 and N again at 360 (azimuth from north through east)', () => {
    const cardinal = AZIMUTH_TICKS.filter((t) => t.label.length === 1).map((t) => [t.az, t.label]);
    expect(cardinal).toEqual([[0, 'N'], [90, 'E'], [180, 'S'], [270, 'W'], [360, 'N']]);
  });
});

describe('exportLinks', () => {
  it('member links carry the view time and a window span', () => {
    const l = exportLinks({ kind: 'scene', id: 'abc' }, '2026-06-15T06:00:00.000Z', 24);
    expect(l.handout).toBe('/scenes/abc/handout');
    expect(l.positions).toBe('/api/scenes/abc/export.csv?time=2026-06-15T06%3A00%3A00Z');
    expect(l.windows).toBe('/api/scenes/abc/windows.csv?from=2026-06-15T06%3A00%3A00Z&to=2026-06-16T06%3A00%3A00Z');
    expect(l.json).toBe('/api/scenes/abc/export.json');
    expect(l.votable).toBe('/api/scenes/abc/targets.vot');
  });
  it('share-link pages use the token routes', () => {
    const l = exportLinks({ kind: 'shared', token: 'tok' }, '2026-06-15T06:00:00Z', 12);
    expect(l.handout).toBe('/s/tok/handout');
    expect(l.windows).toBe('/api/shared/tok/export-windows.csv?from=2026-06-15T06%3A00%3A00Z&to=2026-06-15T18%3A00%3A00Z');
    expect(l.votable).toBe('/api/shared/tok/export.vot');
  });
});
