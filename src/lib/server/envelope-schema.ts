/**
 * The envelope JSON of the API contract, as the server stores it. The field rules live in the sky
 * engine (src/lib/sky/envelope.ts, every field optional); a team envelope also needs a name to be
 * listed and chosen by.
 */
import { z } from 'zod';
import { envelopeSchema } from '../sky/envelope';

export { envelopeSchema };
export type EnvelopeJson = z.infer<typeof envelopeSchema>;

/** A team's saved envelope: the contract's JSON with a non-empty `name`. */
export const teamEnvelopeSchema = envelopeSchema
  .superRefine((e, ctx) => {
    if (!e.name || !e.name.trim()) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['name'], message: 'is required' });
  })
  .transform((e) => ({ ...e, name: e.name!.trim() }));
export type TeamEnvelopeJson = z.infer<typeof teamEnvelopeSchema>;
