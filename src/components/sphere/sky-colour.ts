/**
 * The colour of the sky background for the Observer view, from the Sun's altitude: day blue, the three
 * twilights, night; brighter and paler toward the horizon, with a warm glow low on the Sun's side around
 * sunrise and sunset. A painted impression for orientation, not a radiance model: the key altitudes are
 * the twilight limits (Sun at −0.833°, −6°, −12°, −18°; USNO definitions, common practice), and between
 * keys the colours blend linearly, so the sky never jumps as time plays. Pure (no three.js): unit-tested.
 */

export type Rgb = [number, number, number];

interface Key {
  sunAltDeg: number;
  zenith: Rgb;
  horizon: Rgb;
}

const hex = (h: string): Rgb => [parseInt(h.slice(1, 3), 16) / 255, parseInt(h.slice(3, 5), 16) / 255, parseInt(h.slice(5, 7), 16) / 255];

/** Sorted by the Sun's altitude, from night to full day. Muted, so lines and labels keep their contrast. */
const KEYS: Key[] = [
  { sunAltDeg: -18, zenith: hex('#05070d'), horizon: hex('#070a14') }, // night (astronomical darkness)
  { sunAltDeg: -12, zenith: hex('#070c1a'), horizon: hex('#101a33') }, // end of nautical twilight
  { sunAltDeg: -6, zenith: hex('#0c1831'), horizon: hex('#28305a') }, // end of civil twilight
  { sunAltDeg: -0.833, zenith: hex('#173463'), horizon: hex('#4a5a8a') }, // sunset / sunrise
  { sunAltDeg: 10, zenith: hex('#1f4f8f'), horizon: hex('#6f95c4') }, // low Sun, daylight
  { sunAltDeg: 30, zenith: hex('#2560a6'), horizon: hex('#86a9d2') }, // full day
];

const GLOW: Rgb = hex('#ff9a52');

export interface SkyGradient {
  zenith: Rgb;
  horizon: Rgb;
  /** Strength of the Sun-side glow, 0..1. */
  glow: number;
}

const mix = (a: number, b: number, t: number) => a + (b - a) * t;

/** The sky's zenith and horizon colours and the glow's strength for the Sun at `sunAltDeg`. */
export function skyGradient(sunAltDeg: number): SkyGradient {
  let zenith: Rgb, horizon: Rgb;
  const first = KEYS[0]!, last = KEYS[KEYS.length - 1]!;
  if (sunAltDeg <= first.sunAltDeg) ({ zenith, horizon } = first);
  else if (sunAltDeg >= last.sunAltDeg) ({ zenith, horizon } = last);
  else {
    let i = 0;
    while (KEYS[i + 1]!.sunAltDeg < sunAltDeg) i++;
    const a = KEYS[i]!, b = KEYS[i + 1]!;
    const t = (sunAltDeg - a.sunAltDeg) / (b.sunAltDeg - a.sunAltDeg);
    zenith = [mix(a.zenith[0], b.zenith[0], t), mix(a.zenith[1], b.zenith[1], t), mix(a.zenith[2], b.zenith[2], t)];
    horizon = [mix(a.horizon[0], b.horizon[0], t), mix(a.horizon[1], b.horizon[1], t), mix(a.horizon[2], b.horizon[2], t)];
  }
  // The glow: strongest with the Sun just below the horizon, gone by the end of nautical twilight and
  // once the Sun is 15° up.
  const glow = sunAltDeg < -12 || sunAltDeg > 15 ? 0 : sunAltDeg < -2 ? (sunAltDeg + 12) / 10 : sunAltDeg <= 3 ? 1 : 1 - (sunAltDeg - 3) / 12;
  return { zenith, horizon, glow: Math.max(0, Math.min(1, glow)) };
}

/**
 * Colour of one direction of the sky into `out`: `altDeg` its altitude, `sunSepDeg` its angle from the
 * Sun. Below the horizon the horizon colour darkens (seen only when the ground layer is off).
 */
export function skyColourAt(out: Rgb | Float32Array, g: SkyGradient, altDeg: number, sunSepDeg: number, offset = 0): void {
  const h = Math.max(0, altDeg);
  // Brighter toward the horizon: most of the change in the lowest 30°.
  const toHorizon = Math.pow(1 - h / 90, 3);
  let r = mix(g.zenith[0], g.horizon[0], toHorizon);
  let gr = mix(g.zenith[1], g.horizon[1], toHorizon);
  let b = mix(g.zenith[2], g.horizon[2], toHorizon);
  if (g.glow > 0) {
    const k = 0.55 * g.glow * Math.exp(-sunSepDeg / 28) * Math.exp(-h / 14);
    r = mix(r, GLOW[0], k);
    gr = mix(gr, GLOW[1], k);
    b = mix(b, GLOW[2], k);
  }
  if (altDeg < 0) {
    const d = Math.max(0.35, 1 + altDeg / 25);
    r *= d;
    gr *= d;
    b *= d;
  }
  out[offset] = r;
  out[offset + 1] = gr;
  out[offset + 2] = b;
}
