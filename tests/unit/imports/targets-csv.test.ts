import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FileError } from '../../../src/lib/imports/csv';
import { parseTargetCsv } from '../../../src/lib/imports/targets-csv';

const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../../fixtures/imports/${name}`, import.meta.url)));
const fileError = (fn: () => unknown): FileError => {
  try {
    fn();
  } catch (e) {
    if (e instanceof FileError) return e;
    throw e;
  }
  throw new Error('expected a FileError');
};

describe('parseTargetCsv — good file', () => {
  const r = parseTargetCsv(fixture('targets-good.csv'));
  it('reads every row without errors', () => {
    expect(r.errors).toEqual([]);
    expect(r.rows.map((x) => x.name)).toEqual(['Arcturus', 'Spica', 'Sirius', 'Field A', 'Calibration lamp']);
  });
  it('converts positions to degrees (Meeus Ex. 17.a positions)', () => {
    const arcturus = r.rows[0]!.target!;
    expect(arcturus.ra).toBeCloseTo((14 + 15 / 60 + 39.7 / 3600) * 15, 9);
    expect(arcturus.dec).toBeCloseTo(19 + 10 / 60 + 57 / 3600, 9);
    expect(arcturus.epoch).toBe(2000);
    const spica = r.rows[1]!.target!;
    expect(spica.dec).toBeCloseTo(-(11 + 9 / 60 + 41 / 3600), 9);
  });
  it('keeps proper motions, quoted notes with quotes, commas and line breaks', () => {
    const sirius = r.rows[2]!.target!;
    expect(sirius.pmra).toBe(-546.01);
    expect(sirius.pmdec).toBe(-1223.07);
    expect(sirius.notes).toBe('Brightest star; pm from Hipparcos, "new reduction"');
    expect(r.rows[3]!.target!.notes).toBe('dark-sky patch, for the\nvolunteers');
    expect(r.rows[3]!.target!.dec).toBe(-0.5);
  });
  it('numbers lines physically (header = 1; a quoted line break advances the count)', () => {
    expect(r.rows.map((x) => x.line)).toEqual([2, 3, 4, 5, 7]);
  });
});

describe('parseTargetCsv — sexagesimal variants', () => {
  const r = parseTargetCsv(fixture('targets-sexagesimal.csv'));
  it('all spellings agree', () => {
    expect(r.errors).toEqual([]);
    const arcturus = r.rows.filter((x) => !/zero|minus/.test(x.name));
    for (const row of arcturus) {
      expect(row.target!.ra, row.name).toBeCloseTo(213.9154167, 6);
      expect(row.target!.dec, row.name).toBeCloseTo(19.1825, 6);
    }
    const neg = r.rows.filter((x) => /zero|minus/.test(x.name));
    expect(neg).toHaveLength(3);
    for (const row of neg) {
      expect(row.target!.ra).toBe(180);
      expect(row.target!.dec, row.name).toBe(-0.5);
    }
  });
});

describe('parseTargetCsv — refusals', () => {
  it('Latin-1 bytes are a wrong encoding', () => {
    expect(fileError(() => parseTargetCsv(fixture('targets-latin1.csv'))).code).toBe('encoding');
  });
  it('binary junk is refused as binary', () => {
    expect(fileError(() => parseTargetCsv(fixture('binary-junk.bin'))).code).toBe('binary');
  });
  it('a missing dec column is named', () => {
    const e = fileError(() => parseTargetCsv(fixture('targets-missing-columns.csv')));
    expect(e.code).toBe('missing_columns');
    expect(e.field).toBe('dec');
  });
  it('an empty file and a header-only file are refused', () => {
    expect(fileError(() => parseTargetCsv('')).code).toBe('empty');
    expect(fileError(() => parseTargetCsv('name,ra,dec\n')).code).toBe('empty');
  });
  it('too many rows for the scene are refused', () => {
    expect(fileError(() => parseTargetCsv('name,ra,dec\na,1,1\nb,2,2\n', { maxRows: 1 })).code).toBe('too_many_rows');
  });
  it('out-of-range values are row errors naming line and field', () => {
    const r = parseTargetCsv(fixture('targets-out-of-range.csv'));
    const byLine = new Map<number, string[]>();
    for (const e of r.errors) byLine.set(e.line, [...(byLine.get(e.line) ?? []), e.field ?? '']);
    expect(byLine.has(2)).toBe(false); // "Good one"
    expect(byLine.get(3)).toEqual(['ra']); // 24 00 00
    expect(byLine.get(4)).toEqual(['dec']); // +95
    expect(byLine.get(5)).toEqual(['ra']); // 10 60 00
    expect(byLine.get(6)).toEqual(['ra']); // 360°
    expect(byLine.get(7)).toEqual(['epoch']);
    expect(byLine.get(8)).toEqual(['pmra']);
    expect(byLine.get(9)).toEqual(['ra']); // negative
    expect(byLine.get(10)).toEqual(['name']);
    expect(byLine.get(11)).toEqual(['ra', 'dec']);
    expect(r.rows[0]!.target).not.toBeNull();
    expect(r.rows.slice(1).every((x) => x.target === null)).toBe(true);
  });
  it('duplicate names within the file and against the scene are flagged', () => {
    const r = parseTargetCsv(fixture('targets-duplicates.csv'));
    expect(r.errors).toEqual([{ line: 4, field: 'name', message: expect.stringMatching(/duplicate.*line 2/) }]);
    const r2 = parseTargetCsv(fixture('targets-duplicates.csv'), { existingNames: ['BETA'] });
    expect(r2.errors.map((e) => e.line)).toEqual([3, 4]);
    expect(r2.errors[0]!.message).toMatch(/already in the scene/);
  });
  it('rows with the wrong field count and bad quoting are row errors', () => {
    const r = parseTargetCsv('name,ra,dec\nA,1\nB,2,3,4\n"C"x,1,1\n');
    expect(r.errors.map((e) => e.line)).toEqual([2, 3, 4]);
    expect(r.errors[0]!.message).toMatch(/expected 3 fields/);
    expect(r.errors[2]!.message).toMatch(/quoting/);
  });
  it('ignores and reports unknown columns, accepts any column order and case', () => {
    const r = parseTargetCsv('Dec,Name,RA,mag\n10,X,20,5.5\n');
    expect(r.errors).toEqual([]);
    expect(r.rows[0]!.target).toEqual({ name: 'X', ra: 20, dec: 10 });
    expect(r.ignoredColumns).toEqual(['mag']);
  });
  it('a UTF-8 byte-order mark is not part of the first column name', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode('name,ra,dec\nÉtoile,1,2\n')]);
    expect(parseTargetCsv(bytes).rows[0]!.target).toEqual({ name: 'Étoile', ra: 1, dec: 2 });
  });
});
