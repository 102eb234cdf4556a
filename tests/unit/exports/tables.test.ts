import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { positionRows, positionsCsv, windowsCsv, POSITIONS_COLUMNS } from '../../../src/lib/exports/tables';
import { customPositionAt } from '../../../src/lib/exports/sky-targets';
import { e1Scene, SIRIUS_DEC, SIRIUS_RA } from './fixtures';
import stars from '../../reference/stars.json';

const ARCSEC = 1 / 3600;

describe('positions export', () => {
  const at = new Date('2024-01-15T22:00:00Z');
  const rows = positionRows(e1Scene(), at);
  it('matches ERFA atco13 for Sirius at E1 (reference-values.md: A 162.938748°, standard-refraction alt 20.279789°; ±5″)', () => {
    const s = rows[0]!;
    expect(Math.abs(s.azimuth - 162.938748)).toBeLessThan(5 * ARCSEC);
    expect(Math.abs(s.altitude - 20.279789)).toBeLessThan(5 * ARCSEC);
    expect(s.ra).toBeCloseTo(SIRIUS_RA, 9);
    expect(s.dec).toBeCloseTo(SIRIUS_DEC, 9);
    // Kasten & Young (1989) at h = 20.28°: X = 1/[cos z + 0.50572 (96.07995 − z)^−1.6364], z = 69.72° → 2.88 (derived).
    const z = 90 - s.altitude;
    const ky = 1 / (Math.cos((z * Math.PI) / 180) + 0.50572 * (96.07995 - z) ** -1.6364);
    expect(s.airmass!).toBeCloseTo(ky, 3);
    // Next upper culmination: 2024-01-15 23:06:38.6 UTC by ERFA atco13 (tests/reference/stars.py, case sirius-transit-e1); ±2 s.
    const transit = stars.cases.find((c) => c.id === 'sirius-transit-e1')!.instants[0]!.time;
    expect(Math.abs(Date.parse(s.nextTransit!) - Date.parse(transit))).toBeLessThan(2000);
    expect(s.insideEnvelope).toBeNull();
  });
  it('writes one RFC 4180 row a target, with the contract columns first', () => {
    const text = positionsCsv(e1Scene(), at);
    const parsed = Papa.parse<string[]>(text.trimEnd(), { newline: '\r\n' }).data;
    expect(parsed[0]).toEqual([...POSITIONS_COLUMNS]);
    expect(parsed).toHaveLength(4);
    expect(parsed[1]![0]).toBe('Sirius (E1)');
    expect(Number(parsed[1]![4])).toBeCloseTo(20.279789, 3);
  });
  it('evaluates the envelope (inside / outside with the violated limit)', () => {
    const r = positionRows(e1Scene({ envelope: { name: 'floor 30', minAltitude: 30 } }), at);
    expect(r[0]!.insideEnvelope).toBe(false);
    expect(r[0]!.violations).toEqual(['minAltitude']);
    const r2 = positionRows(e1Scene({ envelope: { name: 'floor 10', minAltitude: 10 } }), at);
    expect(r2[0]!.insideEnvelope).toBe(true);
  });
});

describe('windows export', () => {
  it('lists windows inside the envelope, and a no-window row with its reason', () => {
    const scene = e1Scene({ envelope: { name: 'floor 15', minAltitude: 15 } });
    const text = windowsCsv(scene, new Date('2024-01-15T18:00:00Z'), new Date('2024-01-16T06:00:00Z'));
    const rows = Papa.parse<string[]>(text.trimEnd(), { newline: '\r\n' }).data;
    expect(rows[0]).toEqual(['name', 'start', 'end', 'duration_min', 'opened_by', 'closed_by', 'note']);
    const sirius = rows.filter((r) => r[0] === 'Sirius (E1)');
    expect(sirius).toHaveLength(1);
    // Sirius reaches 15° a little before 21:00 UTC (E2: 10.63° at 20:00, E1: 20.28° at 22:00) and sets below 15° after 01:00.
    expect(sirius[0]![1]! > '2024-01-15T20:00:00Z' && sirius[0]![1]! < '2024-01-15T22:00:00Z').toBe(true);
    expect(sirius[0]![4]).toBe('minAltitude');
  });
});

describe('proper motion', () => {
  it('moves a position linearly from its epoch (Sirius pm −546.01, −1223.07 mas/yr; Hipparcos new reduction, from memory)', () => {
    const p = customPositionAt({ ra: SIRIUS_RA, dec: SIRIUS_DEC, pmra: -546.01, pmdec: -1223.07 }, new Date('2024-01-01T12:00:00Z'));
    const years = 24;
    expect((p.decDeg - SIRIUS_DEC) * 3600).toBeCloseTo((-1223.07 * years) / 1000, 1);
    expect((p.raDeg - SIRIUS_RA) * 3600 * Math.cos((SIRIUS_DEC * Math.PI) / 180)).toBeCloseTo((-546.01 * years) / 1000, 1);
  });
});
