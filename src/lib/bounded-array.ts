/**
 * A list whose length is checked before its elements. zod 3's `z.array(item).max(n)` validates every
 * element first and reports the length afterwards, so a body of half a million small items costs
 * seconds of CPU before it is refused; here the length is checked against `unknown[]` first and the
 * elements only when it passes. Pure (zod only).
 */
import { z, type ZodTypeAny } from 'zod';

export function boundedArray<T extends ZodTypeAny>(item: T, max: number, message = `at most ${max} items`) {
  return z
    .array(z.unknown(), { invalid_type_error: 'must be a list', required_error: 'is required' })
    .max(max, message)
    .pipe(z.array(item));
}
