import { db } from '../../../../../lib/server/db';
import { json, parseJson, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { presenterSchema } from '../../../../../lib/contracts/presenter';
import { sceneFor } from '../../../../../lib/server/scene-service';
import { readPresenter, setPresenter } from '../../../../../lib/server/presenter';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.read');
  return json({ presenter: await readPresenter(db, row.id) });
});

/** Editor+: moves every follower to `stepIndex` (and optionally `time`). */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.write');
  const body = await parseJson(presenterSchema, request);
  return json({ presenter: await setPresenter(db, user.id, row, body.stepIndex, body.time ?? null) });
});
