/**
 * The scene's PNG thumbnail (a snapshot of the WebGL view). Stored in scenes.thumbnail. Replacing it is
 * not a content change: the scene's version is not bumped, so a snapshot upload never makes an editor's
 * next PATCH conflict.
 */
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { User } from 'lucia';
import { writeTx, type DbOrTx } from './db/client';
import { scenes } from './db/schema';
import { audit } from './audit';
import { HttpError } from './http';
import { sceneFor, toSceneOut } from './scene-service';
import { skyThumbnail, thumbnailEtag, thumbnailKey } from './thumbnails/render.server';
import { readCapped } from './upload';
import { isPng } from '../png';
import { runCompute } from './compute';

export { isPng };

export const MAX_PNG_BYTES = 2 * 1024 * 1024;

export async function putThumbnail(db: DbOrTx, user: User, sceneId: string, request: Request): Promise<{ bytes: number }> {
  const { row } = await sceneFor(db, user, sceneId, 'scene.write');
  const type = (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
  if (type !== 'image/png') throw new HttpError(400, 'invalid', 'content-type: send the snapshot as image/png.', 'content-type');
  const bytes = await readCapped(request, MAX_PNG_BYTES);
  const check = await runCompute('pngCheck', bytes, { caller: `user:${user.id}` });
  if (!check.ok) throw new HttpError(422, 'invalid_png', check.message, 'body');
  await writeTx(db, async (tx) => {
    await tx.update(scenes).set({ thumbnail: Buffer.from(bytes) }).where(eq(scenes.id, row.id));
    await audit(tx, { teamId: row.teamId, userId: user.id, action: 'scene.thumbnail', subjectType: 'scene', subjectId: row.id, detail: { bytes: bytes.length } });
  });
  return { bytes: bytes.length };
}

/**
 * The snapshot an editor saved, or else the sky thumbnail made on the server from the scene (its chart
 * at its time and site; src/lib/server/thumbnails/). Every scene has one, so the dashboard never meets a 404.
 */
export async function getThumbnail(db: DbOrTx, user: User, sceneId: string, ifNoneMatch: string | null): Promise<Response> {
  const { row } = await sceneFor(db, user, sceneId, 'scene.read');
  if (!row.thumbnail) {
    const scene = await toSceneOut(db, row);
    const etag = thumbnailEtag(thumbnailKey(scene));
    const headers = { 'content-type': 'image/png', 'cache-control': 'private, no-cache', etag };
    if (ifNoneMatch === etag) return new Response(null, { status: 304, headers });
    const { png } = skyThumbnail(scene);
    return new Response(new Uint8Array(png), { headers: { ...headers, 'content-length': String(png.length) } });
  }
  const bytes = new Uint8Array(row.thumbnail);
  const etag = `"${createHash('sha256').update(bytes).digest('base64url').slice(0, 22)}"`;
  const headers = { 'content-type': 'image/png', 'cache-control': 'private, no-cache', etag };
  if (ifNoneMatch === etag) return new Response(null, { status: 304, headers });
  return new Response(bytes, { headers: { ...headers, 'content-length': String(bytes.length) } });
}
