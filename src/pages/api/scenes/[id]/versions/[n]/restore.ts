import { db } from '../../../../../../lib/server/db';
import { badRequest, json, parseJson, route } from '../../../../../../lib/server/http';
import { requireUser } from '../../../../../../lib/server/policy';
import { restoreSchema } from '../../../../../../lib/contracts/scene';
import { restoreVersion, sceneFor } from '../../../../../../lib/server/scene-service';

/** Makes a new version with the content of version `n`; optional `{version}` guards against a stale view (409). */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.write');
  const n = Number(params.n);
  if (!Number.isInteger(n) || n < 1) throw badRequest('n: must be a version number (1, 2, …)', 'n');
  const body = await parseJson(restoreSchema, request);
  return json({ scene: await restoreVersion(db, user.id, row, n, body.version) });
});
