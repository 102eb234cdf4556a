/** POST /api/scenes/import: an `armilla-scene` file → a new scene in the caller's team. */
import type { User } from 'lucia';
import type { DbOrTx } from '../db/client';
import { HttpError } from '../http';
import { runCompute } from '../compute';
import { createScene } from '../scene-service';
import { readCapped, readUpload } from '../upload';
import type { SceneFile } from '../../exports/scene-json';

export const MAX_SCENE_FILE_BYTES = 5 * 1024 * 1024;

/**
 * Reads the request (JSON body `{teamId, file}`, or multipart with a `file` and a `teamId` field) with a
 * byte cap, then parses and validates it on the compute pool → `{teamId, file}`.
 */
export async function readSceneImport(request: Request, url: URL): Promise<{ teamId: unknown; file: SceneFile }> {
  const type = (request.headers.get('content-type') ?? '').toLowerCase();
  let r;
  if (type.startsWith('multipart/form-data')) {
    const up = await readUpload(request, MAX_SCENE_FILE_BYTES);
    r = await runCompute('sceneImport', { bytes: up.bytes, wrapped: false });
    if (r.ok) r.teamId = up.fields.get('teamId');
  } else {
    const bytes = await readCapped(request, MAX_SCENE_FILE_BYTES);
    if (bytes.byteLength > 0 && !/^application\/(?:[\w.-]+\+)?json\s*(?:;|$)/.test(type)) {
      throw new HttpError(415, 'unsupported_media_type', 'Send the scene as JSON (Content-Type: application/json) or as a multipart upload (field "file").');
    }
    if (bytes.byteLength === 0) throw new HttpError(400, 'invalid', 'The body must be a JSON object.');
    r = await runCompute('sceneImport', { bytes, wrapped: true });
  }
  if (!r.ok) throw new HttpError(r.status, r.code, r.message, r.field);
  return { teamId: r.teamId ?? url.searchParams.get('teamId') ?? undefined, file: r.file };
}

export async function importSceneFile(db: DbOrTx, user: User, teamId: unknown, file: SceneFile) {
  if (typeof teamId !== 'string' || teamId.trim() === '' || teamId.length > 64) {
    throw new HttpError(400, 'invalid', 'teamId: is required (the team that receives the new scene)', 'teamId');
  }
  // The file body is the scene document without a team envelope (the envelope travels inline).
  return createScene(db, user, { ...file.scene, teamId, envelopeId: null });
}
