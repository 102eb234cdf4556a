/**
 * The night answer of a scene (fixed route `GET /api/scenes/:id/night` and its share-link twin): the
 * query is validated by the route; the work is charged to the caller's budget and the pure `nightData`
 * (src/lib/sky/night.ts) runs on the compute pool.
 */
import type { SceneOut } from '../contracts/scene';
import { runCompute } from './compute';
import { chargeWork, windowsWork } from './compute/budget';
import { windowsGridStepSec } from '../sky/night';
import { nightInput, type NightQuery } from '../night/query';
import type { WorkPayer } from './exports/responses';

export async function nightAnswer(scene: SceneOut, q: NightQuery, payer: WorkPayer) {
  const input = nightInput(scene, q);
  const span = input.to - input.from;
  const n = input.targets.length;
  // the windows search, plus one sky place per target and grid sample (about one evaluation each)
  const work = windowsWork(n, span, windowsGridStepSec(span, n)) + (n + 3) * Math.ceil(span / (input.stepMin * 60000));
  await chargeWork(payer.key, work, payer.who, 'Ask for a shorter span or a coarser step.');
  return runCompute('night', input);
}
