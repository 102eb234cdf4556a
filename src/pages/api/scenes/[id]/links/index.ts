import { db } from '../../../../../lib/server/db';
import { json, parseJson, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { linkCreateSchema } from '../../../../../lib/contracts/link';
import { sceneFor } from '../../../../../lib/server/scene-service';
import { createLink, listLinks, publicOrigin } from '../../../../../lib/server/links';

/** The scene's links with their state; the token is never shown again. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.share');
  return json({ links: await listLinks(db, row.id) });
});

/** Editor+: `{role: "viewer" | "reviewer", expiresAt?}` → 201 `{id, token, url}` (the only time the token is shown). */
export const POST = route(async ({ locals, params, request, url }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.share');
  const body = await parseJson(linkCreateSchema, request);
  const link = await createLink(db, user.id, row, body.role, body.expiresAt ? new Date(body.expiresAt) : null, publicOrigin(url));
  return json(link, 201);
});
