import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvField, fixed, toCsv } from '../../../src/lib/exports/csv';

describe('RFC 4180 writer', () => {
  it('quotes fields with commas, quotes and line breaks, doubling quotes (RFC 4180 §2.6–2.7)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField(null)).toBe('');
    expect(csvField(-16.5)).toBe('-16.5');
    expect(csvField(Number.NaN)).toBe('');
  });
  it('defuses spreadsheet formulas in text cells (OWASP CSV injection guidance)', () => {
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('@sum')).toBe("'@sum");
    expect(csvField('-0.5')).toBe('-0.5');
  });
  it('defuses cells that only start like a number (issue 17 finding 8; OWASP: = + - @ tab CR)', () => {
    expect(csvField("-2+3+cmd|' /C calc'!A0")).toBe(`'-2+3+cmd|' /C calc'!A0`);
    expect(csvField("+1+cmd|' /C calc'!A0")).toBe(`'+1+cmd|' /C calc'!A0`);
    expect(csvField('\t=1+1')).toBe(`'\t=1+1`);
    expect(csvField('\r=1+1')).toBe(`"'\r=1+1"`);
    expect(csvField('-1e5')).toBe('-1e5');
    expect(csvField('+12')).toBe('+12');
    expect(csvField('-')).toBe("'-");
    expect(csvField('Alpha -2')).toBe('Alpha -2');
  });
  it('uses CRLF line ends and round-trips through a standard parser', () => {
    const text = toCsv(['name', 'notes', 'alt'], [
      ['A, the first', 'line1\nline2', 12.5],
      ['B "quoted"', '', null],
    ]);
    expect(text.split('\r\n')[0]).toBe('name,notes,alt');
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<string[]>(text.trimEnd(), { newline: '\r\n' }).data;
    expect(parsed).toEqual([
      ['name', 'notes', 'alt'],
      ['A, the first', 'line1\nline2', '12.5'],
      ['B "quoted"', '', ''],
    ]);
  });
  it('fixed() rounds without binary noise', () => {
    expect(fixed(20.2797891234, 6)).toBe(20.279789);
    expect(fixed(null, 3)).toBeNull();
    expect(fixed(Infinity, 3)).toBeNull();
  });
});
