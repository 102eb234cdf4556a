/**
 * Constellation lookups 30″ and 5″ either side of IAU boundaries (Delporte 1930, CDS VI/42, defined in the mean
 * equator and equinox of B1875.0). Check values: tests/reference/constellations.json from
 * tests/reference/constellations.py (points made in B1875 and precessed to J2000 with ERFA pmat76; the
 * expected name is the boundary table's answer at the B1875 point). 320 points, 40 boundary edges.
 */
import { describe, expect, it } from 'vitest';
import ref from '../../reference/constellations.json';
import { constellationOf } from '../../../src/lib/sky/constellation';

describe('constellation boundaries (IAU, B1875)', () => {
  it('every point within 1′ of an edge falls in the constellation on its side', () => {
    const wrong = ref.points
      .filter((p) => constellationOf(p.ra, p.dec).abbr !== p.constellation)
      .map((p) => `${p.ra.toFixed(4)} ${p.dec.toFixed(4)}: ${constellationOf(p.ra, p.dec).abbr} ≠ ${p.constellation}`);
    expect(ref.points.length).toBeGreaterThan(100);
    expect(wrong).toEqual([]);
  });

  it('the pairs straddle real edges (each pair names two constellations at least once in ten)', () => {
    let differ = 0;
    for (let i = 0; i + 1 < ref.points.length; i += 2) if (ref.points[i]!.constellation !== ref.points[i + 1]!.constellation) differ++;
    expect(differ).toBeGreaterThan(ref.points.length / 20);
  });
});
