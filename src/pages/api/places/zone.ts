/** GET /api/places/zone?lat=&lon= — the IANA time zone at a point (API contract, fixed). No account needed. */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { zoneQuerySchema } from '../../../lib/contracts/places';
import { zoneAt } from '../../../lib/server/places/zone';

export const GET = route(async (ctx) => {
  const q = parseQuery(zoneQuerySchema, ctx.url);
  await rateLimit(`places:${clientAddress(ctx)}`, 600, 60);
  return json({ timeZone: zoneAt(q.lat, q.lon) }, 200, { 'cache-control': 'public, max-age=86400' });
});
