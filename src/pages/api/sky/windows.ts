/** POST /api/sky/windows — visibility windows of targets inside an envelope (API contract, fixed). */
import { clientAddress, json, parseJson, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { windowsBodySchema, windowsResponse } from '../../../lib/server/sky-api';

export const POST = route(async (ctx) => {
  const body = await parseJson(windowsBodySchema, ctx.request);
  await rateLimit(`sky-windows:${clientAddress(ctx)}`, 60, 60);
  return json(windowsResponse(body));
});
