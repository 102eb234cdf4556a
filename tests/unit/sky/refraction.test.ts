import { describe, expect, it } from 'vitest';
import {
  apparentAltitudeDeg, bennettArcmin, refractionAtObservedZenithArcsec, refractionConstants, saemundssonArcmin, trueAltitudeDeg,
  refractionForTrueAltitudeDeg, isaPressureHPa,
} from '../../../src/lib/sky/refraction';

describe('refraction', () => {
  it('A16: Bennett at apparent 0.5° and Saemundsson at true 33.246′ (Meeus Ex. 16.a)', () => {
    // Meeus Ex. 16.a: 28.754′ and 24.618′; ±0.01′
    expect(Math.abs(bennettArcmin(0.5) - 28.754)).toBeLessThan(0.01);
    expect(Math.abs(saemundssonArcmin(33.246 / 60) - 24.618)).toBeLessThan(0.01);
  });

  it('A17: A tan z + B tan³ z against ray tracing (IAU SOFA refco documentation)', () => {
    // 1005 hPa, 7 °C, RH 0.8, 0.574 µm: ZD 45° 58.16″, 60° 100.51″, 70° 158.63″; ±0.5″
    const k = refractionConstants({ pressureHPa: 1005, temperatureC: 7, relativeHumidity: 0.8, wavelengthMicron: 0.574 });
    expect(Math.abs(refractionAtObservedZenithArcsec(45, { ...k, lowFactor: 1 }) - 58.16)).toBeLessThan(0.5);
    expect(Math.abs(refractionAtObservedZenithArcsec(60, { ...k, lowFactor: 1 }) - 100.51)).toBeLessThan(0.5);
    expect(Math.abs(refractionAtObservedZenithArcsec(70, { ...k, lowFactor: 1 }) - 158.63)).toBeLessThan(0.5);
  });

  it('about 34′ at the horizon (USNO rise/set convention; common practice)', () => {
    expect(Math.abs(refractionForTrueAltitudeDeg(-0.6) * 60 - 34)).toBeLessThan(3);
  });

  it('is continuous and monotonic from −5° to 90°, and inverts to 1e-8°', () => {
    let prev = apparentAltitudeDeg(-5);
    for (let h = -5; h <= 90; h += 0.01) {
      const a = apparentAltitudeDeg(h);
      expect(a).toBeGreaterThanOrEqual(prev - 1e-12);
      expect(Math.abs(a - prev)).toBeLessThan(0.02);
      expect(Math.abs(trueAltitudeDeg(a) - h)).toBeLessThan(1e-8);
      prev = a;
    }
  });

  it("'none' leaves altitudes unchanged", () => {
    expect(apparentAltitudeDeg(12.3, 'none')).toBe(12.3);
    expect(trueAltitudeDeg(12.3, 'none')).toBe(12.3);
  });

  it('ISA pressure at 4207 m ≈ 600 hPa (International Standard Atmosphere, from memory ≈ 601 hPa)', () => {
    expect(Math.abs(isaPressureHPa(4207) - 601)).toBeLessThan(3);
  });
});
