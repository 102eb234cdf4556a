/** GET /api/tokens (no secrets) and POST /api/tokens {name, scope} → 201 with the secret, shown once (API contract, fixed). */
import { db } from '../../../lib/server/db';
import { json, parseJson, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { rateLimit } from '../../../lib/server/rate-limit';
import { tokenCreateSchema } from '../../../lib/contracts/tokens';
import { createToken, listTokens } from '../../../lib/server/auth/tokens';

export const GET = route(async ({ locals }) => {
  const user = requireUser(locals);
  return json({ tokens: await listTokens(db, user.id) });
});

export const POST = route(async ({ locals, request }) => {
  const user = requireUser(locals);
  await rateLimit(`token-create:${user.id}`, 20, 3600);
  const input = await parseJson(tokenCreateSchema, request);
  return json(await createToken(db, user.id, input), 201);
});
