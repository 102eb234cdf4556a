/**
 * The envelope JSON of the API contract (section "Envelopes"), every field optional; the meaning of
 * each limit is documented with the engine that evaluates it (src/lib/sky/envelope.ts). A team
 * envelope also needs a name to be listed and chosen by.
 */
import { z } from 'zod';
import type { Envelope } from '../sky/envelope';
import { knownKeysOnly } from './known-keys';
import { boundedArray } from '../bounded-array';

const finite = z.number().finite();
const az = finite.min(0, 'azimuth must be 0–360').max(360, 'azimuth must be 0–360');
const alt = finite.min(-90, 'altitude must be −90–90').max(90, 'altitude must be −90–90');
const opt = <T extends z.ZodTypeAny>(t: T) => t.nullish().transform((v) => (v === null ? undefined : v));

export const envelopeSchema = z
  .object({
    name: opt(z.string().max(200)),
    minAltitude: opt(alt),
    maxAltitude: opt(alt),
    azimuthRanges: opt(boundedArray(z.tuple([az, az]), 360)),
    keyholeRadius: opt(finite.min(0).max(90)),
    sunAvoidance: opt(finite.min(0).max(180)),
    moonAvoidance: opt(finite.min(0).max(180)),
    horizonMask: opt(boundedArray(z.tuple([az, alt]), 36000)),
    hourAngleLimits: opt(
      z.tuple([finite.min(-12).max(12), finite.min(-12).max(12)]).refine((v) => v[0] <= v[1], 'hourAngleLimits: min must not exceed max'),
    ),
    declinationLimits: opt(
      z.tuple([finite.min(-90).max(90), finite.min(-90).max(90)]).refine((v) => v[0] <= v[1], 'declinationLimits: min must not exceed max'),
    ),
  })
  .refine((e) => e.minAltitude === undefined || e.maxAltitude === undefined || e.minAltitude <= e.maxAltitude, {
    message: 'minAltitude must not exceed maxAltitude',
    path: ['maxAltitude'],
  });


/** The schema's output is exactly what the engine evaluates (a compile error here means they drifted). */
const _sameAsEngine: z.ZodType<Envelope, z.ZodTypeDef, unknown> = envelopeSchema;
void _sameAsEngine;
export type EnvelopeJson = z.infer<typeof envelopeSchema>;

/** A team's saved envelope: the contract's JSON with a non-empty `name`. */
export const teamEnvelopeSchema = envelopeSchema
  .superRefine((e, ctx) => {
    if (!e.name || !e.name.trim()) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['name'], message: 'is required' });
  })
  .transform((e) => ({ ...e, name: e.name!.trim() }));
export type TeamEnvelopeJson = z.infer<typeof teamEnvelopeSchema>;

/** PATCH merges into the stored envelope; `null` clears an optional limit. */
const envelopeFieldNames = ['minAltitude', 'maxAltitude', 'azimuthRanges', 'keyholeRadius', 'sunAvoidance', 'moonAvoidance', 'horizonMask', 'hourAngleLimits', 'declinationLimits'] as const;
const envelopePatchShape = z.object({
  name: z.string().optional(),
  ...(Object.fromEntries(envelopeFieldNames.map((k) => [k, z.unknown().optional()])) as Record<(typeof envelopeFieldNames)[number], z.ZodOptional<z.ZodUnknown>>),
  // echoes of the GET answer, ignored
  id: z.unknown().optional(),
  teamId: z.unknown().optional(),
  createdAt: z.unknown().optional(),
  updatedAt: z.unknown().optional(),
  usedBy: z.unknown().optional(),
});
export const envelopePatchSchema = knownKeysOnly(envelopePatchShape, envelopePatchShape);
const envelopeCreateShape = z.object({
  name: z.unknown(),
  ...(Object.fromEntries(envelopeFieldNames.map((k) => [k, z.unknown().optional()])) as Record<(typeof envelopeFieldNames)[number], z.ZodOptional<z.ZodUnknown>>),
});
export const envelopeCreateSchema = knownKeysOnly(envelopeCreateShape, teamEnvelopeSchema);

export function mergeEnvelope(current: TeamEnvelopeJson, patch: Record<string, unknown>): Record<string, unknown> {
  const next: Record<string, unknown> = { ...current };
  for (const k of ['name', ...envelopeFieldNames] as const) {
    if (!(k in patch)) continue;
    const v = patch[k];
    if (v === null) delete next[k];
    else if (v !== undefined) next[k] = v;
  }
  return next;
}


/** A team envelope as the API returns it. */
export interface EnvelopeOut {
  id: string;
  teamId: string;
  name: string;
  data: Record<string, unknown>;
}
