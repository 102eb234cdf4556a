/**
 * The night answer of a scene (fixed route `GET /api/scenes/:id/night` and its share-link twin): the
 * query is validated by the route; the work is charged to the caller's budget and the pure `nightData`
 * (src/lib/sky/night.ts) runs on the compute pool.
 */
import type { SceneOut } from '../contracts/scene';
import { runCompute } from './compute';
import { pickEncoding } from './compressed';
import { chargeWork, windowsWork } from './compute/budget';
import { windowsGridStepSec } from '../sky/night';
import { nightInput, type NightQuery } from '../night/query';
import type { WorkPayer } from './exports/responses';

async function charged(scene: SceneOut, q: NightQuery, payer: WorkPayer) {
  const input = nightInput(scene, q);
  const span = input.to - input.from;
  const n = input.targets.length;
  // the windows search, plus one sky place per target and grid sample (about one evaluation each)
  const work = windowsWork(n, span, windowsGridStepSec(span, n)) + (n + 3) * Math.ceil(span / (input.stepMin * 60000));
  await chargeWork(payer.key, work, payer.who, 'Ask for a shorter span or a coarser step.');
  return input;
}

/** The night data as an object (handouts, SVG charts). */
export async function nightAnswer(scene: SceneOut, q: NightQuery, payer: WorkPayer) {
  return runCompute('night', await charged(scene, q, payer));
}

/**
 * The night answer of the API routes: serialised and compressed (as the request accepts) on the compute
 * thread, so the event loop only passes bytes along (compute/encode.ts has the measured reason).
 */
export async function nightResponse(request: Request, scene: SceneOut, q: NightQuery, payer: WorkPayer): Promise<Response> {
  const encoding = pickEncoding(request.headers.get('accept-encoding'));
  const out = await runCompute('nightEncoded', { night: await charged(scene, q, payer), encoding });
  const body = out.body as Uint8Array<ArrayBuffer>;
  return new Response(body, {
    headers: {
      'content-type': 'application/json; charset=utf-8',
      'cache-control': 'no-store',
      vary: 'Accept-Encoding',
      'content-length': String(body.byteLength),
      ...(out.encoding ? { 'content-encoding': out.encoding } : {}),
    },
  });
}
