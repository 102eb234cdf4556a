import { db } from '../../../../../lib/server/db';
import { json, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { listVersions, sceneFor } from '../../../../../lib/server/scene-service';

/** History, newest first: `{versions: [{version, authorId, createdAt, title}]}`. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.read');
  return json({ versions: await listVersions(db, row.id), current: row.version });
});
