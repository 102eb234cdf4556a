import { db } from '../../../../lib/server/db';
import { notFound, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneFor } from '../../../../lib/server/scene-service';

/** The PNG preview sent with a PATCH (`thumbnail` as a data URL); 404 when there is none. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const { row } = await sceneFor(db, user, params.id!, 'scene.read');
  if (!row.thumbnail) throw notFound('Thumbnail');
  return new Response(new Uint8Array(row.thumbnail), {
    headers: { 'content-type': 'image/png', 'cache-control': 'private, no-cache', etag: `"${row.id}-${row.version}"` },
  });
});

/** PUT image/png (≤ 2 MB, PNG signature checked), editor+: replaces the thumbnail without a version bump. 204. */
export const PUT = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const { putThumbnail } = await import('../../../../lib/server/thumbnail');
  await putThumbnail(db, user, params.id!, request);
  return new Response(null, { status: 204, headers: { 'cache-control': 'no-store' } });
});
