/**
 * Pin paths are clipped to the canvas before they are stroked or filled (a dashed stroke along a path
 * that runs far off the canvas costs the rasteriser every dash). Check values are worked by hand from the
 * Liang–Barsky and Sutherland–Hodgman clipping algorithms (common practice; any computer-graphics text).
 */
import { describe, expect, it } from 'vitest';
import { clipPolygon, clipSegment } from '../../../src/components/sphere/pins';

describe('clipSegment (Liang–Barsky)', () => {
  it('keeps a segment wholly inside', () => {
    expect(clipSegment(1, 1, 3, 4, 0, 0, 10, 10)).toEqual([0, 1]);
  });
  it('cuts a horizontal segment at both sides', () => {
    // (−10, 5) → (10, 5) against x in [0, 4]: enters at x = 0 (t = 10/20 = 0.5), leaves at x = 4 (t = 14/20 = 0.7).
    const t = clipSegment(-10, 5, 10, 5, 0, 0, 4, 10)!;
    expect(t[0]).toBeCloseTo(0.5, 12);
    expect(t[1]).toBeCloseTo(0.7, 12);
  });
  it('cuts a diagonal at the corner region', () => {
    // (−5, −5) → (15, 15) against [0, 10]²: enters at (0, 0), t = 0.25; leaves at (10, 10), t = 0.75.
    const t = clipSegment(-5, -5, 15, 15, 0, 0, 10, 10)!;
    expect(t[0]).toBeCloseTo(0.25, 12);
    expect(t[1]).toBeCloseTo(0.75, 12);
  });
  it('rejects a segment that passes outside', () => {
    // The line x + y = 25 meets the square [0, 10]² nowhere (its nearest point is (12.5, 12.5)).
    expect(clipSegment(25, 0, 0, 25, 0, 0, 10, 10)).toBeNull();
    expect(clipSegment(-3, -1, -1, 20, 0, 0, 10, 10)).toBeNull();
    // Parallel to an edge and outside it.
    expect(clipSegment(-1, 2, -1, 8, 0, 0, 10, 10)).toBeNull();
  });
  it('a path 100 000 px long keeps only its visible part', () => {
    // From (−50 000, 300) to (50 000, 300) on a 1 280-px-wide canvas: the visible part is 1 280 px of 100 000.
    const t = clipSegment(-50_000, 300, 50_000, 300, 0, 0, 1280, 720)!;
    expect((t[1] - t[0]) * 100_000).toBeCloseTo(1280, 6);
  });
});

describe('clipPolygon (Sutherland–Hodgman)', () => {
  const area = (p: Array<[number, number]>) => Math.abs(p.reduce((s, a, i) => s + a[0] * p[(i + 1) % p.length][1] - p[(i + 1) % p.length][0] * a[1], 0)) / 2;
  it('leaves a polygon inside unchanged', () => {
    const sq: Array<[number, number]> = [[1, 1], [4, 1], [4, 4], [1, 4]];
    expect(clipPolygon(sq, 0, 0, 10, 10)).toEqual(sq);
  });
  it('a square over a corner keeps the overlap', () => {
    // [−5, 5]² ∩ [0, 10]² = [0, 5]²: area 25.
    const out = clipPolygon([[-5, -5], [5, -5], [5, 5], [-5, 5]], 0, 0, 10, 10);
    expect(area(out)).toBeCloseTo(25, 9);
    for (const [x, y] of out) {
      expect(x).toBeGreaterThanOrEqual(0);
      expect(y).toBeGreaterThanOrEqual(0);
    }
  });
  it('a triangle larger than the canvas becomes the canvas', () => {
    // The triangle (−100, −100), (300, −100), (−100, 300) covers [0, 10]² entirely: area 100.
    expect(area(clipPolygon([[-100, -100], [300, -100], [-100, 300]], 0, 0, 10, 10))).toBeCloseTo(100, 9);
  });
  it('a polygon wholly outside vanishes', () => {
    expect(clipPolygon([[20, 20], [30, 20], [30, 30]], 0, 0, 10, 10)).toEqual([]);
  });
});
