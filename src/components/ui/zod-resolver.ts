/** A minimal react-hook-form resolver for zod schemas (the first message per field is shown). */
import type { FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import type { ZodType, ZodTypeDef } from 'zod';

export function zodResolver<T extends FieldValues>(schema: ZodType<T, ZodTypeDef, unknown>): Resolver<T> {
  return async (values) => {
    const r = await schema.safeParseAsync(values);
    if (r.success) return { values: r.data, errors: {} };
    const errors: Record<string, { type: string; message: string }> = {};
    for (const issue of r.error.issues) {
      const key = issue.path.join('.') || 'root';
      errors[key] ??= { type: issue.code, message: issue.message };
    }
    return { values: {}, errors: errors as unknown as FieldErrors<T> };
  };
}
