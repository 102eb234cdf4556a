import { db } from '../../../lib/server/db';
import { json, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { importSceneFile, readSceneImport } from '../../../lib/server/imports/scene-file';

/**
 * An `armilla-scene` file (JSON body with `teamId`, or multipart `file` + `teamId`) → 201 `{scene}`, a new
 * scene in that team (editor+). 422 when the file does not validate, naming the field.
 */
export const POST = route(async ({ locals, request, url }) => {
  const user = requireUser(locals);
  const { teamId, file } = await readSceneImport(request, url);
  return json({ scene: await importSceneFile(db, user, teamId, file) }, 201);
});
