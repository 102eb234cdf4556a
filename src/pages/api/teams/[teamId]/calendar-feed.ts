/**
 * The team's calendar subscription URL. GET (editor+): whether one exists (the URL itself is shown only when
 * made); POST (editor+): a new secret URL, replacing the old one → 201 `{id, token, url}`; DELETE: revoke → 204.
 */
import { db } from '../../../../lib/server/db';
import { json, noContent, route } from '../../../../lib/server/http';
import { authorize, requireUser } from '../../../../lib/server/policy';
import { publicOrigin } from '../../../../lib/server/links';
import { createFeed, currentFeed, revokeFeed } from '../../../../lib/server/calendar/feeds';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'scene.share', 'Team');
  return json({ feed: await currentFeed(db, params.teamId!) });
});

export const POST = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'scene.share', 'Team');
  return json(await createFeed(db, params.teamId!, user.id, publicOrigin(url)), 201);
});

export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'scene.share', 'Team');
  await revokeFeed(db, params.teamId!, user.id);
  return noContent();
});
