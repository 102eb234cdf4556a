/** POST /api/scenes/import: an `armilla-scene` file → a new scene in the caller's team. */
import type { User } from 'lucia';
import type { ZodError } from 'zod';
import type { DbOrTx } from '../db/client';
import { fieldOf, HttpError } from '../http';
import { createScene } from '../scene-service';
import { readCapped, readUpload } from '../upload';
import { sceneFileSchema } from '../../exports/scene-json';

export const MAX_SCENE_FILE_BYTES = 5 * 1024 * 1024;

function invalid(err: ZodError): HttpError {
  const issue = err.issues[0];
  const field = fieldOf(err);
  return new HttpError(422, 'invalid_scene_file', `The scene file did not validate: ${field ? `${field}: ` : ''}${issue?.message ?? 'invalid'}`, field);
}

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
  const r = sceneFileSchema.safeParse(doc);
  if (!r.success) throw invalid(r.error);
  const s = r.data.scene;
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
