/** GET /api/sky/events — rise/transit/set and twilights over a span ≤ 31 days (API contract, fixed). */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { eventsQuerySchema, eventsResponse } from '../../../lib/server/sky-api';

export const GET = route(async (ctx) => {
  const q = parseQuery(eventsQuerySchema, ctx.url);
  await rateLimit(`sky:${clientAddress(ctx)}`, 600, 60);
  await rateLimit(`sky-events:${clientAddress(ctx)}`, 120, 60);
  return json(eventsResponse(q));
});
