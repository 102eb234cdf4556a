/**
 * The answer of the night API (`GET /api/scenes/:id/night`, `GET /api/shared/:token/night`, fixed) as a
 * zod schema, for the API description and for scripts that read it. The engine (src/lib/sky/night.ts)
 * builds the answer as plain TypeScript; the two checks at the end fail to compile when they drift.
 */
import { z } from 'zod';
import { BODY_NAMES, type BodyName } from '../sky/bodies';
import type { NightAnswer } from '../sky/night';
import { envelopeSchema } from './envelope';

const iso = z.string().describe('ISO 8601 instant, UTC');
const bodyName = z.enum(BODY_NAMES as unknown as [BodyName, ...BodyName[]]);
const skySample = z.object({
  time: iso,
  /** Apparent altitude (standard refraction), degrees. */
  altitude: z.number().describe('apparent altitude (standard refraction), degrees'),
  azimuth: z.number().describe('degrees from north through east'),
});

export const nightSampleSchema = skySample.extend({
  airmass: z.number().nullable().describe('Kasten & Young (1989); null below the horizon'),
});

export const nightWindowSchema = z.object({
  start: iso,
  end: iso,
  openedBy: z.string().describe('the limit that opens the window (or "start" of the span)'),
  closedBy: z.string().describe('the limit that closes the window (or "end" of the span)'),
});

export const nightTargetSchema = z.object({
  name: z.string(),
  body: bodyName.optional(),
  samples: z.array(nightSampleSchema).describe('on the step grid from `from` to `to`'),
  windows: z.array(nightWindowSchema).describe("inside the scene's envelope (the horizon when it has none)"),
  reasons: z.array(z.string()).describe('limits that keep the target out when it has no window, most frequent first'),
  best: z
    .object({
      time: iso,
      altitude: z.number(),
      azimuth: z.number(),
      airmass: z.number().nullable(),
      moonSeparation: z.number().describe('degrees'),
      sunSeparation: z.number().describe('degrees'),
      inWindow: z.boolean().describe('false: no window, the highest point of the span'),
    })
    .describe('the highest point inside a window, time refined to 1 s or better'),
});

export const nightAnswerSchema = z.object({
  site: z.object({ name: z.string().optional(), lat: z.number(), lon: z.number(), height: z.number(), timeZone: z.string().optional() }),
  from: iso,
  to: iso,
  step: z.number().int().describe('minutes between samples'),
  envelope: envelopeSchema.nullable(),
  sun: z.object({ events: z.array(z.object({ kind: z.string(), time: iso })), samples: z.array(skySample) }),
  moon: z.object({
    illumination: z.number().describe('illuminated fraction (0–1) at the middle of the span'),
    phase: z.number().describe('Sun–Moon ecliptic longitude difference, degrees: 0 new, 180 full'),
    samples: z.array(skySample),
  }),
  bodies: z.array(z.object({ body: bodyName, samples: z.array(skySample) })).describe('the extra bodies asked for with `bodies`'),
  targets: z.array(nightTargetSchema),
  windowStepSec: z.number().describe('grid step of the window search, seconds'),
});

/** Both ways assignable: the schema describes exactly what the engine returns. */
const _engineFitsSchema: z.infer<typeof nightAnswerSchema> = {} as NightAnswer;
const _schemaFitsEngine: NightAnswer = {} as z.infer<typeof nightAnswerSchema>;
void _engineFitsSchema;
void _schemaFitsEngine;
