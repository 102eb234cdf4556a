import { db } from '../../../lib/server/db';
import { json, parseJson, parseQuery, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { sceneCreateSchema, sceneListQuerySchema } from '../../../lib/contracts/scene';
import { createScene, listScenes } from '../../../lib/server/scene-service';

/** Scenes of the caller's teams (optionally one team), newest change first. */
export const GET = route(async ({ locals, url }) => {
  const user = requireUser(locals);
  const q = parseQuery(sceneListQuerySchema, url);
  return json({ scenes: await listScenes(db, user.id, q.teamId) });
});

/** Create (or duplicate with `fromSceneId`); editor+ in `teamId`. */
export const POST = route(async ({ locals, request }) => {
  const user = requireUser(locals);
  const body = await parseJson(sceneCreateSchema, request);
  return json({ scene: await createScene(db, user, body) }, 201);
});
