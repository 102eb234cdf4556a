/** Personal API tokens (API contract, fixed): `POST /api/tokens`, `GET /api/tokens`, `DELETE /api/tokens/:id`. */
import { z } from 'zod';

export const TOKEN_SCOPES = ['read', 'write'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];
/** A member's tokens at most (a list a person can still read). */
export const MAX_TOKENS_PER_USER = 50;

export const tokenCreateSchema = z
  .object({
    name: z.string({ required_error: 'is required' }).trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters'),
    scope: z.enum(TOKEN_SCOPES, { errorMap: () => ({ message: 'must be "read" or "write"' }) }),
  })
  .strict();
export type TokenCreate = z.infer<typeof tokenCreateSchema>;

export const tokenSchema = z.object({
  id: z.string(),
  name: z.string(),
  scope: z.enum(TOKEN_SCOPES),
  /** The secret's first characters, to tell tokens apart. */
  hint: z.string(),
  createdAt: z.string(),
  /** Last request made with the token, to the minute; null when never used. */
  lastUsedAt: z.string().nullable(),
});
export type TokenOut = z.infer<typeof tokenSchema>;

/** The answer to a create: the only time the secret is shown. */
export const tokenCreatedSchema = tokenSchema.extend({ token: z.string() });
export const tokenListSchema = z.object({ tokens: z.array(tokenSchema) });
