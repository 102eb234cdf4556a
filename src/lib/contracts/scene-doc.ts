/**
 * The scene document shared by the server (validation, storage) and the client (editor, view).
 * Pure: zod only. Angles in degrees, times ISO 8601 UTC.
 */
import { boundedArray } from '../bounded-array';
import { z } from 'zod';
import { DEFAULT_LAYERS, LAYER_KEYS, type LayerKey } from './layers';

export const isoUtc = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]00:?00)$/, 'must be an ISO 8601 UTC time such as 2026-03-20T19:30:00Z')
  .refine((s) => !Number.isNaN(Date.parse(s)), 'is not a real date')
  // Date.parse rolls 2026-02-30 over to 2 March; only UTC offsets are allowed, so the date must round-trip.
  .refine((s) => Number.isNaN(Date.parse(s)) || new Date(s).toISOString().slice(0, 10) === s.slice(0, 10), 'is not a real date')
  .describe('ISO 8601 instant in UTC, e.g. 2026-03-20T19:30:00Z');

/** Zones found valid so far: building an Intl.DateTimeFormat costs more than the rest of a scene's check. */
const knownZones = new Set<string>();
const KNOWN_ZONES_MAX = 2000;

export const timeZone = z.string().min(1).max(64).refine((tz) => {
  if (knownZones.has(tz)) return true;
  try {
    new Intl.DateTimeFormat('en', { timeZone: tz });
  } catch {
    return false;
  }
  if (knownZones.size < KNOWN_ZONES_MAX) knownZones.add(tz);
  return true;
}, 'must be an IANA time zone such as Europe/Madrid');

/**
 * IERS Earth orientation for pointing: UT1 − UTC (s), polar motion xp, yp (″), the date they apply to and
 * where they came from (e.g. "IERS Bulletin A 2026-12-03"). Optional; without it all three are zero.
 */
export const earthOrientationSchema = z.object({
  dut1: z.number().gt(-1, 'UT1 − UTC must be within ±1 s').lt(1, 'UT1 − UTC must be within ±1 s'),
  xp: z.number().min(-2, 'polar motion must be within ±2″').max(2, 'polar motion must be within ±2″'),
  yp: z.number().min(-2, 'polar motion must be within ±2″').max(2, 'polar motion must be within ±2″'),
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date such as 2026-12-03'),
  source: z.string().trim().min(1).max(200),
});
export type EarthOrientation = z.infer<typeof earthOrientationSchema>;

export const siteSchema = z.object({
  name: z.string().trim().min(1).max(120),
  lat: z.number().min(-90).max(90),
  lon: z.number().min(-180).max(180),
  height: z.number().min(-500).max(9000).default(0),
  timeZone: timeZone.default('UTC'),
  earthOrientation: earthOrientationSchema.optional(),
});
export type Site = z.infer<typeof siteSchema>;

export { DEFAULT_LAYERS, LAYER_KEYS, type LayerKey };

export const layersSchema = z
  .object({
    ...Object.fromEntries(LAYER_KEYS.map((k) => [k, z.boolean()])) as Record<LayerKey, z.ZodBoolean>,
    limitingMagnitude: z.number().min(-2).max(8),
  })
  .partial();
export type Layers = z.infer<typeof layersSchema>;

export const cameraSchema = z.object({
  mode: z.enum(['observer', 'sphere']).default('observer'),
  /** Direction looked at (observer view) or seen from (sphere view), horizontal frame. */
  azDeg: z.number().min(0).max(360).default(180),
  altDeg: z.number().min(-90).max(90).default(20),
  fovDeg: z.number().min(5).max(150).default(90),
});
export type Camera = z.infer<typeof cameraSchema>;

export const BODY_NAMES = ['sun', 'moon', 'mercury', 'venus', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune'] as const;

export const targetSchema = z.discriminatedUnion('kind', [
  z.object({ id: z.string().min(1).max(40), kind: z.literal('star'), name: z.string().trim().min(1).max(120), hr: z.number().int().min(1).max(9110), notes: z.string().max(2000).optional() }),
  z.object({ id: z.string().min(1).max(40), kind: z.literal('body'), name: z.string().trim().min(1).max(120), body: z.enum(BODY_NAMES), notes: z.string().max(2000).optional() }),
  z.object({
    id: z.string().min(1).max(40),
    kind: z.literal('custom'),
    name: z.string().trim().min(1).max(120),
    /** ICRS/J2000 degrees. */
    ra: z.number().min(0).lt(360),
    dec: z.number().min(-90).max(90),
    epoch: z.number().min(1800).max(2200).optional(),
    /** Proper motion, mas/yr (μα* = μα cos δ). */
    pmra: z.number().min(-20000).max(20000).optional(),
    pmdec: z.number().min(-20000).max(20000).optional(),
    /** Parallax, mas; radial velocity, km/s. */
    parallax: z.number().min(0).max(1000).optional(),
    radialVelocity: z.number().min(-3000).max(3000).optional(),
    notes: z.string().max(2000).optional(),
  }),
]);
export type Target = z.infer<typeof targetSchema>;

/** Pins live in a named frame: horizontal pins stay on the landscape, equatorial pins turn with the sky. */
export const pinSchema = z.object({
  id: z.string().min(1).max(40),
  kind: z.enum(['label', 'arrow', 'arc', 'region']),
  frame: z.enum(['horizontal', 'equatorial']),
  /** [azimuth, altitude] (horizontal) or [ra, dec] (equatorial), degrees; label 1 point, arrow/arc ≥ 2, region ≥ 3. */
  points: boundedArray(z.tuple([z.number().min(0).max(360), z.number().min(-90).max(90)]), 64).refine((p) => p.length >= 1, 'needs at least one point'),
  label: z.string().max(200).default(''),
  color: z.string().regex(/^#[0-9a-fA-F]{6}$/).optional(),
});
export type Pin = z.infer<typeof pinSchema>;

export const stepSchema = z.object({
  id: z.string().min(1).max(40),
  title: z.string().max(120).default(''),
  time: isoUtc,
  camera: cameraSchema.partial().optional(),
  layers: layersSchema.optional(),
  /** Markdown, rendered without HTML. */
  caption: z.string().max(10_000).default(''),
  pinId: z.string().max(40).nullable().optional(),
});
export type Step = z.infer<typeof stepSchema>;
