import { db } from '../../../../../lib/server/db';
import { noContent, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { sceneFor } from '../../../../../lib/server/scene-service';
import { revokeLink } from '../../../../../lib/server/links';

/** Editor+: revokes the link; its token stops working at once. */
export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.share');
  await revokeLink(db, user.id, row, params.linkId!);
  return noContent();
});
