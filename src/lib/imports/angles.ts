/**
 * Parsing and formatting of right ascension and declination as people type them in target lists.
 * Pure: no DOM, no I/O. Degrees out.
 *
 * Accepted right ascension:  "213.9154" (degrees), "213.9154d" / "213.9154°" (degrees), "14.261h" (hours),
 *   "14 15 39.7", "14:15:39.7", "14h15m39.7s", "14h 15m 39.7s", "14 15.66" (hours, minutes).
 * Accepted declination: "19.1825" (degrees), "+19 10 57", "-11:09:41", "+19°10′57″", "+19d10m57s",
 *   "+19°10'57\"", "-0 30 00" (the sign belongs to the whole angle, so this is −0.5°), "−11 09 41" (U+2212).
 * A single number is degrees; sexagesimal right ascension is in hours unless its first unit is ° or d.
 */

export type AngleResult = { ok: true; value: number } | { ok: false; message: string };

type Unit = 'h' | 'd' | 'm' | 's' | null;
interface Part {
  text: string;
  unit: Unit;
}

const UNIT_OF: Record<string, Unit> = {
  h: 'h', H: 'h',
  d: 'd', D: 'd', '°': 'd', 'º': 'd',
  m: 'm', M: 'm', "'": 'm', '′': 'm', '’': 'm',
  s: 's', S: 's', '"': 's', '″': 's', '”': 's',
  ':': null,
};

const fail = (message: string): AngleResult => ({ ok: false, message });

/** Splits "14h15m39.7s" or "+19 10 57" into a sign and numeric parts with their unit marks. */
function scan(input: string): { sign: 1 | -1; explicitSign: boolean; parts: Part[] } | string {
  let s = input.trim().replace(/\u2212|\u2013/g, '-').replace(/''/g, '"').replace(/′′/g, '″');
  if (s === '') return 'is empty';
  let sign: 1 | -1 = 1;
  let explicitSign = false;
  if (s[0] === '+' || s[0] === '-') {
    sign = s[0] === '-' ? -1 : 1;
    explicitSign = true;
    s = s.slice(1).trimStart();
  }
  const parts: Part[] = [];
  const num = /^(\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;
  let i = 0;
  while (i < s.length) {
    while (i < s.length && /\s/.test(s[i]!)) i++;
    if (i >= s.length) break;
    const m = num.exec(s.slice(i));
    if (!m) return `has an unexpected character "${s[i]}"`;
    const text = m[0];
    i += text.length;
    while (i < s.length && /\s/.test(s[i]!)) i++;
    let unit: Unit = null;
    const c = s[i];
    if (c !== undefined && c in UNIT_OF) {
      unit = UNIT_OF[c]!;
      i++;
      if (c === ':' && (i >= s.length || s.slice(i).trim() === '')) return 'ends with a separator';
    }
    parts.push({ text, unit });
  }
  if (parts.length === 0) return 'has no number';
  return { sign, explicitSign, parts };
}

const isInt = (t: string) => /^\d+$/.test(t);

/**
 * Combines up to three parts (major, minutes, seconds) into a value in the major unit.
 * Only the last part may carry a fraction; minutes and seconds must be below 60.
 */
function combine(parts: Part[], majorUnits: Unit[]): number | string {
  if (parts.length > 3) return 'has more than three parts (expected at most h m s or d m s)';
  const expected: Unit[][] = [majorUnits, ['m'], ['s']];
  for (let k = 0; k < parts.length; k++) {
    const p = parts[k]!;
    if (p.unit !== null && !expected[k]!.includes(p.unit)) return `has the unit mark "${p.unit}" out of place`;
    if (k < parts.length - 1 && !isInt(p.text)) return 'may have a decimal fraction only in its last part';
    if (/e/i.test(p.text) && parts.length > 1) return 'uses an exponent in a sexagesimal value';
  }
  const [a, b = 0, c = 0] = parts.map((p) => Number(p.text));
  if (!Number.isFinite(a!) || !Number.isFinite(b) || !Number.isFinite(c)) return 'is not a number';
  if (b >= 60) return 'has minutes of 60 or more';
  if (c >= 60) return 'has seconds of 60 or more';
  return a! + b / 60 + c / 3600;
}

/** Right ascension → degrees in [0, 360). */
export function parseRa(input: string): AngleResult {
  const r = scan(input);
  if (typeof r === 'string') return fail(`right ascension ${r}`);
  if (r.sign === -1) return fail('right ascension cannot be negative');
  const { parts } = r;
  const first = parts[0]!;
  let deg: number;
  if (parts.length === 1 && first.unit !== 'h') {
    if (first.unit !== null && first.unit !== 'd') return fail(`right ascension has the unit mark "${first.unit}" out of place`);
    deg = Number(first.text);
    if (!Number.isFinite(deg)) return fail('right ascension is not a number');
    if (deg >= 360) return fail('right ascension in degrees must be below 360');
  } else if (first.unit === 'd') {
    const v = combine(parts, ['d']);
    if (typeof v === 'string') return fail(`right ascension ${v}`);
    if (v >= 360) return fail('right ascension in degrees must be below 360');
    deg = v;
  } else {
    const v = combine(parts, ['h']);
    if (typeof v === 'string') return fail(`right ascension ${v}`);
    if (Number(first.text) >= 24 || v >= 24) return fail('right ascension in hours must be below 24h');
    deg = v * 15;
  }
  if (deg >= 360) deg -= 360;
  return { ok: true, value: deg };
}

/** Declination → degrees in [−90, 90]. The sign applies to the whole angle ("-0 30 00" is −0.5°). */
export function parseDec(input: string): AngleResult {
  const r = scan(input);
  if (typeof r === 'string') return fail(`declination ${r}`);
  const { parts, sign } = r;
  if (parts.some((p) => p.unit === 'h')) return fail('declination cannot be given in hours');
  let deg: number;
  if (parts.length === 1) {
    if (parts[0]!.unit !== null && parts[0]!.unit !== 'd') return fail(`declination has the unit mark "${parts[0]!.unit}" out of place`);
    deg = Number(parts[0]!.text);
    if (!Number.isFinite(deg)) return fail('declination is not a number');
  } else {
    const v = combine(parts, ['d']);
    if (typeof v === 'string') return fail(`declination ${v}`);
    deg = v;
  }
  if (deg > 90) return fail('declination must be between -90 and +90 degrees');
  return { ok: true, value: sign * deg };
}

function pad(n: number, width: number, decimals = 0): string {
  const s = decimals > 0 ? n.toFixed(decimals) : String(Math.round(n));
  const [i, f] = s.split('.');
  return (i!.padStart(width, '0')) + (f !== undefined ? `.${f}` : '');
}

/** Degrees → "hh mm ss.s" (hours). */
export function formatRaHms(deg: number, secDecimals = 2, sep: [string, string, string] = ['h', 'm', 's']): string {
  const scale = 10 ** secDecimals;
  let total = Math.round((((deg % 360) + 360) % 360) / 15 * 3600 * scale); // in units of 1/scale s
  total %= 24 * 3600 * scale;
  const h = Math.floor(total / (3600 * scale));
  total -= h * 3600 * scale;
  const m = Math.floor(total / (60 * scale));
  total -= m * 60 * scale;
  const s = total / scale;
  return `${pad(h, 2)}${sep[0]}${pad(m, 2)}${sep[1]}${pad(s, 2, secDecimals)}${sep[2]}`;
}

/** Degrees → "±dd°mm′ss.s″". */
export function formatDecDms(deg: number, secDecimals = 1, sep: [string, string, string] = ['°', '′', '″']): string {
  const sign = deg < 0 ? '-' : '+';
  const scale = 10 ** secDecimals;
  let total = Math.round(Math.abs(deg) * 3600 * scale);
  const d = Math.floor(total / (3600 * scale));
  total -= d * 3600 * scale;
  const m = Math.floor(total / (60 * scale));
  total -= m * 60 * scale;
  const s = total / scale;
  return `${sign}${pad(d, 2)}${sep[0]}${pad(m, 2)}${sep[1]}${pad(s, 2, secDecimals)}${sep[2]}`;
}
