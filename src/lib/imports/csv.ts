/**
 * Reading uploaded CSV (RFC 4180, UTF-8) into rows that remember their line numbers. Pure.
 * Decoding is strict: a file that is not valid UTF-8 (e.g. Latin-1 bytes) or that looks binary is refused
 * as a whole rather than half-read.
 */
import Papa from 'papaparse';

export const MAX_IMPORT_BYTES = 5 * 1024 * 1024;

/** A problem with one row (line is 1-based, the header is line 1); `field` names the column when known. */
export interface RowError {
  line: number;
  field?: string;
  message: string;
}

/** A problem with the file as a whole (encoding, binary content, missing columns). */
export class FileError extends Error {
  constructor(
    public readonly code: 'encoding' | 'binary' | 'missing_columns' | 'empty' | 'too_many_rows' | 'malformed',
    message: string,
    public readonly field?: string,
  ) {
    super(message);
  }
}

export interface CsvRow {
  line: number;
  fields: string[];
  /** Quoting problems papaparse found in this row. */
  errors: string[];
}

/** Bytes → text. Throws FileError('binary') for NUL or other control bytes, FileError('encoding') for invalid UTF-8. */
export function decodeUtf8(bytes: Uint8Array): string {
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i]!;
    // NUL and the C0 controls other than tab, LF, CR, form feed never occur in a text CSV.
    if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d && b !== 0x0c) {
      throw new FileError('binary', 'The file looks binary (it contains control bytes); upload a UTF-8 CSV text file.');
    }
  }
  try {
    // TextDecoder drops a leading byte-order mark by default.
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new FileError('encoding', 'The file is not valid UTF-8; save it as "CSV UTF-8" and upload it again.');
  }
}

/** Text → rows with 1-based physical line numbers (a quoted field may span lines). Blank lines are skipped. */
export function readCsv(text: string): CsvRow[] {
  const normalised = text.replace(/\r\n?/g, '\n');
  // Line start offsets, to turn papaparse's character cursor into a line number.
  const lineStarts: number[] = [0];
  for (let i = 0; i < normalised.length; i++) if (normalised.charCodeAt(i) === 10) lineStarts.push(i + 1);
  const lineAt = (offset: number): number => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  };
  const rows: CsvRow[] = [];
  let start = 0;
  Papa.parse<string[]>(normalised, {
    delimiter: ',',
    newline: '\n',
    quoteChar: '"',
    escapeChar: '"',
    header: false,
    skipEmptyLines: false,
    step: (result) => {
      const fields = result.data;
      const line = lineAt(start);
      start = result.meta.cursor;
      if (fields.length === 1 && fields[0]!.trim() === '') return;
      const errors = [...new Set(result.errors.map((e) => e.message))];
      rows.push({ line, fields, errors });
    },
  });
  return rows;
}

/** Normalises a header cell: trimmed, lower case, spaces and dashes to underscores. */
export const headerKey = (s: string) => s.trim().toLowerCase().replace(/[\s-]+/g, '_');

/** Parses an optional plain decimal number ("" → undefined). */
export function parseNumber(s: string): number | undefined | null {
  const t = s.trim();
  if (t === '') return undefined;
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(t.replace(/\u2212/g, '-'))) return null;
  return Number(t.replace(/\u2212/g, '-'));
}
