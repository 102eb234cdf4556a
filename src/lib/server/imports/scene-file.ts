/** POST /api/scenes/import: an `armilla-scene` file → a new scene in the caller's team. */
import type { User } from 'lucia';
import type { DbOrTx } from '../db/client';
import { HttpError } from '../http';
import { runCompute } from '../compute';
import { createScene } from '../scene-service';
import { readCapped, readUpload } from '../upload';

export const MAX_SCENE_FILE_BYTES = 5 * 1024 * 1024;

/** Reads the request (JSON body, or multipart with a `file` and a `teamId` field) into `{teamId, doc}`. */
export async function readSceneImport(request: Request, url: URL): Promise<{ teamId: unknown; doc: unknown }> {
  const type = (request.headers.get('content-type') ?? '').toLowerCase();
  if (type.startsWith('multipart/form-data')) {
    const up = await readUpload(request, MAX_SCENE_FILE_BYTES);
    let doc: unknown;
    try {
      doc = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(up.bytes));
    } catch {
      throw new HttpError(422, 'invalid_scene_file', 'The file is not UTF-8 JSON; expected an armilla-scene file from "Export JSON".', 'file');
    }
    return { teamId: up.fields.get('teamId') ?? url.searchParams.get('teamId') ?? undefined, doc };
  }
  const bytes = await readCapped(request, MAX_SCENE_FILE_BYTES);
  if (bytes.byteLength > 0 && !/^application\/(?:[\w.-]+\+)?json\s*(?:;|$)/.test(type)) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the scene as JSON (Content-Type: application/json) or as a multipart upload (field "file").');
  }
  let body: unknown;
  try {
    body = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    throw new HttpError(400, 'malformed_json', 'The request body is not valid JSON.');
  }
  if (body === null || typeof body !== 'object' || Array.isArray(body)) throw new HttpError(400, 'invalid', 'The body must be a JSON object.');
  const { teamId, file, ...rest } = body as Record<string, unknown>;
  return { teamId: teamId ?? url.searchParams.get('teamId') ?? undefined, doc: file !== undefined ? file : rest };
}

export async function importSceneFile(db: DbOrTx, user: User, teamId: unknown, doc: unknown) {
  if (typeof teamId !== 'string' || teamId.trim() === '' || teamId.length > 64) {
    throw new HttpError(400, 'invalid', 'teamId: is required (the team that receives the new scene)', 'teamId');
  }
  // Validated on the worker pool: a 5 MB file of a few thousand targets is tens of milliseconds of zod.
  const r = await runCompute('sceneFile', doc);
  if (!r.ok) {
    const { field, message } = r.issue;
    throw new HttpError(422, 'invalid_scene_file', `The scene file did not validate: ${field ? `${field}: ` : ''}${message}`, field);
  }
  const s = r.file.scene;
  return createScene(db, user, {
    teamId,
    title: s.title,
    description: s.description,
    site: s.site,
    time: s.time,
    layers: s.layers,
    camera: s.camera,
    envelopeId: null,
    envelope: s.envelope,
    targets: s.targets,
    pins: s.pins,
    steps: s.steps,
  });
}
