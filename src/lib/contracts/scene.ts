/**
 * Pure request/response shapes for scenes, sites, envelopes, links, comments and the presenter.
 * Built from the scene document in scene-doc.ts; no I/O here (src/lib/server/scene-service.ts does that).
 */
import { z } from 'zod';
import { knownKeysOnly } from './known-keys';
import { isPng } from '../png';
import { boundedArray } from '../bounded-array';
import {
  cameraSchema,
  isoUtc,
  layersSchema,
  pinSchema,
  siteSchema,
  stepSchema,
  targetSchema,
  DEFAULT_LAYERS,
  type Camera,
  type Layers,
  type Pin,
  type Site,
  type Step,
  type Target,
} from './scene-doc';
import { envelopeSchema, type EnvelopeJson } from './envelope';

export { knownKeysOnly };

/** Ids inside a list (targets, pins, steps) must be unique: steps, comments and pins point at them. */
function uniqueIds<T extends { id: string }>(item: z.ZodType<T, z.ZodTypeDef, unknown>, max: number) {
  return boundedArray(item, max).superRefine((list, ctx) => {
    // zod runs this refinement even when the list was refused (too long, not a list): look only at a
    // list that passed, and stop at the first duplicate.
    if (!Array.isArray(list) || list.length > max) return;
    const seen = new Set<string>();
    for (let i = 0; i < list.length; i++) {
      const id = (list[i] as { id?: unknown } | null)?.id;
      if (typeof id !== 'string') continue;
      if (seen.has(id)) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, path: [i, 'id'], message: `duplicate id "${id}"` });
        return;
      }
      seen.add(id);
    }
  });
}

export const MAX_TARGETS = 5000;
export const MAX_PINS = 500;
export const MAX_STEPS = 200;

export const targetsSchema = uniqueIds(targetSchema as z.ZodType<Target, z.ZodTypeDef, unknown>, MAX_TARGETS);
export const pinsSchema = uniqueIds(pinSchema as z.ZodType<Pin, z.ZodTypeDef, unknown>, MAX_PINS);
export const stepsSchema = uniqueIds(stepSchema as z.ZodType<Step, z.ZodTypeDef, unknown>, MAX_STEPS);

export const titleSchema = z.string().trim().min(1, 'must not be empty').max(200);
export const descriptionSchema = z.string().max(20_000);

/** The stored scene document; the database's JSON columns are checked against it on write and on read. */
export const sceneDocSchema = z.object({
  title: titleSchema,
  description: descriptionSchema,
  site: siteSchema,
  time: isoUtc,
  layers: layersSchema,
  camera: cameraSchema,
  envelopeId: z.string().nullable(),
  envelope: envelopeSchema.nullable(),
  targets: targetsSchema,
  pins: pinsSchema,
  steps: stepsSchema,
});
export type SceneDoc = z.infer<typeof sceneDocSchema>;

export const idRef = z.string().trim().min(1).max(64);

/** The document fields a create or a patch may carry, all optional. */
const docFields = {
  title: titleSchema.optional(),
  description: descriptionSchema.optional(),
  site: siteSchema.optional(),
  time: isoUtc.optional(),
  layers: layersSchema.optional(),
  camera: cameraSchema.optional(),
  envelopeId: idRef.nullable().optional(),
  envelope: envelopeSchema.nullable().optional(),
  targets: targetsSchema.optional(),
  pins: pinsSchema.optional(),
  steps: stepsSchema.optional(),
};

const sceneCreateShape = z.object({
  teamId: idRef,
  ...docFields,
  /** Take the site from one of the team's saved sites. */
  siteId: idRef.optional(),
  /** Duplicate this scene; fields given here override the copy. */
  fromSceneId: idRef.optional(),
});

export const sceneCreateSchema = knownKeysOnly(
  sceneCreateShape,
  sceneCreateShape.superRefine((b, ctx) => {
    const need = (field: string) => ctx.addIssue({ code: z.ZodIssueCode.custom, path: [field], message: 'is required' });
    if (b.fromSceneId) {
      if (b.site && b.siteId) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['siteId'], message: 'give site or siteId, not both' });
    } else {
      if (b.title === undefined) need('title');
      if (b.site === undefined && b.siteId === undefined) need('site');
      if (b.site && b.siteId) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['siteId'], message: 'give site or siteId, not both' });
      if (b.time === undefined) need('time');
    }
    if (b.envelopeId && b.envelope) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['envelope'], message: 'give envelopeId or envelope, not both' });
    }
  }),
);
export type SceneCreateBody = z.infer<typeof sceneCreateShape>;

/** PNG thumbnails arrive as a data URL; ≤ 512 KiB decoded. */
export const MAX_THUMBNAIL_BYTES = 512 * 1024;
export const thumbnailSchema = z
  .string()
  .max(Math.ceil((MAX_THUMBNAIL_BYTES * 4) / 3) + 64)
  .transform((s, ctx) => {
    const m = /^data:image\/png;base64,([A-Za-z0-9+/]+={0,2})$/.exec(s);
    const bytes = m ? Buffer.from(m[1], 'base64') : null;
    if (!bytes || bytes.length > MAX_THUMBNAIL_BYTES || !isPng(bytes)) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'must be a PNG data URL (data:image/png;base64,…) of at most 512 KiB' });
      return z.NEVER;
    }
    // Declared and decoded size are checked on the server (src/lib/server/png-check.ts, scene-service.ts).
    return bytes;
  });

export const readOnlyEcho = z.unknown().optional();

const scenePatchShape = z.object({
  version: z.number({ required_error: 'is required' }).int().min(1),
  ...docFields,
  thumbnail: thumbnailSchema.nullable().optional(),
  // A client may send back the scene it fetched; server-kept fields are ignored.
  id: readOnlyEcho,
  teamId: readOnlyEcho,
  createdAt: readOnlyEcho,
  createdBy: readOnlyEcho,
  updatedAt: readOnlyEcho,
  updatedBy: readOnlyEcho,
  hasThumbnail: readOnlyEcho,
});
export const scenePatchSchema = knownKeysOnly(
  scenePatchShape,
  scenePatchShape.superRefine((b, ctx) => {
    if (b.envelopeId && b.envelope) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['envelope'], message: 'give envelopeId or envelope, not both' });
    }
  }),
);
export type ScenePatchBody = z.infer<typeof scenePatchShape>;

/** `GET /api/scenes?teamId=`: one team's scenes only. */
export const sceneListQuerySchema = z.object({ teamId: z.string().min(1).max(64).optional() });

const restoreShape = z.object({ version: z.number().int().min(1).optional() });
export const restoreSchema = knownKeysOnly(restoreShape, restoreShape);

/** The scene as the API returns it. */
export interface SceneOut {
  id: string;
  teamId: string;
  title: string;
  description: string;
  site: Site;
  time: string;
  layers: Layers;
  camera: Camera;
  envelopeId: string | null;
  /** Resolved: the team envelope's current JSON, or the inline one, or null. */
  envelope: EnvelopeJson | null;
  targets: Target[];
  pins: Pin[];
  steps: Step[];
  version: number;
  createdBy: string | null;
  updatedBy: string | null;
  createdAt: string;
  updatedAt: string;
  hasThumbnail: boolean;
}

export const withDefaultLayers = (layers: Layers | undefined): Layers => ({ ...DEFAULT_LAYERS, ...(layers ?? {}) });
export const defaultCamera = (): Camera => cameraSchema.parse({});

/** Applies a PATCH body to a stored document (pure). Choosing a team envelope drops the inline one and back. */
export function applyPatch(doc: SceneDoc, b: ScenePatchBody): SceneDoc {
  const next: SceneDoc = { ...doc };
  if (b.title !== undefined) next.title = b.title;
  if (b.description !== undefined) next.description = b.description;
  if (b.site !== undefined) next.site = b.site;
  if (b.time !== undefined) next.time = b.time;
  if (b.layers !== undefined) next.layers = b.layers;
  if (b.camera !== undefined) next.camera = b.camera;
  if (b.targets !== undefined) next.targets = b.targets;
  if (b.pins !== undefined) next.pins = b.pins;
  if (b.steps !== undefined) next.steps = b.steps;
  if (b.envelopeId !== undefined) {
    next.envelopeId = b.envelopeId;
    if (b.envelopeId !== null) next.envelope = null;
  }
  if (b.envelope !== undefined) {
    next.envelope = b.envelope;
    if (b.envelope !== null) next.envelopeId = null;
  }
  return next;
}

/** `SceneOut` as a schema, for the API description (the two checks below fail to compile when they drift). */
export const sceneOutSchema = sceneDocSchema.extend({
  id: z.string(),
  teamId: z.string(),
  version: z.number().int().describe('increases by one with every change; send it back with a PATCH'),
  createdBy: z.string().nullable(),
  updatedBy: z.string().nullable(),
  createdAt: isoUtc,
  updatedAt: isoUtc,
  hasThumbnail: z.boolean(),
});
const _outFitsSchema: z.infer<typeof sceneOutSchema> = {} as SceneOut;
const _schemaFitsOut: SceneOut = {} as z.infer<typeof sceneOutSchema>;
void _outFitsSchema;
void _schemaFitsOut;

/** The scene as a guest of a share link sees it. */
export type PublicScene = Omit<SceneOut, 'createdBy' | 'updatedBy'>;

/** One entry of a scene's version history. */
export interface VersionOut {
  version: number;
  authorId: string | null;
  authorName?: string | null;
  createdAt: string;
  title?: string;
}

/** The editable part of a scene: what autosave sends and what a conflict compares. */
export const EDITABLE_FIELDS = ['title', 'description', 'site', 'time', 'layers', 'camera', 'envelopeId', 'envelope', 'targets', 'pins', 'steps'] as const;
export type EditableField = (typeof EDITABLE_FIELDS)[number];
export type SceneFields = Pick<SceneOut, EditableField>;
