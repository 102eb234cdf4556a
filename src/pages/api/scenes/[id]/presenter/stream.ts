import { db } from '../../../../../lib/server/db';
import { route } from '../../../../../lib/server/http';
import { requireUser, roleIn } from '../../../../../lib/server/policy';
import { sceneFor, sceneRow } from '../../../../../lib/server/scene-service';
import { presenterStream, readPresenter } from '../../../../../lib/server/presenter';

/** Server-sent events: `event: step` whenever the presenter moves; ends if the scene or the membership goes. */
export const GET = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.read');
  return presenterStream(async () => {
    if (!(await sceneRow(db, row.id)) || (await roleIn(db, user.id, row.teamId)) === null) return 'gone';
    return readPresenter(db, row.id);
  }, request.signal);
});
