/**
 * Atmospheric refraction.
 *
 * Model 'standard' (the product default): 1013.25 hPa, 10 °C, relative humidity 0.5, wavelength
 * 0.55 µm — the conditions of the reference values (IAU SOFA atco13 runs, reference-values.md E1–E4).
 *
 * - Above 10° of altitude: R = A tan z + B tan³ z with A, B from Green (1987, Spherical Astronomy
 *   §4.31) and the Hohenkerk & Sinclair (1985) saturation vapour pressure — the formulation IAU SOFA
 *   uses in refco/atioq, including its Newton step from the true to the observed zenith distance.
 *   Check: ray-traced values of reference-values.md A17 to 0.1″; E1–E4 to 0.05″.
 * - Below 5°: Saemundsson (1986, Sky & Telescope 72, 70) for a true altitude, scaled by
 *   (P / 1010 hPa) · (283 K / T), the usual pressure/temperature factor (Meeus ch. 16). The A tan z
 *   form fails near the horizon; Saemundsson gives 34′ there, the value of the rise/set conventions.
 * - Between 5° and 10° the two are blended linearly in altitude (they differ by 10–25″ there; below 5°
 *   the tan z form is far off: 673″ against 822″ at 3°, so the blend starts at 5°).
 *   Check (refraction.test.ts): at true 0°, 2°, 5° the product is the published formula (Meeus eq. 16.4,
 *   astronomia's implementation) × the factor; at apparent 0°, 2°, 5° within 0.1′ of Bennett's (eq. 16.3
 *   with Meeus's correction), the formula Sæmundsson fitted.
 * - Below −1° refraction is tapered linearly to 0 at the nadir so the mapping stays monotonic.
 *
 * Height: the 'standard' model does NOT scale the pressure with the site's height, because the API
 * contract defines it as 1013.25 hPa and 10 °C for every site (as the reference runs do, even for a
 * 4207 m site). Callers wanting a height-scaled pressure pass `pressureHPa: isaPressureHPa(heightM)`
 * (International Standard Atmosphere, troposphere) through `RefractionConditions`.
 */
import { DEG, RAD } from './math';

export type RefractionMode = 'none' | 'standard';

export interface RefractionConditions {
  pressureHPa: number;
  temperatureC: number;
  relativeHumidity: number;
  wavelengthMicron: number;
}

export const STANDARD_CONDITIONS: Readonly<RefractionConditions> = Object.freeze({
  pressureHPa: 1013.25,
  temperatureC: 10,
  relativeHumidity: 0.5,
  wavelengthMicron: 0.55,
});

/** ISA pressure at a height in metres (troposphere: 1013.25 · (1 − 2.25577e-5 h)^5.25588). */
export function isaPressureHPa(heightM: number): number {
  return 1013.25 * Math.pow(Math.max(0, 1 - 2.25577e-5 * heightM), 5.25588);
}

export interface RefractionConstants {
  /** A and B of R = A tan z + B tan³ z, radians. */
  refA: number;
  refB: number;
  /** Pressure/temperature factor applied to the Saemundsson formula. */
  lowFactor: number;
}

/** A and B refraction constants (Green 1987; Hohenkerk & Sinclair 1985), radians. */
export function refractionConstants(c: RefractionConditions = STANDARD_CONDITIONS): RefractionConstants {
  const optic = c.wavelengthMicron <= 100;
  const t = Math.min(Math.max(c.temperatureC, -150), 200);
  const p = Math.min(Math.max(c.pressureHPa, 0), 10000);
  const r = Math.min(Math.max(c.relativeHumidity, 0), 1);
  const w = Math.min(Math.max(c.wavelengthMicron, 0.1), 1e6);
  let pw = 0;
  if (p > 0) {
    const ps = Math.pow(10, (0.7859 + 0.03477 * t) / (1 + 0.00412 * t)) * (1 + p * (4.5e-6 + 6e-10 * t * t));
    pw = (r * ps) / (1 - ((1 - r) * ps) / p);
  }
  const tk = t + 273.15;
  let gamma: number;
  if (optic) {
    const wlsq = w * w;
    gamma = ((77.53484e-6 + (4.39108e-7 + 3.666e-9 / wlsq) / wlsq) * p - 11.2684e-6 * pw) / tk;
  } else {
    gamma = (77.689e-6 * p - (6.3938e-6 - 0.375463 / tk) * pw) / tk;
  }
  let beta = 4.4474e-6 * tk;
  if (!optic) beta -= 0.0074 * pw * beta;
  return {
    refA: gamma * (1 - beta),
    refB: -gamma * (beta - gamma / 2),
    lowFactor: (p / 1010) * (283 / (273 + t)),
  };
}

export const STANDARD_CONSTANTS: Readonly<RefractionConstants> = Object.freeze(refractionConstants());

/** R = A tan z + B tan³ z for an observed (apparent) zenith distance, arcseconds. */
export function refractionAtObservedZenithArcsec(zDeg: number, k: RefractionConstants = STANDARD_CONSTANTS): number {
  const tz = Math.tan(zDeg * DEG);
  return (k.refA * tz + k.refB * tz * tz * tz) * RAD * 3600;
}

/** Bennett (1982): refraction in arcminutes for an apparent altitude (Meeus eq. 16.3), 1010 hPa, 10 °C. */
export function bennettArcmin(apparentAltDeg: number): number {
  return 1 / Math.tan((apparentAltDeg + 7.31 / (apparentAltDeg + 4.4)) * DEG);
}

/** Saemundsson (1986): refraction in arcminutes for a true altitude (Meeus eq. 16.4), 1010 hPa, 10 °C. */
export function saemundssonArcmin(trueAltDeg: number): number {
  return 1.02 / Math.tan((trueAltDeg + 10.3 / (trueAltDeg + 5.11)) * DEG);
}

const LOW_DEG = 5;
const HIGH_DEG = 10;
const TAPER_DEG = -1;

function rLowDeg(h: number, k: RefractionConstants): number {
  return (saemundssonArcmin(h) * k.lowFactor) / 60;
}

function rHighDeg(h: number, k: RefractionConstants): number {
  // IAU SOFA atioq form: true → observed with one Newton step.
  const z = Math.sin(h * DEG);
  const r = Math.cos(h * DEG);
  const tz = r / z;
  const w = k.refB * tz * tz;
  const del = ((k.refA + w) * tz) / (1 + (k.refA + 3 * w) / (z * z));
  return del * RAD;
}

/** Refraction in degrees to add to a true (geometric) altitude to get the apparent altitude. */
export function refractionForTrueAltitudeDeg(trueAltDeg: number, k: RefractionConstants = STANDARD_CONSTANTS): number {
  const h = trueAltDeg;
  if (h >= HIGH_DEG) return h >= 90 ? 0 : rHighDeg(h, k);
  if (h >= LOW_DEG) {
    const w = (h - LOW_DEG) / (HIGH_DEG - LOW_DEG);
    return w * rHighDeg(h, k) + (1 - w) * rLowDeg(h, k);
  }
  if (h >= TAPER_DEG) return rLowDeg(h, k);
  if (h <= -90) return 0;
  return (rLowDeg(TAPER_DEG, k) * (h + 90)) / (TAPER_DEG + 90);
}

/** True → apparent altitude for a mode. */
export function apparentAltitudeDeg(trueAltDeg: number, mode: RefractionMode = 'standard', k: RefractionConstants = STANDARD_CONSTANTS): number {
  return mode === 'none' ? trueAltDeg : trueAltDeg + refractionForTrueAltitudeDeg(trueAltDeg, k);
}

/** Apparent → true altitude (inverse of apparentAltitudeDeg, by iteration to < 1e-9°). */
export function trueAltitudeDeg(apparentAltDeg: number, mode: RefractionMode = 'standard', k: RefractionConstants = STANDARD_CONSTANTS): number {
  if (mode === 'none') return apparentAltDeg;
  let h = apparentAltDeg - refractionForTrueAltitudeDeg(apparentAltDeg, k);
  for (let i = 0; i < 30; i++) {
    const f = h + refractionForTrueAltitudeDeg(h, k) - apparentAltDeg;
    if (Math.abs(f) < 1e-10) break;
    // derivative ≈ 1 + dR/dh by a small difference
    const d = 1 + (refractionForTrueAltitudeDeg(h + 1e-5, k) - refractionForTrueAltitudeDeg(h - 1e-5, k)) / 2e-5;
    h -= f / (d > 0.05 ? d : 0.05);
  }
  return h;
}
