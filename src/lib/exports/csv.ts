/** RFC 4180 CSV writing: CRLF line ends, fields quoted when they hold a comma, quote, CR or LF. Pure. */

export type Cell = string | number | boolean | null | undefined;

/** Characters that make a spreadsheet treat a cell as a formula (CSV injection; OWASP "CSV Injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;
/** A whole cell that is a plain decimal number ("-12.5", "+3", "1e-7") is left as it is. */
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

export function csvField(value: Cell): string {
  if (value === null || value === undefined) return '';
  let s = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : String(value);
  // A text cell starting like a formula is prefixed with an apostrophe so spreadsheets show it as text,
  // unless the whole cell is a plain number ("-2+3+cmd|…" starts like one but is not).
  if (typeof value === 'string' && FORMULA_START.test(s) && !PLAIN_NUMBER.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvLine(cells: Cell[]): string {
  return cells.map(csvField).join(',');
}

export function toCsv(header: string[], rows: Cell[][]): string {
  return [csvLine(header), ...rows.map(csvLine)].join('\r\n') + '\r\n';
}

/** Rounds to a fixed number of decimals and drops the binary noise ("20.279789" not "20.279789000000001"). */
export function fixed(n: number | null | undefined, decimals: number): number | null {
  if (n === null || n === undefined || !Number.isFinite(n)) return null;
  return Number(n.toFixed(decimals));
}
