/**
 * The night answer of a scene (fixed route `GET /api/scenes/:id/night` and its share-link twin): the
 * query is validated by the route, the computation is the pure `nightData` (src/lib/sky/night.ts).
 */
import type { SceneOut } from './scenes';
import { nightData } from '../sky/night';
import { nightInput, type NightQuery } from '../night/query';

export function nightAnswer(scene: SceneOut, q: NightQuery) {
  return nightData(nightInput(scene, q));
}
