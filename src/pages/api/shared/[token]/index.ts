import { db } from '../../../../lib/server/db';
import { forbidden, json, route } from '../../../../lib/server/http';
import { resolveToken } from '../../../../lib/server/links';
import { publicScene, toSceneOut } from '../../../../lib/server/scenes.server';

/** No account needed: `{scene, role}` read-only; 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params }) => {
  const { link, scene } = await resolveToken(db, params.token!, true);
  return json({ scene: publicScene(await toSceneOut(db, scene)), role: link.role });
});

/** A link never edits or deletes: 403 for a live link (404 for a dead one, as everywhere). */
const readOnly = route(async ({ params }) => {
  await resolveToken(db, params.token!);
  throw forbidden('A shared link is read-only; sign in as an editor to change the scene.');
});
export const PATCH = readOnly;
export const PUT = readOnly;
export const DELETE = readOnly;
