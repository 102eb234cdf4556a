import { describe, expect, it } from 'vitest';
import { formatDecDms, formatRaHms, parseDec, parseRa } from '../../../src/lib/imports/angles';

const ARCSEC = 1 / 3600;
const ok = (r: ReturnType<typeof parseRa>) => {
  if (!r.ok) throw new Error(r.message);
  return r.value;
};

/** Angular separation (degrees), haversine form. */
function separation(ra1: number, dec1: number, ra2: number, dec2: number): number {
  const d = Math.PI / 180;
  const h =
    Math.sin(((dec2 - dec1) * d) / 2) ** 2 + Math.cos(dec1 * d) * Math.cos(dec2 * d) * Math.sin(((ra2 - ra1) * d) / 2) ** 2;
  return (2 * Math.asin(Math.sqrt(h))) / d;
}

describe('parseRa', () => {
  // Arcturus α 14h15m39.7s (Meeus, Astronomical Algorithms 2nd ed., Ex. 17.a) = 213.9154167°.
  const ARCTURUS_RA = (14 + 15 / 60 + 39.7 / 3600) * 15;
  it.each(['14 15 39.7', '14:15:39.7', '14h15m39.7s', '14h 15m 39.7s', ' 14 15 39.7 ', '14H15M39.7S'])('reads %j as hours', (s) => {
    expect(ok(parseRa(s))).toBeCloseTo(ARCTURUS_RA, 9);
  });
  it('reads a plain number as degrees, with or without a degree mark', () => {
    expect(ok(parseRa('213.9154'))).toBeCloseTo(213.9154, 12);
    expect(ok(parseRa('213.9154d'))).toBeCloseTo(213.9154, 12);
    expect(ok(parseRa('213.9154°'))).toBeCloseTo(213.9154, 12);
    expect(ok(parseRa('0'))).toBe(0);
    // A lone number is never hours: 25 is 25°.
    expect(ok(parseRa('25'))).toBe(25);
  });
  it('reads decimal hours with an h suffix and hours + decimal minutes', () => {
    expect(ok(parseRa('14.5h'))).toBeCloseTo(217.5, 12);
    expect(ok(parseRa('14 30.0'))).toBeCloseTo(217.5, 12);
  });
  it('reads Sirius to the milliarcsecond (ERFA atco13 check E1 input, reference-values.md)', () => {
    // 06h45m08.91728s = 101.2871553333…°
    expect(ok(parseRa('06 45 08.91728'))).toBeCloseTo((6 + 45 / 60 + 8.91728 / 3600) * 15, 10);
  });
  it.each([
    ['24 00 00', /below 24h/],
    ['360', /below 360/],
    ['-1', /negative/],
    ['12 60 00', /minutes/],
    ['12 30 60', /seconds/],
    ['12.5 30 00', /fraction/],
    ['ten', /unexpected/],
    ['', /empty/],
    ['12 30 00 00', /three parts/],
    ['12s30m', /out of place/],
    ['12:30:', /separator/],
  ])('refuses %j', (s, msg) => {
    const r = parseRa(s);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(msg);
  });
});

describe('parseDec', () => {
  const ARCTURUS_DEC = 19 + 10 / 60 + 57 / 3600;
  it.each(['+19 10 57', '19 10 57', '+19:10:57', '+19°10′57″', '+19d10m57s', "+19°10'57\"", "+19°10'57''", '+19º 10′ 57″'])(
    'reads %j',
    (s) => expect(ok(parseDec(s))).toBeCloseTo(ARCTURUS_DEC, 9),
  );
  it('reads negative declinations, including the ASCII, U+2212 and en-dash minus', () => {
    // Spica δ −11°09′41″ (Meeus Ex. 17.a)
    const spica = -(11 + 9 / 60 + 41 / 3600);
    for (const s of ['-11:09:41', '-11 09 41', '−11°09′41″', '–11 09 41', '-11d09m41s']) expect(ok(parseDec(s))).toBeCloseTo(spica, 9);
  });
  it('keeps the sign of "-0 30 00" (the sign belongs to the whole angle)', () => {
    expect(ok(parseDec('-0 30 00'))).toBe(-0.5);
    expect(ok(parseDec('-00:30:00'))).toBe(-0.5);
    expect(ok(parseDec('−0°30′'))).toBe(-0.5);
    expect(ok(parseDec('+0 30 00'))).toBe(0.5);
    expect(ok(parseDec('-0.5'))).toBe(-0.5);
  });
  it('accepts the poles and refuses beyond them', () => {
    expect(ok(parseDec('+90 00 00'))).toBe(90);
    expect(ok(parseDec('-90'))).toBe(-90);
    expect(parseDec('+90 00 01').ok).toBe(false);
    expect(parseDec('95').ok).toBe(false);
    expect(parseDec('-90.0001').ok).toBe(false);
  });
  it('refuses hours, bad minutes and junk', () => {
    expect(parseDec('12h').ok).toBe(false);
    expect(parseDec('10 61 00').ok).toBe(false);
    expect(parseDec('north').ok).toBe(false);
    expect(parseDec('+').ok).toBe(false);
  });
});

describe('parsed positions reproduce a published separation', () => {
  it('Arcturus–Spica is 32.7930° (Meeus Ex. 17.a, ±1″)', () => {
    const sep = separation(
      ok(parseRa('14h15m39.7s')),
      ok(parseDec('+19°10′57″')),
      ok(parseRa('13h25m11.6s')),
      ok(parseDec('-11°09′41″')),
    );
    expect(Math.abs(sep - 32.793)).toBeLessThan(ARCSEC);
  });
});

describe('formatting round-trips', () => {
  it('formats and re-reads RA and Dec', () => {
    expect(formatRaHms(213.9154166667, 1)).toBe('14h15m39.7s');
    expect(formatDecDms(-(11 + 9 / 60 + 41 / 3600), 0)).toBe('-11°09′41″');
    expect(formatDecDms(-0.5, 0)).toBe('-00°30′00″');
    expect(formatRaHms(359.99999999, 1)).toBe('00h00m00.0s');
    for (const deg of [0, 0.001, 45.5, 101.28715533, 213.9154167, 359.9]) {
      expect(ok(parseRa(formatRaHms(deg, 4)))).toBeCloseTo(deg, 6);
    }
    for (const deg of [-90, -16.716115861, -0.25, 0, 19.1825, 89.99]) {
      expect(ok(parseDec(formatDecDms(deg, 3)))).toBeCloseTo(deg, 6);
    }
  });
});
