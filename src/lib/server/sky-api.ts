/**
 * The sky computation API (contract: GET /api/sky/observe, GET /api/sky/events, POST /api/sky/windows):
 * zod schemas for the inputs and pure functions from validated input to the response body. The
 * routes in src/pages/api/sky/ only parse, rate-limit and call these.
 */
import { z } from 'zod';
import { BODY_NAMES, type BodyName } from '../sky/bodies';
import { observe, type Target } from '../sky/observe';
import { hasMotion, type SpaceMotion } from '../sky/motion';
import { skyEvents } from '../sky/events';
import { visibilityWindows, type WindowTarget } from '../sky/windows';
import { envelopeSchema } from '../contracts/envelope';
import { boundedArray } from '../bounded-array';
import { windowsGridStepSec } from '../sky/night';
import type { SiteInput } from '../sky/frames';

export const MAX_SPAN_DAYS = 31;
export const MAX_TARGETS = 2000;
/** ISO 8601 instant in UTC (`Z` or `+00:00`); a time without a zone is ambiguous and refused. */
export const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]00:?00)$/;

/** A query-string number: '' and absent are "missing", anything else must parse completely. */
const qNum = (min: number, max: number, what: string) =>
  z.preprocess(
    (v) => (v === undefined || v === '' ? undefined : typeof v === 'string' ? Number(v.trim()) : v),
    z.number({ invalid_type_error: `must be a number`, required_error: 'is required' }).finite('must be a finite number').min(min, `${what}`).max(max, `${what}`),
  );
const num = (min: number, max: number, what: string) =>
  z.number({ invalid_type_error: 'must be a number', required_error: 'is required' }).finite('must be a finite number').min(min, what).max(max, what);

const instant = z
  .string({ required_error: 'is required', invalid_type_error: 'must be an ISO 8601 UTC time' })
  .regex(ISO_UTC, 'must be an ISO 8601 UTC time such as 2026-03-20T19:30:00Z')
  .transform((s, ctx) => {
    const d = new Date(s);
    if (Number.isNaN(d.getTime())) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'is not a valid date' });
      return z.NEVER;
    }
    return d;
  })
  .describe('ISO 8601 instant in UTC, e.g. 2026-03-20T19:30:00Z');

const bodyEnum = z.enum(BODY_NAMES as unknown as [BodyName, ...BodyName[]], {
  errorMap: () => ({ message: `must be one of ${BODY_NAMES.join(', ')}` }),
});

const LAT = 'must be between -90 and 90';
const LON = 'must be between -180 and 360 (east positive)';
const HEIGHT = 'must be between -500 and 10000 m';
const RA = 'must be between 0 and 360 degrees';
const DEC = 'must be between -90 and 90 degrees';

const DUT1 = 'must be UT1 − UTC in seconds, between -1 and 1 (exclusive)';
const POLAR = 'must be polar motion in arcseconds, between -2 and 2';
const EPOCH = 'must be a Julian year between 1000 and 3000';
const PM = 'must be mas/yr, between -20000 and 20000';
const PLX = 'must be mas, between 0 and 1000';
const RV = 'must be km/s, between -3000 and 3000';

/** Earth orientation (IERS): UT1 − UTC and polar motion; defaults zero. */
const eopQuery = {
  dut1: qNum(-0.999999, 0.999999, DUT1).optional(),
  xp: qNum(-2, 2, POLAR).optional(),
  yp: qNum(-2, 2, POLAR).optional(),
};
const siteQuery = {
  lat: qNum(-90, 90, LAT),
  lon: qNum(-180, 360, LON),
  height: qNum(-500, 10000, HEIGHT).optional().default(0),
  ...eopQuery,
};
/** Space motion of an ra/dec target (ICRS at `epoch`). */
const MOTION_KEYS = ['epoch', 'pmra', 'pmdec', 'parallax', 'radialVelocity'] as const;
const motionQuery = {
  epoch: qNum(1000, 3000, EPOCH).optional(),
  pmra: qNum(-20000, 20000, PM).optional(),
  pmdec: qNum(-20000, 20000, PM).optional(),
  parallax: qNum(0, 1000, PLX).optional(),
  radialVelocity: qNum(-3000, 3000, RV).optional(),
};
const targetQuery = {
  ra: qNum(0, 360, RA).optional(),
  dec: qNum(-90, 90, DEC).optional(),
  body: z.preprocess((v) => (v === '' ? undefined : typeof v === 'string' ? v.toLowerCase() : v), bodyEnum.optional()),
  ...motionQuery,
};
type MotionFields = Partial<Record<(typeof MOTION_KEYS)[number], number>>;

function checkTarget(v: { ra?: number; dec?: number; body?: BodyName } & MotionFields, ctx: z.RefinementCtx) {
  const hasRa = v.ra !== undefined, hasDec = v.dec !== undefined;
  const motionKey = MOTION_KEYS.find((k) => v[k] !== undefined);
  if (v.body !== undefined && motionKey) ctx.addIssue({ code: 'custom', path: [motionKey], message: 'applies to an ra/dec target only' });
  else if (v.body !== undefined && (hasRa || hasDec)) ctx.addIssue({ code: 'custom', path: ['body'], message: 'give either body or ra and dec, not both' });
  else if (v.body === undefined && !hasRa && !hasDec) ctx.addIssue({ code: 'custom', path: ['body'], message: 'give either body or ra and dec' });
  else if (v.body === undefined && !hasRa) ctx.addIssue({ code: 'custom', path: ['ra'], message: 'is required with dec' });
  else if (v.body === undefined && !hasDec) ctx.addIssue({ code: 'custom', path: ['dec'], message: 'is required with ra' });
}

export const observeQuerySchema = z
  .object({
    ...siteQuery,
    time: instant,
    ...targetQuery,
    refraction: z.preprocess((v) => (v === '' ? undefined : v), z.enum(['none', 'standard'], { errorMap: () => ({ message: 'must be none or standard' }) }).optional().default('standard')),
  })
  .superRefine(checkTarget);
export type ObserveQuery = z.infer<typeof observeQuerySchema>;

function checkSpan(v: { from: Date; to: Date }, ctx: z.RefinementCtx) {
  const span = v.to.getTime() - v.from.getTime();
  if (!(span > 0)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'must be after from' });
  else if (span > MAX_SPAN_DAYS * 86400000) ctx.addIssue({ code: 'custom', path: ['to'], message: `the span must not exceed ${MAX_SPAN_DAYS} days` });
}

export const eventsQuerySchema = z
  .object({ ...siteQuery, ...targetQuery, from: instant, to: instant })
  .superRefine((v, ctx) => {
    checkTarget(v, ctx);
    checkSpan(v, ctx);
  });
export type EventsQuery = z.infer<typeof eventsQuerySchema>;

const windowTargetSchema = z.union(
  [
    z.object({
      name: z.string().min(1).max(200), ra: num(0, 360, RA), dec: num(-90, 90, DEC),
      epoch: num(1000, 3000, EPOCH).optional(), pmra: num(-20000, 20000, PM).optional(), pmdec: num(-20000, 20000, PM).optional(),
      parallax: num(0, 1000, PLX).optional(), radialVelocity: num(-3000, 3000, RV).optional(),
    }).strict(),
    z.object({ name: z.string().min(1).max(200), body: bodyEnum }).strict(),
  ],
  { errorMap: (issue, ctx) => (issue.code === 'invalid_union' ? { message: 'each target needs a name and either ra and dec or body' } : { message: ctx.defaultError }) },
);

export const windowsBodySchema = z
  .object({
    site: z.object({
      lat: num(-90, 90, LAT), lon: num(-180, 360, LON), height: num(-500, 10000, HEIGHT).optional().default(0),
      dut1: z.number({ invalid_type_error: 'must be a number' }).finite().gt(-1, DUT1).lt(1, DUT1).optional(),
      xp: num(-2, 2, POLAR).optional(),
      yp: num(-2, 2, POLAR).optional(),
    }),
    envelope: envelopeSchema,
    targets: boundedArray(windowTargetSchema, MAX_TARGETS, `at most ${MAX_TARGETS} targets`),
    from: instant,
    to: instant,
  })
  .superRefine(checkSpan);
export type WindowsBody = z.infer<typeof windowsBodySchema>;

const site = (lat: number, lon: number, height: number, eop: { dut1?: number; xp?: number; yp?: number } = {}): SiteInput => ({
  latDeg: lat, lonDeg: lon > 180 ? lon - 360 : lon, heightM: height,
  ...(eop.dut1 ? { dut1Sec: eop.dut1 } : {}), ...(eop.xp ? { xpArcsec: eop.xp } : {}), ...(eop.yp ? { ypArcsec: eop.yp } : {}),
});
const motionOf = (q: MotionFields): SpaceMotion | undefined => {
  const m: SpaceMotion = { epoch: q.epoch ?? 2000, pmra: q.pmra, pmdec: q.pmdec, parallax: q.parallax, radialVelocity: q.radialVelocity };
  return hasMotion(m) ? m : undefined;
};
const target = (q: { ra?: number; dec?: number; body?: BodyName } & MotionFields): Target => {
  if (q.body !== undefined) return { body: q.body };
  const motion = motionOf(q);
  return motion ? { raDeg: q.ra! % 360, decDeg: q.dec!, motion } : { raDeg: q.ra! % 360, decDeg: q.dec! };
};

export function observeResponse(q: ObserveQuery) {
  const o = observe(site(q.lat, q.lon, q.height, q), q.time, target(q), { refraction: q.refraction });
  return {
    azimuth: o.azDeg,
    altitude: o.altDeg,
    hourAngle: o.haHours,
    raOfDate: o.raOfDateDeg,
    decOfDate: o.decOfDateDeg,
    lst: o.lstHours,
    airmass: o.airmass,
    constellation: o.constellation,
    time: q.time.toISOString(),
    refraction: q.refraction,
    earthOrientation: { dut1: q.dut1 ?? 0, xp: q.xp ?? 0, yp: q.yp ?? 0 },
    ...(o.distanceKm !== undefined ? { distanceKm: o.distanceKm } : {}),
    ...(o.magnitude !== undefined ? { magnitude: o.magnitude } : {}),
    ...(o.illuminatedFraction !== undefined ? { illuminatedFraction: o.illuminatedFraction } : {}),
    ...(o.phaseAngleDeg !== undefined ? { phaseAngle: o.phaseAngleDeg } : {}),
    ...(o.elongationDeg !== undefined ? { elongation: o.elongationDeg } : {}),
  };
}

export function eventsResponse(q: EventsQuery) {
  const r = skyEvents(site(q.lat, q.lon, q.height, q), target(q), q.from, q.to);
  return {
    events: r.events.map((e) => ({ kind: e.kind, time: e.time.toISOString() })),
    alwaysUp: r.alwaysUp,
    alwaysDown: r.alwaysDown,
  };
}

/**
 * Grid step for the windows search: 120 s up to 2 days; longer spans and many targets get a coarser
 * grid so one request stays near 5 million limit evaluations at most (crossings are still refined
 * to ≤ 1 s; only windows shorter than the step can be missed). Reported back as `stepSec`.
 */
export const windowsStepSec = windowsGridStepSec;

export function windowsResponse(b: WindowsBody) {
  const targets: WindowTarget[] = b.targets.map((t) =>
    'body' in t ? { name: t.name, body: t.body } : { name: t.name, raDeg: t.ra % 360, decDeg: t.dec, ...(motionOf(t) ? { motion: motionOf(t) } : {}) },
  );
  const stepSec = windowsStepSec(b.to.getTime() - b.from.getTime(), targets.length);
  const res = visibilityWindows(site(b.site.lat, b.site.lon, b.site.height, b.site), b.envelope, targets, b.from, b.to, { stepSec });
  return {
    targets: res.map((r) => ({
      name: r.name,
      windows: r.windows.map((w) => ({ start: w.start.toISOString(), end: w.end.toISOString(), openedBy: w.openedBy, closedBy: w.closedBy })),
      reasons: r.reasons,
    })),
    stepSec,
  };
}

// ---------- answers, as schemas for the API description (each checked against its function at compile time)

const deg = (what: string) => z.number().describe(what);
export const observeAnswerSchema = z.object({
  azimuth: deg('degrees from north through east'),
  altitude: deg('degrees; apparent (refracted) unless refraction=none'),
  hourAngle: deg('hours, −12 to 12'),
  raOfDate: deg('apparent right ascension of date, degrees'),
  decOfDate: deg('apparent declination of date, degrees'),
  lst: deg('local apparent sidereal time, hours'),
  airmass: z.number().nullable().describe('Kasten & Young (1989); null below the horizon'),
  constellation: z.string().describe('IAU three-letter abbreviation'),
  time: z.string(),
  refraction: z.enum(['none', 'standard']),
  earthOrientation: z.object({ dut1: z.number(), xp: z.number(), yp: z.number() }),
  distanceKm: z.number().optional(),
  magnitude: z.number().optional(),
  illuminatedFraction: z.number().optional(),
  phaseAngle: z.number().optional(),
  elongation: z.number().optional(),
});
export const eventsAnswerSchema = z.object({
  events: z.array(z.object({ kind: z.string().describe('rise, transit, set; for the Sun also civil-, nautical- and astronomical-dawn and -dusk'), time: z.string() })),
  alwaysUp: z.boolean(),
  alwaysDown: z.boolean(),
});
export const windowsAnswerSchema = z.object({
  targets: z.array(
    z.object({
      name: z.string(),
      windows: z.array(z.object({ start: z.string(), end: z.string(), openedBy: z.string(), closedBy: z.string() })),
      reasons: z.array(z.string()).describe('the limits that keep the target out, most frequent first'),
    }),
  ),
  stepSec: z.number().describe('grid step of the search, seconds (crossings refined to 1 s)'),
});
const _observeFits: z.infer<typeof observeAnswerSchema> = {} as ReturnType<typeof observeResponse>;
const _eventsFits: z.infer<typeof eventsAnswerSchema> = {} as ReturnType<typeof eventsResponse>;
const _windowsFits: z.infer<typeof windowsAnswerSchema> = {} as ReturnType<typeof windowsResponse>;
void _observeFits;
void _eventsFits;
void _windowsFits;
