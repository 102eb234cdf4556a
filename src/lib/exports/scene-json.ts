/**
 * The scene file format of our own: `{format: "armilla-scene", formatVersion: 1, exportedAt, scene}`.
 * JSON Schema: public/schemas/armilla-scene-1.schema.json. Pure (zod only).
 *
 * Version 1 rules: the envelope travels inline (a team envelope is copied, since the team and its ids
 * do not travel); ids of targets, pins and steps are kept (steps and comments refer to them); `source`
 * is informational and ignored on import; a reader refuses any other formatVersion.
 */
import { z } from 'zod';
import { sceneDocSchema, type SceneOut } from '../contracts/scene';

export const SCENE_FORMAT = 'armilla-scene';
export const SCENE_FORMAT_VERSION = 1;
export const SCENE_SCHEMA_PATH = '/schemas/armilla-scene-1.schema.json';

/** The scene part of the file: the stored document with the envelope inline. */
export const sceneFileBodySchema = sceneDocSchema.omit({ envelopeId: true }).strict();
export type SceneFileBody = z.infer<typeof sceneFileBodySchema>;

export const sceneFileSchema = z
  .object({
    format: z.literal(SCENE_FORMAT, { errorMap: () => ({ message: `must be "${SCENE_FORMAT}"` }) }),
    formatVersion: z.literal(SCENE_FORMAT_VERSION, {
      errorMap: () => ({ message: `must be ${SCENE_FORMAT_VERSION} (this server reads format version ${SCENE_FORMAT_VERSION} only)` }),
    }),
    exportedAt: z.string().max(64),
    generator: z.string().max(200).optional(),
    source: z
      .object({ sceneId: z.string(), teamId: z.string(), version: z.number().int(), envelopeId: z.string().nullable() })
      .partial()
      .strict()
      .optional(),
    scene: sceneFileBodySchema,
  })
  .strict();
export type SceneFile = z.infer<typeof sceneFileSchema>;

export function toSceneFile(s: SceneOut, now = new Date()): SceneFile {
  return {
    format: SCENE_FORMAT,
    formatVersion: SCENE_FORMAT_VERSION,
    exportedAt: now.toISOString(),
    generator: 'Armilla',
    source: { sceneId: s.id, teamId: s.teamId, version: s.version, envelopeId: s.envelopeId },
    scene: {
      title: s.title,
      description: s.description,
      site: s.site,
      time: s.time,
      layers: s.layers,
      camera: s.camera,
      envelope: s.envelope,
      targets: s.targets,
      pins: s.pins,
      steps: s.steps,
    },
  };
}

/** A file-name-safe slug of a title ("Equinox evening, 2026" → "equinox-evening-2026"). */
export function slug(title: string, fallback = 'scene'): string {
  const s = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return s || fallback;
}

/** `Content-Disposition: attachment` with an ASCII name and the RFC 6266 / 5987 UTF-8 form. */
export function attachment(filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}
