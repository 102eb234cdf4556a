/**
 * POST /api/sky/windows — visibility windows of targets inside an envelope (API contract, fixed).
 * Order matters: the rate limit before the body is read, the body size and the list lengths before any
 * element is validated, the work budget before anything is computed, the computation on the worker pool.
 */
import { clientAddress, json, parseJson, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { asCaller, runCompute } from '../../../lib/server/compute';
import { chargeWork, windowsWork } from '../../../lib/server/compute/budget';
import { MAX_SPAN_DAYS, MAX_TARGETS, windowsBodySchema, windowsStepSec } from '../../../lib/server/sky-api';

/** A full request (2,000 targets, 31 days, the envelope's horizon mask) is far below this. */
const MAX_WINDOWS_BODY_BYTES = 1_000_000;

export const POST = route(async (ctx) => {
  const addr = clientAddress(ctx);
  await rateLimit(`sky-windows:${addr}`, 60, 60);
  // One request of an address at a time, refused before its body is read.
  return asCaller(`addr:${addr}`, async () => {
    const body = await parseJson(windowsBodySchema, ctx.request, MAX_WINDOWS_BODY_BYTES);
    const spanMs = body.to.getTime() - body.from.getTime();
    await chargeWork(
      `addr:${addr}`,
      windowsWork(body.targets.length, spanMs, windowsStepSec(spanMs, body.targets.length)),
      'anonymous',
      `At most ${MAX_TARGETS} targets over ${MAX_SPAN_DAYS} days.`,
    );
    return json(await runCompute('windows', body));
  });
});
