import { db } from '../../../lib/server/db';
import { json, parseJson, route } from '../../../lib/server/http';
import { authorize, requireUser } from '../../../lib/server/policy';
import { commentPatchSchema } from '../../../lib/contracts/comment';
import { commentWithScene, setResolved } from '../../../lib/server/comments';

/** Reviewer+: `{resolved: true | false}`. */
export const PATCH = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const { comment, scene } = await commentWithScene(db, params.id!);
  await authorize(db, user, scene.teamId, 'comment.resolve', 'Comment');
  const body = await parseJson(commentPatchSchema, request);
  return json({ comment: await setResolved(db, user.id, comment, scene.teamId, body.resolved) });
});
