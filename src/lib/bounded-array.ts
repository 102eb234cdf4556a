/**
 * A list whose length is checked before its elements. zod 3's `z.array(item).max(n)` visits every
 * element first (even `z.array(z.unknown())` builds a path object per element) and reports the length
 * afterwards, so a body of half a million small items costs a large fraction of a second or, with a union
 * per element, seconds before it is refused. Here the length is checked on the raw value and the
 * elements are validated only when it passes (a failed refinement stops the pipe). Pure (zod only).
 */
import { z, type ZodTypeAny } from 'zod';

export function boundedArray<T extends ZodTypeAny>(item: T, max: number, message = `at most ${max} items`) {
  return z
    .unknown()
    .superRefine((v, ctx) => {
      if (!Array.isArray(v)) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: v === undefined ? 'is required' : 'must be a list' });
      } else if (v.length > max) {
        ctx.addIssue({ code: z.ZodIssueCode.too_big, maximum: max, type: 'array', inclusive: true, message });
      }
    })
    .pipe(z.array(item));
}
