/**
 * Horizon-mask CSV → [[azimuth, elevation], ...] sorted by azimuth from north through east. Pure.
 *
 * Columns: azimuth, elevation (header "azimuth,elevation"; "az"/"alt"/"altitude" are accepted as well;
 * a file whose first line is already numeric is read as azimuth,elevation without a header).
 * The importer must say which azimuth convention it assumes, so the caller picks one:
 *   north-east  azimuth from north through east, 0..360 (the product's own convention; default)
 *   south       azimuth from south through west, 0..360, as some survey tools give: A_N = (A_S + 180) mod 360
 *   signed      −180..180 from north, east positive: A_N = (A + 360) mod 360
 * Elevation is the apparent altitude of the skyline in degrees (−90..90).
 */
import { decodeUtf8, FileError, headerKey, parseNumber, readCsv, type RowError } from './csv';

export const HORIZON_CONVENTIONS = ['north-east', 'south', 'signed'] as const;
export type HorizonConvention = (typeof HORIZON_CONVENTIONS)[number];
export const MAX_HORIZON_POINTS = 3600;

export interface HorizonCsvResult {
  mask: [number, number][];
  errors: RowError[];
}

const AZ_KEYS = new Set(['azimuth', 'az', 'azimuth_deg', 'az_deg']);
const EL_KEYS = new Set(['elevation', 'el', 'altitude', 'alt', 'elevation_deg', 'alt_deg']);

/** Converts an azimuth in `convention` to degrees from north through east in [0, 360). */
export function toNorthEast(az: number, convention: HorizonConvention): number {
  const wrap = (a: number) => ((a % 360) + 360) % 360;
  switch (convention) {
    case 'north-east':
      return wrap(az);
    case 'south':
      return wrap(az + 180);
    case 'signed':
      return wrap(az + 360);
  }
}

function azRange(convention: HorizonConvention): [number, number] {
  return convention === 'signed' ? [-180, 180] : [0, 360];
}

export function parseHorizonCsv(input: Uint8Array | string, convention: HorizonConvention = 'north-east'): HorizonCsvResult {
  const text = typeof input === 'string' ? input : decodeUtf8(input);
  const csv = readCsv(text);
  if (csv.length === 0) throw new FileError('empty', 'The file is empty; expected lines "azimuth,elevation".');
  let azIdx = 0;
  let elIdx = 1;
  let width = 2;
  let data = csv;
  const first = csv[0]!;
  if (parseNumber(first.fields[0] ?? '') === null || (first.fields[0] ?? '').trim() === '') {
    const keys = first.fields.map(headerKey);
    azIdx = keys.findIndex((k) => AZ_KEYS.has(k));
    elIdx = keys.findIndex((k) => EL_KEYS.has(k));
    if (azIdx < 0 || elIdx < 0) {
      const missing = [azIdx < 0 ? 'azimuth' : null, elIdx < 0 ? 'elevation' : null].filter(Boolean) as string[];
      throw new FileError('missing_columns', `Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}. The header line must be "azimuth,elevation".`, missing[0]);
    }
    width = keys.length;
    data = csv.slice(1);
  }
  if (data.length === 0) throw new FileError('empty', 'The file has no points.');
  if (data.length > MAX_HORIZON_POINTS) throw new FileError('too_many_rows', `The file has ${data.length} points; at most ${MAX_HORIZON_POINTS} are accepted.`);

  const [lo, hi] = azRange(convention);
  const errors: RowError[] = [];
  const points: { az: number; el: number; line: number }[] = [];
  for (const r of data) {
    const before = errors.length;
    const err = (message: string, field?: string) => errors.push({ line: r.line, ...(field ? { field } : {}), message });
    if (r.errors.length) err(`CSV quoting: ${r.errors[0]}`);
    else if (r.fields.length !== width) err(`expected ${width} fields, found ${r.fields.length}`);
    if (errors.length > before) continue;
    const azText = (r.fields[azIdx] ?? '').trim();
    const elText = (r.fields[elIdx] ?? '').trim();
    const az = parseNumber(azText);
    const el = parseNumber(elText);
    if (az === undefined) err('azimuth is empty', 'azimuth');
    else if (az === null) err(`azimuth "${azText}" is not a number (degrees)`, 'azimuth');
    else if (az < lo || az > hi) err(`azimuth ${az} is outside ${lo}..${hi} for the "${convention}" convention`, 'azimuth');
    if (el === undefined) err('elevation is empty', 'elevation');
    else if (el === null) err(`elevation "${elText}" is not a number (degrees)`, 'elevation');
    else if (el < -90 || el > 90) err(`elevation ${el} is outside -90..90`, 'elevation');
    if (errors.length === before) points.push({ az: toNorthEast(az!, convention), el: el!, line: r.line });
  }
  points.sort((a, b) => a.az - b.az || a.line - b.line);
  const mask: [number, number][] = [];
  const lineOf: number[] = [];
  for (const p of points) {
    const k = mask.length - 1;
    if (k >= 0 && Math.abs(mask[k]![0] - p.az) < 1e-9) {
      // 0° and 360° (or −180° and 180°) name the same direction: fine when they agree.
      if (Math.abs(mask[k]![1] - p.el) > 1e-9) {
        errors.push({ line: p.line, field: 'azimuth', message: `azimuth ${p.az}° (north-east) is given twice with different elevations (see line ${lineOf[k]})` });
      }
      continue;
    }
    mask.push([Math.round(p.az * 1e9) / 1e9, p.el]);
    lineOf.push(p.line);
  }
  errors.sort((a, b) => a.line - b.line);
  return { mask: errors.length ? [] : mask, errors };
}
