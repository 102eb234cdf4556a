/** Strict request bodies whose unknown keys are reported with their name as the field. */
import { z, type AnyZodObject, type ZodTypeAny } from 'zod';

/**
 * Refuses keys the schema does not know, naming the first one as the field (zod's own `.strict()`
 * reports unknown keys without a path, so the client could not tell which field was wrong).
 */
export function knownKeysOnly<T extends ZodTypeAny>(shapeOf: AnyZodObject, schema: T) {
  const known = new Set(Object.keys(shapeOf.shape));
  return z
    .unknown()
    .superRefine((v, ctx) => {
      if (v === null || typeof v !== 'object' || Array.isArray(v)) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'The body must be a JSON object.' });
        return;
      }
      for (const k of Object.keys(v)) {
        if (known.has(k)) continue;
        // The first unknown key is enough to refuse (a body of a million keys is one issue, not a million).
        ctx.addIssue({ code: z.ZodIssueCode.custom, path: [k], message: 'is not a known field' });
        return;
      }
    })
    .pipe(schema);
}
