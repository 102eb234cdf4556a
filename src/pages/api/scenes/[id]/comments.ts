import { db } from '../../../../lib/server/db';
import { json, parseJson, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { commentCreateSchema } from '../../../../lib/contracts/comment';
import { sceneFor } from '../../../../lib/server/scene-service';
import { addComment, listComments, notifyComment } from '../../../../lib/server/comments';
import { publicOrigin } from '../../../../lib/server/links';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.read');
  return json({ comments: await listComments(db, row.id) });
});

/** Reviewer+: `{body, anchor?, stepId?, parentId?}`; owners and editors get an e-mail. */
export const POST = route(async ({ locals, params, request, url }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.comment');
  const body = await parseJson(commentCreateSchema, request);
  const comment = await addComment(db, row, body, { userId: user.id });
  await notifyComment(db, row, comment, publicOrigin(url));
  return json({ comment }, 201);
});
