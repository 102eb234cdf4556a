import { db } from '../../../../lib/server/db';
import { forbidden, route } from '../../../../lib/server/http';
import { jsonAnswer } from '../../../../lib/server/compressed';
import { resolveLink } from '../../../../lib/server/links';
import { publicSceneJson } from '../../../../lib/server/scene-service';

/**
 * No account needed: `{scene, role}` read-only; 404 for unknown, revoked or expired tokens.
 * The hot read path of a presentation: the link is checked against the database on every request,
 * the scene's serialised answer comes from a cache keyed by the scene's state (scene-service.ts), and
 * its compressed forms from a cache beside it.
 */
export const GET = route(async ({ params, request }) => {
  const link = await resolveLink(db, params.token!, true);
  const scene = await publicSceneJson(db, link.scene);
  // Its brotli / gzip forms are kept beside the cached answer (compressed.ts): compressed once, not per read.
  return jsonAnswer(request, `shared:${link.scene.id}:${link.role}`, `{"scene":${scene},"role":${JSON.stringify(link.role)}}`);
});

/** A link never edits or deletes: 403 for a live link (404 for a dead one, as everywhere). */
const readOnly = route(async ({ params }) => {
  await resolveLink(db, params.token!);
  throw forbidden('A shared link is read-only; sign in as an editor to change the scene.');
});
export const PATCH = readOnly;
export const PUT = readOnly;
export const DELETE = readOnly;
