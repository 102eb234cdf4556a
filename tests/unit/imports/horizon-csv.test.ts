import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FileError } from '../../../src/lib/imports/csv';
import { parseHorizonCsv, toNorthEast } from '../../../src/lib/imports/horizon-csv';

const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../../fixtures/imports/${name}`, import.meta.url)));
const EXPECTED: [number, number][] = [
  [0, 5],
  [90, 12.5],
  [180, 20],
  [270, 8],
];

describe('toNorthEast', () => {
  it('converts the three conventions', () => {
    // From south through west: A_N = (A_S + 180) mod 360 (the convention of Meeus, Astronomical Algorithms ch. 13).
    expect(toNorthEast(0, 'south')).toBe(180);
    expect(toNorthEast(68.0337, 'south')).toBeCloseTo(248.0337, 10); // Meeus Ex. 13.b: A = 68.0337° from S = 248.0337° from N
    expect(toNorthEast(270, 'south')).toBe(90);
    expect(toNorthEast(-90, 'signed')).toBe(270);
    expect(toNorthEast(180, 'signed')).toBe(180);
    expect(toNorthEast(-180, 'signed')).toBe(180);
    expect(toNorthEast(360, 'north-east')).toBe(0);
  });
});

describe('parseHorizonCsv', () => {
  it.each([
    ['horizon-north-east.csv', 'north-east'],
    ['horizon-south.csv', 'south'],
    ['horizon-signed.csv', 'signed'],
  ] as const)('%s in the %s convention gives the same sorted mask', (file, conv) => {
    const r = parseHorizonCsv(fixture(file), conv);
    expect(r.errors).toEqual([]);
    expect(r.mask).toEqual(EXPECTED);
  });
  it('reads a file without a header as azimuth,elevation', () => {
    expect(parseHorizonCsv('90,10\n0,3\n').mask).toEqual([
      [0, 3],
      [90, 10],
    ]);
  });
  it('accepts 0 and 360 with the same elevation, refuses them with different ones', () => {
    expect(parseHorizonCsv('azimuth,elevation\n0,5\n180,1\n360,5\n').mask).toEqual([
      [0, 5],
      [180, 1],
    ]);
    const r = parseHorizonCsv('azimuth,elevation\n0,5\n180,1\n360,6\n');
    expect(r.errors).toEqual([{ line: 4, field: 'azimuth', message: expect.stringMatching(/twice/) }]);
    expect(r.mask).toEqual([]);
  });
  it('reports row errors with line and field', () => {
    const r = parseHorizonCsv(fixture('horizon-bad.csv'));
    expect(r.errors.map((e) => [e.line, e.field])).toEqual([
      [3, 'azimuth'],
      [4, 'elevation'],
    ]);
    expect(r.mask).toEqual([]);
  });
  it('signed azimuths beyond ±180 are out of range; plain ones beyond 360 too', () => {
    expect(parseHorizonCsv('az,alt\n-190,3\n', 'signed').errors[0]!.field).toBe('azimuth');
    expect(parseHorizonCsv('az,alt\n-10,3\n', 'north-east').errors[0]!.field).toBe('azimuth');
    expect(parseHorizonCsv('az,alt\n10,91\n').errors[0]!.field).toBe('elevation');
  });
  it('refuses a header without an elevation column, binary junk and Latin-1', () => {
    const e = (() => {
      try {
        parseHorizonCsv('azimuth,height\n0,1\n');
      } catch (x) {
        return x as FileError;
      }
      return undefined;
    })();
    expect(e?.code).toBe('missing_columns');
    expect(e?.field).toBe('elevation');
    expect(() => parseHorizonCsv(fixture('binary-junk.bin'))).toThrow(FileError);
    expect(() => parseHorizonCsv(new Uint8Array([0x61, 0x7a, 0x2c, 0x65, 0x6c, 0x0a, 0x31, 0xe9, 0x2c, 0x32]))).toThrow(/UTF-8/);
  });
});
