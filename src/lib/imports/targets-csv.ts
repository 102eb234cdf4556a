/**
 * Target-list CSV → validated custom targets, all or nothing. Pure.
 *
 * Columns (header required, any order, case-insensitive): name, ra, dec; optional epoch, pmra, pmdec, notes.
 * Other columns are ignored and reported. RA/Dec accept degrees or sexagesimal (see ./angles).
 * epoch: a year such as 2000, J2000 or J2015.5 (the epoch of the position, for proper motion).
 * pmra (μα* = μα cos δ) and pmdec in mas/yr.
 */
import { parseDec, parseRa, type AngleResult } from './angles';
import { decodeUtf8, FileError, headerKey, parseNumber, readCsv, type RowError } from './csv';

export const TARGET_COLUMNS = ['name', 'ra', 'dec', 'epoch', 'pmra', 'pmdec', 'notes'] as const;
export const REQUIRED_TARGET_COLUMNS = ['name', 'ra', 'dec'] as const;
type Column = (typeof TARGET_COLUMNS)[number];

export interface ParsedTarget {
  name: string;
  ra: number;
  dec: number;
  epoch?: number;
  pmra?: number;
  pmdec?: number;
  notes?: string;
}

export interface TargetRow {
  line: number;
  /** The name as typed (trimmed), even when the row is bad. */
  name: string;
  ra: number | null;
  dec: number | null;
  target: ParsedTarget | null;
  errors: RowError[];
}

export interface TargetCsvResult {
  rows: TargetRow[];
  /** Every row error, in line order. Empty when the import may proceed. */
  errors: RowError[];
  ignoredColumns: string[];
}

export interface TargetCsvOptions {
  /** Names already in the scene (compared case-insensitively, trimmed). */
  existingNames?: Iterable<string>;
  /** Most data rows accepted (the scene's target limit minus targets already there). */
  maxRows?: number;
}

const nameKey = (s: string) => s.trim().toLowerCase();

function parseEpoch(s: string): number | undefined | null {
  const t = s.trim().replace(/^J/i, '');
  if (t === '') return undefined;
  const n = parseNumber(t);
  if (n === null || n === undefined || n < 1800 || n > 2200) return null;
  return n;
}

/** Parses a whole upload. Throws FileError for file-level problems; row problems come back in `errors`. */
export function parseTargetCsv(input: Uint8Array | string, opts: TargetCsvOptions = {}): TargetCsvResult {
  const text = typeof input === 'string' ? input : decodeUtf8(input);
  const csv = readCsv(text);
  if (csv.length === 0) throw new FileError('empty', 'The file is empty; expected a header line "name,ra,dec" and one row per target.');
  const header = csv[0]!;
  const keys = header.fields.map(headerKey);
  const index = new Map<Column, number>();
  const ignoredColumns: string[] = [];
  keys.forEach((k, i) => {
    if ((TARGET_COLUMNS as readonly string[]).includes(k)) {
      if (index.has(k as Column)) throw new FileError('malformed', `The column "${k}" appears twice in the header.`, k);
      index.set(k as Column, i);
    } else if (k !== '') ignoredColumns.push(header.fields[i]!.trim());
  });
  const missing = REQUIRED_TARGET_COLUMNS.filter((c) => !index.has(c));
  if (missing.length) {
    throw new FileError(
      'missing_columns',
      `Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}. The header line must name at least name, ra, dec.`,
      missing[0],
    );
  }
  const dataRows = csv.slice(1);
  if (dataRows.length === 0) throw new FileError('empty', 'The file has a header but no targets.');
  if (opts.maxRows !== undefined && dataRows.length > opts.maxRows) {
    throw new FileError('too_many_rows', `The file has ${dataRows.length} targets; at most ${opts.maxRows} can be added to this scene.`);
  }

  const existing = new Set([...(opts.existingNames ?? [])].map(nameKey));
  const seen = new Map<string, number>();
  const rows: TargetRow[] = [];
  for (const r of dataRows) {
    const errors: RowError[] = [];
    const err = (message: string, field?: Column) => errors.push({ line: r.line, ...(field ? { field } : {}), message });
    const cell = (c: Column) => {
      const i = index.get(c);
      return i === undefined ? '' : (r.fields[i] ?? '');
    };
    // A row whose structure is broken gets one error: its cells cannot be trusted field by field.
    if (r.errors.length) err(`CSV quoting: ${r.errors[0]} (a field with a comma, quote or line break must be wrapped in double quotes, and a quote inside it doubled)`);
    else if (r.fields.length !== keys.length) err(`expected ${keys.length} fields as in the header, found ${r.fields.length}`);
    if (errors.length) {
      rows.push({ line: r.line, name: (r.fields[index.get('name')!] ?? '').trim(), ra: null, dec: null, errors, target: null });
      continue;
    }

    const name = cell('name').trim();
    if (name === '') err('name is empty', 'name');
    else if (name.length > 120) err('name is longer than 120 characters', 'name');
    else if (existing.has(nameKey(name))) err(`a target named "${name}" is already in the scene`, 'name');
    else if (seen.has(nameKey(name))) err(`duplicate name "${name}" (also on line ${seen.get(nameKey(name))})`, 'name');
    if (name !== '' && !seen.has(nameKey(name))) seen.set(nameKey(name), r.line);

    const angle = (c: 'ra' | 'dec', parse: (text: string) => AngleResult): number | null => {
      const text = cell(c);
      if (text.trim() === '') {
        err(`${c} is empty`, c);
        return null;
      }
      const p = parse(text);
      if (p.ok) return p.value;
      err(`${c} "${text.trim()}": ${p.message}`, c);
      return null;
    };
    const ra = angle('ra', parseRa);
    const dec = angle('dec', parseDec);
    const epoch = parseEpoch(cell('epoch'));
    if (epoch === null) err(`epoch "${cell('epoch').trim()}" must be a year between 1800 and 2200, such as 2000 or J2000`, 'epoch');
    const pm = (c: 'pmra' | 'pmdec') => {
      const v = parseNumber(cell(c));
      if (v === null) err(`${c} "${cell(c).trim()}" is not a number (mas/yr)`, c);
      else if (v !== undefined && Math.abs(v) > 20000) err(`${c} must be within ±20000 mas/yr`, c);
      return v ?? undefined;
    };
    const pmra = pm('pmra');
    const pmdec = pm('pmdec');
    const notes = cell('notes').trim();
    if (notes.length > 2000) err('notes are longer than 2000 characters', 'notes');

    const ok = errors.length === 0 && ra !== null && dec !== null;
    rows.push({
      line: r.line,
      name,
      ra,
      dec,
      errors,
      target: ok
        ? {
            name,
            ra: ra!,
            dec: dec!,
            ...(epoch !== undefined && epoch !== null ? { epoch } : {}),
            ...(pmra !== undefined ? { pmra } : {}),
            ...(pmdec !== undefined ? { pmdec } : {}),
            ...(notes ? { notes } : {}),
          }
        : null,
    });
  }
  return { rows, errors: rows.flatMap((r) => r.errors), ignoredColumns };
}
