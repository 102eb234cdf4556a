import { describe, expect, it } from 'vitest';
import { meanObliquityRad, nutationIau2000b, trueObliquityDeg } from '../../../src/lib/sky/nutation';
import { J2000_JD } from '../../../src/lib/sky/timescales';

const AS = 180 / Math.PI * 3600;

describe('obliquity and nutation', () => {
  it('A7: mean obliquity at J2000.0 is 84381.406″ (IAU 2006 resolution B1, P03)', () => {
    expect(Math.abs(meanObliquityRad(0) * AS - 84381.406)).toBeLessThan(1e-4);
    // domain-facts: 23.439279°
    expect(Math.abs((meanObliquityRad(0) * 180) / Math.PI - 23.4392794)).toBeLessThan(1e-7);
  });

  it('A8: nutation and obliquity at 1987-04-10 0h TT (Meeus Ex. 22.a; IAU 2000A/2006 values)', () => {
    // Meeus Ex. 22.a, IAU 2000A/2006 column: Δψ −3.781″, Δε +9.445″, ε0 23°26′27.368″, ε 23°26′36.814″.
    // Tolerance 0.01″ on Δψ, Δε; 0.05″ on ε.
    const d = 2446895.5 - J2000_JD;
    const n = nutationIau2000b(d);
    expect(Math.abs(n.dPsiRad * AS - -3.781)).toBeLessThan(0.01);
    expect(Math.abs(n.dEpsRad * AS - 9.445)).toBeLessThan(0.01);
    const base = 23 * 3600 + 26 * 60;
    expect(Math.abs(meanObliquityRad(d) * AS - base - 27.368)).toBeLessThan(0.05);
    expect(Math.abs(trueObliquityDeg(d) * 3600 - base - 36.814)).toBeLessThan(0.05);
  });
});
