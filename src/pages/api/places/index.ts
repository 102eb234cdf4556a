/** GET /api/places?q=&limit= — towns of the offline gazetteer (API contract, fixed). No account needed. */
import { clientAddress, json, parseQuery, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { placesQuerySchema } from '../../../lib/contracts/places';
import { searchPlaces } from '../../../lib/server/places';

export const GET = route(async (ctx) => {
  const q = parseQuery(placesQuerySchema, ctx.url);
  await rateLimit(`places:${clientAddress(ctx)}`, PLACES_PER_MINUTE, 60);
  return json({ places: searchPlaces(q.q, q.limit ?? 10) }, 200, { 'cache-control': 'public, max-age=86400' });
});

/** Search as you type sends a request a keystroke; a busy user types ~300 characters a minute. */
const PLACES_PER_MINUTE = 600;
