/** GET /api/places?q=&limit= — towns of the offline gazetteer (API contract, fixed). No account needed. */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { placesQuerySchema } from '../../../lib/contracts/places';
import { searchPlaces } from '../../../lib/server/places';
import { placesLimit } from '../../../lib/server/places/local-limit';

export const GET = route(async (ctx) => {
  placesLimit(clientAddress(ctx));
  const q = parseQuery(placesQuerySchema, ctx.url);
  return json({ places: searchPlaces(q.q, q.limit ?? 10) }, 200, { 'cache-control': 'public, max-age=86400' });
});
