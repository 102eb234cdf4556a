/** GET /api/places/zone?lat=&lon= — the IANA time zone at a point (API contract, fixed). No account needed. */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { zoneQuerySchema } from '../../../lib/contracts/places';
import { zoneAt } from '../../../lib/server/places/zone';
import { placesLimit } from '../../../lib/server/places/local-limit';

export const GET = route(async (ctx) => {
  placesLimit(clientAddress(ctx));
  const q = parseQuery(zoneQuerySchema, ctx.url);
  return json({ timeZone: zoneAt(q.lat, q.lon) }, 200, { 'cache-control': 'public, max-age=86400' });
});
