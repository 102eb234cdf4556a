import { db } from '../../../../lib/server/db';
import { json, noContent, parseJson, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { scenePatchSchema } from '../../../../lib/contracts/scene';
import { deleteScene, sceneAccess, sceneFor, toSceneOut, updateScene } from '../../../../lib/server/scene-service';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row, role } = await sceneFor(db, user, params.id!, 'scene.read');
  return json({ scene: await toSceneOut(db, row), role });
});

/** `{version, ...fields}`: 409 `version_conflict` with the current scene when `version` is stale. */
export const PATCH = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const scene = await sceneAccess(db, user, params.id!, 'scene.write');
  const body = await parseJson(scenePatchSchema, request);
  return json({ scene: await updateScene(db, user.id, scene.id, body) });
});

export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.delete');
  await deleteScene(db, user.id, row);
  return noContent();
});
