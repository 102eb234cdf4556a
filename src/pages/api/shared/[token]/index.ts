import { db } from '../../../../lib/server/db';
import { forbidden, jsonText, route } from '../../../../lib/server/http';
import { resolveLink } from '../../../../lib/server/links';
import { publicSceneJson } from '../../../../lib/server/scene-service';

/**
 * No account needed: `{scene, role}` read-only; 404 for unknown, revoked or expired tokens.
 * The hot read path of a presentation: the link is checked against the database on every request,
 * the scene's serialised answer comes from a cache keyed by the scene's state (scene-service.ts).
 */
export const GET = route(async ({ params }) => {
  const link = await resolveLink(db, params.token!, true);
  const scene = await publicSceneJson(db, link.scene);
  return jsonText(`{"scene":${scene},"role":${JSON.stringify(link.role)}}`);
});

/** A link never edits or deletes: 403 for a live link (404 for a dead one, as everywhere). */
const readOnly = route(async ({ params }) => {
  await resolveLink(db, params.token!);
  throw forbidden('A shared link is read-only; sign in as an editor to change the scene.');
});
export const PATCH = readOnly;
export const PUT = readOnly;
export const DELETE = readOnly;
