/**
 * Reading an `armilla-scene` upload: bytes → JSON → the file schema. Pure (zod and the standard
 * library); runs on the compute pool (job `sceneImport`), because a 5 MB body of millions of small items
 * costs a noticeable fraction of a second to parse even when the schema then refuses it at once.
 */
import { sceneFileSchema, type SceneFile } from './scene-json';

export type SceneImportRead =
  | { ok: true; teamId: unknown; file: SceneFile }
  | { ok: false; status: 400 | 422; code: string; message: string; field?: string };

/**
 * `wrapped`: a JSON request body `{teamId, file}` (or `{teamId, ...file}`); otherwise the bytes are the
 * file itself (a multipart upload, whose `teamId` came as a form field).
 */
export function readSceneImportBytes(bytes: Uint8Array, wrapped: boolean): SceneImportRead {
  let raw: unknown;
  try {
    raw = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    return wrapped
      ? { ok: false, status: 400, code: 'malformed_json', message: 'The request body is not valid JSON.' }
      : { ok: false, status: 422, code: 'invalid_scene_file', message: 'The file is not UTF-8 JSON; expected an armilla-scene file from "Export JSON".', field: 'file' };
  }
  let teamId: unknown;
  let doc: unknown = raw;
  if (wrapped) {
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) return { ok: false, status: 400, code: 'invalid', message: 'The body must be a JSON object.' };
    const { teamId: t, file, ...rest } = raw as Record<string, unknown>;
    teamId = t;
    doc = file !== undefined ? file : rest;
  }
  const r = sceneFileSchema.safeParse(doc);
  if (r.success) return { ok: true, teamId, file: r.data };
  const issue = r.error.issues[0];
  const field = issue?.path.length ? issue.path.join('.') : undefined;
  return { ok: false, status: 422, code: 'invalid_scene_file', message: `The scene file did not validate: ${field ? `${field}: ` : ''}${issue?.message ?? 'invalid'}`, field };
}
