import { endSession } from '../../../lib/server/auth';
import { noContent, route } from '../../../lib/server/http';

/** 204 whether or not a session was open: signing out twice is not an error. */
export const POST = route(async (ctx) => {
  if (ctx.locals.session) await endSession(ctx.locals.session.id, ctx.cookies);
  ctx.locals.user = null;
  ctx.locals.session = null;
  return noContent();
});
