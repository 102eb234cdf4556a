import { describe, expect, it } from 'vitest';
import {
  apparentAltitudeDeg, bennettArcmin, refractionAtObservedZenithArcsec, refractionConstants, saemundssonArcmin, trueAltitudeDeg,
  refractionForTrueAltitudeDeg, isaPressureHPa,
} from '../../../src/lib/sky/refraction';
import { STANDARD_CONSTANTS } from '../../../src/lib/sky/refraction';
import { saemundsson as saemundssonAstronomia, bennett2 } from 'astronomia/refraction';

const D = Math.PI / 180;

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

  // Low altitudes (the product's model there is Sæmundsson's formula × (P/1010 hPa)(283 K/T)): check values from the
  // published formulas as the astronomia package implements them (Meeus, Astronomical Algorithms, eqs 16.3, 16.4).
  const factor = STANDARD_CONSTANTS.lowFactor;
  for (const h of [0, 2, 5]) {
    it(`true altitude ${h}°: Sæmundsson (1986; Meeus eq. 16.4, astronomia refraction.saemundsson) × the P/T factor, ±0.1″`, () => {
      const want = (saemundssonAstronomia(h * D) / D) * 3600 * factor;
      expect(Math.abs(refractionForTrueAltitudeDeg(h) * 3600 - want)).toBeLessThan(0.1);
    });
    it(`apparent altitude ${h}°: within 0.1′ of Bennett (1982; Meeus eq. 16.3 with his correction, astronomia refraction.bennett2) × the factor`, () => {
      const trueAlt = trueAltitudeDeg(h);
      const want = (bennett2(h * D) / D) * 3600 * factor;
      expect(Math.abs((h - trueAlt) * 3600 - want)).toBeLessThan(6);
    });
  }
  it('the horizon value: 34–35′ at apparent altitude 0° (USNO rise/set convention uses 34′; common practice)', () => {
    expect((0 - trueAltitudeDeg(0)) * 60).toBeGreaterThan(34);
    expect((0 - trueAltitudeDeg(0)) * 60).toBeLessThan(35);
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
