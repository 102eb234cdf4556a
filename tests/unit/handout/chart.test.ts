import { describe, expect, it } from 'vitest';
import { cardinalPositions, maskAltitude, project, radiusOf, skyPath, skylinePath, unproject } from '../../../src/lib/handout/chart';

const F = { R: 200, cx: 250, cy: 260 };

describe('zenithal equidistant projection (north up, east left as seen looking up)', () => {
  it('puts the zenith at the centre and the horizon on the circle of radius R', () => {
    expect(project(90, 123, F)).toEqual({ x: 250, y: 260 });
    for (const az of [0, 37, 90, 180, 271.5]) {
      const p = project(0, az, F);
      expect(Math.hypot(p.x - F.cx, p.y - F.cy)).toBeCloseTo(F.R, 10);
    }
  });
  it('north is up, east left, south down, west right', () => {
    const n = project(0, 0, F);
    const e = project(0, 90, F);
    const s = project(0, 180, F);
    const w = project(0, 270, F);
    expect(n.x).toBeCloseTo(250, 10);
    expect(n.y).toBeCloseTo(60, 10);
    expect(e.x).toBeCloseTo(50, 10);
    expect(e.y).toBeCloseTo(260, 10);
    expect(s.y).toBeCloseTo(460, 10);
    expect(w.x).toBeCloseTo(450, 10);
    const labels = Object.fromEntries(cardinalPositions(F).map((c) => [c.label, c]));
    expect(labels.E!.x).toBeLessThan(F.cx - F.R);
    expect(labels.W!.x).toBeGreaterThan(F.cx + F.R);
  });
  it('places a known star where r = (90 − alt)/90 · R says', () => {
    // Sirius from φ 51.4769°, λ 0° at 2024-01-15T22:00:00Z: standard-refraction altitude 20.279789°, azimuth
    // 162.938748° (ERFA atco13; reference-values.md E1). r = (90 − 20.279789)/90 × 200 = 154.9338 (derived).
    const p = project(20.279789, 162.938748, F);
    const r = Math.hypot(p.x - F.cx, p.y - F.cy);
    expect(r).toBeCloseTo(154.93380, 4);
    expect(radiusOf(20.279789, 200)).toBeCloseTo(154.93380, 4);
    // South-south-east: below the centre, slightly to the left (east).
    expect(p.y).toBeGreaterThan(F.cy);
    expect(p.x).toBeLessThan(F.cx);
    expect(p.x).toBeCloseTo(250 - 154.9338 * Math.sin((162.938748 * Math.PI) / 180), 3);
    expect(p.y).toBeCloseTo(260 - 154.9338 * Math.cos((162.938748 * Math.PI) / 180), 3);
  });
  it('unproject inverts project', () => {
    for (const [alt, az] of [
      [10, 10],
      [45, 200],
      [80, 359],
      [0.5, 90],
    ] as const) {
      const p = project(alt, az, F);
      const q = unproject(p.x, p.y, F);
      expect(q.alt).toBeCloseTo(alt, 9);
      expect(q.az).toBeCloseTo(az, 9);
    }
  });
});

describe('skyPath', () => {
  it('clips a circle crossing the horizon exactly on the horizon circle', () => {
    // The celestial equator at latitude 50° (common practice: it meets the horizon at azimuth 90° and 270°):
    // altitude along it peaks at 40° due south. Model it as alt = 40° × sin(az − 90°) for az in 0..360.
    const pts = Array.from({ length: 73 }, (_, i) => {
      const az = i * 5;
      return { az, alt: 40 * Math.sin(((az - 90) * Math.PI) / 180) };
    });
    const d = skyPath(pts, F);
    const segments = d.split('M').filter(Boolean);
    expect(segments).toHaveLength(1);
    const nums = segments[0]!.split(/[L ]/).map(Number);
    const first = { x: nums[0]!, y: nums[1]! };
    const last = { x: nums[nums.length - 2]!, y: nums[nums.length - 1]! };
    expect(Math.hypot(first.x - F.cx, first.y - F.cy)).toBeCloseTo(200, 1);
    expect(Math.hypot(last.x - F.cx, last.y - F.cy)).toBeCloseTo(200, 1);
    expect(first.x).toBeCloseTo(50, 1); // east point, on the left
    expect(last.x).toBeCloseTo(450, 1); // west point, on the right
  });
  it('draws nothing for a circle wholly below the horizon', () => {
    expect(skyPath([{ alt: -5, az: 0 }, { alt: -10, az: 90 }], F)).toBe('');
  });
});

describe('horizon mask interpolation', () => {
  const mask: [number, number][] = [
    [0, 5],
    [90, 12.5],
    [180, 20],
    [270, 8],
  ];
  it('interpolates linearly and wraps at 360° (API contract)', () => {
    expect(maskAltitude(mask, 45)).toBeCloseTo(8.75, 12);
    expect(maskAltitude(mask, 315)).toBeCloseTo(6.5, 12);
    expect(maskAltitude(mask, 360)).toBeCloseTo(5, 12);
    expect(maskAltitude(mask, 180)).toBeCloseTo(20, 12);
    // Wrapping segment 200° → 460°: at 0° (= 360°) the offset is 160 of 260, so 20 + (10 − 20) × 160/260 (derived).
    expect(maskAltitude([[100, 10], [200, 20]], 0)).toBeCloseTo(20 - (10 * 160) / 260, 12);
    expect(maskAltitude([], 10)).toBe(0);
  });
  it('makes a skyline region', () => {
    expect(skylinePath(mask, F)).toMatch(/^M.*Z.*Z$/);
    expect(skylinePath([], F)).toBe('');
  });
});
