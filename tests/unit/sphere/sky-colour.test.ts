/**
 * The sky background's colours (components/sphere/sky-colour.ts) against the twilight limits: the Sun at
 * −0.833° (rise/set), −6°, −12° and −18° (USNO definitions, common practice). What is checked is the
 * ordering the eye expects, and that the colour never jumps as time plays.
 */
import { describe, expect, it } from 'vitest';
import { skyColourAt, skyGradient, type Rgb } from '../../../src/components/sphere/sky-colour';

const lum = (c: Rgb) => 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
const at = (sunAlt: number, alt: number, sep: number): Rgb => {
  const out: Rgb = [0, 0, 0];
  skyColourAt(out, skyGradient(sunAlt), alt, sep);
  return out;
};

describe('sky background', () => {
  it('gets darker from day through the three twilights to night, at the zenith and at the horizon', () => {
    const suns = [30, 10, -0.833, -6, -12, -18];
    for (const alt of [90, 5]) {
      const l = suns.map((s) => lum(at(s, alt, 120)));
      for (let i = 1; i < l.length; i++) expect(l[i], `sun ${suns[i]}° vs ${suns[i - 1]}°, sky altitude ${alt}°`).toBeLessThan(l[i - 1]!);
    }
  });

  it('is blue by day (blue above red and green) and all but black at night', () => {
    const day = at(40, 60, 90);
    expect(day[2]).toBeGreaterThan(day[0]);
    expect(day[2]).toBeGreaterThan(day[1]);
    const night = at(-30, 60, 90);
    expect(Math.max(...night)).toBeLessThan(0.06);
    // Below −18° nothing changes any more.
    expect(at(-40, 60, 90)).toEqual(night);
  });

  it('is paler toward the horizon than at the zenith', () => {
    for (const s of [20, 0, -5, -10]) expect(lum(at(s, 3, 150))).toBeGreaterThan(lum(at(s, 89, 150)));
  });

  it('glows warm low on the Sun’s side around sunset, not on the other side, and not at night or at noon', () => {
    const near = at(-2, 2, 5);
    const far = at(-2, 2, 175);
    expect(near[0] - near[2]).toBeGreaterThan(far[0] - far[2] + 0.15); // redder than the opposite horizon
    expect(skyGradient(-20).glow).toBe(0);
    expect(skyGradient(40).glow).toBe(0);
    expect(skyGradient(-1).glow).toBe(1);
  });

  it('never jumps: 0.01° of Sun altitude changes no channel by more than 0.002 (time can play smoothly)', () => {
    for (let s = -25; s <= 35; s += 0.25) {
      const a = at(s, 10, 40), b = at(s + 0.01, 10, 40);
      for (let k = 0; k < 3; k++) expect(Math.abs(a[k]! - b[k]!)).toBeLessThan(0.002);
    }
  });
});
