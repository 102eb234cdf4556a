/**
 * Place search and time-zone lookup (API contract, fixed): `GET /api/places?q=&limit=` and
 * `GET /api/places/zone?lat=&lon=`. Pure shapes shared by the routes, the browser and the API description.
 */
import { z } from 'zod';

/** A query-string number: '' and absent are "missing", anything else must parse completely. */
const numberIn = (min: number, max: number, range: string) =>
  z.number({ invalid_type_error: 'must be a number', required_error: 'is required' }).finite('must be a finite number').min(min, range).max(max, range);
const fromQuery = (v: unknown) => (v === undefined || v === '' ? undefined : typeof v === 'string' ? Number(v.trim()) : v);
const queryNumber = (min: number, max: number, range: string) => z.preprocess(fromQuery, numberIn(min, max, range));

export const PLACES_MAX_LIMIT = 50;

export const placesQuerySchema = z.object({
  q: z
    .string({ required_error: 'is required' })
    .trim()
    .min(1, 'must not be empty')
    .max(100, 'must be at most 100 characters'),
  /** Default 10. */
  limit: z.preprocess(fromQuery, numberIn(1, PLACES_MAX_LIMIT, `must be between 1 and ${PLACES_MAX_LIMIT}`).int('must be a whole number').optional()),
});
export type PlacesQuery = z.infer<typeof placesQuerySchema>;

export const zoneQuerySchema = z.object({
  lat: queryNumber(-90, 90, 'must be between -90 and 90'),
  lon: queryNumber(-180, 180, 'must be between -180 and 180 (east positive)'),
});

export const placeSchema = z.object({
  name: z.string(),
  /** ISO 3166-1 alpha-2 code, as GeoNames gives it. */
  country: z.string(),
  countryName: z.string(),
  /** First-level division (state, province, region). */
  admin: z.string(),
  lat: z.number(),
  lon: z.number(),
  /** Metres above sea level, where the data has a height (the packaged GeoNames extract has none). */
  height: z.number().optional(),
  /** IANA zone derived from the coordinates. */
  timeZone: z.string(),
  population: z.number().int(),
  geonamesId: z.number().int(),
});
export type Place = z.infer<typeof placeSchema>;

export const placesResponseSchema = z.object({ places: z.array(placeSchema) });
export const zoneResponseSchema = z.object({ timeZone: z.string() });

/** The credit the GeoNames licence (CC BY 4.0) asks for, shown beside every place search. */
export const GEONAMES_CREDIT = {
  text: 'Places from GeoNames',
  url: 'https://www.geonames.org/',
  licence: 'CC BY 4.0',
  licenceUrl: 'https://creativecommons.org/licenses/by/4.0/',
} as const;
