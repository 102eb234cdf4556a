import { db } from '../../../../lib/server/db';
import { clientAddress, forbidden, json, parseJson, route } from '../../../../lib/server/http';
import { linkCan } from '../../../../lib/contracts/roles';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { guestCommentSchema } from '../../../../lib/contracts/comment';
import { resolveToken, publicOrigin } from '../../../../lib/server/links';
import { addComment, listComments, notifyComment } from '../../../../lib/server/comments';

/** Guest comments per link and address: a burst is fine, a flood is not. */
export const GUEST_COMMENT_LIMIT = 20;
export const GUEST_COMMENT_WINDOW_S = 600;

/** Reviewer links only. */
export const GET = route(async ({ params }) => {
  const { link, scene } = await resolveToken(db, params.token!, true);
  if (!linkCan(link.role, 'scene.comment')) throw forbidden('This link is for viewing only.');
  return json({ comments: await listComments(db, scene.id, true) });
});

/** Reviewer links only: `{body, authorName, anchor?, stepId?, parentId?}`; rate limited per link and address. */
export const POST = route(async (ctx) => {
  const { params, request, url } = ctx;
  const { link, scene } = await resolveToken(db, params.token!, true);
  if (!linkCan(link.role, 'scene.comment')) throw forbidden('This link is for viewing only.');
  await rateLimit(`guest-comment:${link.id}:${clientAddress(ctx)}`, GUEST_COMMENT_LIMIT, GUEST_COMMENT_WINDOW_S);
  const body = await parseJson(guestCommentSchema, request);
  const { authorName, ...rest } = body;
  const comment = await addComment(db, scene, rest, { guestName: authorName, linkId: link.id });
  await notifyComment(db, scene, comment, publicOrigin(url));
  return json({ comment: { ...comment, author: { ...comment.author, userId: null } } }, 201);
});
