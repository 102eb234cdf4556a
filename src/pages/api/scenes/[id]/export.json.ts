import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { sceneJsonResponse } from '../../../../lib/server/exports/responses';

/** The whole scene as an `armilla-scene` file (formatVersion 1; schema at /schemas/armilla-scene-1.schema.json). Viewer+. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  return sceneJsonResponse(await sceneForMember(db, user, params.id!));
});
