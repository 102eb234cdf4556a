/**
 * The night API's query (`GET /api/scenes/:id/night`, `GET /api/shared/:token/night`, fixed) and the
 * scene → night input step. Pure (zod + the sky engine); the routes parse, authorise and call.
 */
import { z } from 'zod';
import { isoUtc, type Site, type Target as SceneTarget } from '../contracts/scene-doc';
import { BODY_NAMES, type BodyName } from '../sky/bodies';
import { MAX_NIGHT_SPAN_MS, sceneNight, type NightInput, type NightTarget } from '../sky/night';
import type { Envelope } from '../sky/envelope';
import { skyTarget } from '../exports/sky-targets';

const stepMinutes = z.preprocess(
  (v) => (v === undefined || v === '' ? undefined : typeof v === 'string' && /^\s*\d+\s*$/.test(v) ? Number(v) : v),
  z
    .number({ invalid_type_error: 'must be a whole number of minutes from 1 to 30' })
    .int('must be a whole number of minutes from 1 to 30')
    .min(1, 'must be a whole number of minutes from 1 to 30')
    .max(30, 'must be a whole number of minutes from 1 to 30')
    .default(5),
);

/** `bodies=moon,jupiter`: extra bodies sampled for the chart; one bad name fails the whole field. */
const bodyList = z
  .string()
  .optional()
  .transform((v, ctx): BodyName[] => {
    const names = (v ?? '').split(',').map((s) => s.trim().toLowerCase()).filter(Boolean);
    const bad = names.filter((b) => !(BODY_NAMES as readonly string[]).includes(b));
    if (bad.length) {
      ctx.addIssue({ code: 'custom', message: `must be a comma-separated list of ${BODY_NAMES.join(', ')} (not ${bad.join(', ')})` });
      return z.NEVER;
    }
    return [...new Set(names)] as BodyName[];
  })
  .describe(`extra bodies to sample for the chart, comma-separated: ${BODY_NAMES.join(', ')}`);

export const nightQuerySchema = z
  .object({ from: isoUtc.optional(), to: isoUtc.optional(), at: isoUtc.optional(), step: stepMinutes, bodies: bodyList })
  .superRefine((q, ctx) => {
    if (q.from && q.to) {
      const span = Date.parse(q.to) - Date.parse(q.from);
      if (!(span > 0)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'must be after from' });
      else if (span > MAX_NIGHT_SPAN_MS) ctx.addIssue({ code: 'custom', path: ['to'], message: 'the span from from to to must not exceed 36 hours' });
    }
  });
export type NightQuery = z.infer<typeof nightQuerySchema>;

export interface NightScene {
  time: string;
  site: Site;
  envelope: unknown;
  targets: SceneTarget[];
}

/**
 * The span asked for: both ends given → as given; one end → 12 h from/to it (at most 36 h);
 * neither → the night (sunset to sunrise) around `at`, by default the scene time.
 */
export function nightSpan(scene: NightScene, q: NightQuery): { from: number; to: number } {
  if (q.from && q.to) return { from: Date.parse(q.from), to: Date.parse(q.to) };
  if (q.from) return { from: Date.parse(q.from), to: Date.parse(q.from) + 12 * 3600000 };
  if (q.to) return { from: Date.parse(q.to) - 12 * 3600000, to: Date.parse(q.to) };
  return sceneNight(scene.site, new Date(q.at ?? scene.time));
}

/** Scene targets as night targets (catalogue stars resolved, proper motion applied at mid-span). */
export function nightTargets(targets: SceneTarget[], at: Date): NightTarget[] {
  const out: NightTarget[] = [];
  for (const t of targets) {
    const st = skyTarget(t, at);
    if (st) out.push({ name: t.name, ...st });
  }
  return out;
}

export function nightInput(scene: NightScene, q: NightQuery): NightInput {
  const { from, to } = nightSpan(scene, q);
  return {
    site: { name: scene.site.name, lat: scene.site.lat, lon: scene.site.lon, height: scene.site.height ?? 0, timeZone: scene.site.timeZone },
    envelope: (scene.envelope as Envelope | null) ?? null,
    targets: nightTargets(scene.targets, new Date((from + to) / 2)),
    from,
    to,
    stepMin: q.step,
    bodies: q.bodies,
  };
}
