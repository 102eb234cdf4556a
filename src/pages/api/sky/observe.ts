/** GET /api/sky/observe — apparent topocentric place (API contract, fixed). */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { observeQuerySchema, observeResponse } from '../../../lib/server/sky-api';

export const GET = route(async (ctx) => {
  const q = parseQuery(observeQuerySchema, ctx.url);
  await rateLimit(`sky:${clientAddress(ctx)}`, 600, 60);
  return json(observeResponse(q));
});
