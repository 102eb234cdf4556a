/**
 * The compute registry: every job the worker pool can run, as a PURE function from a structured-clonable
 * input to a structured-clonable output (no database, no request, no globals that change). The worker
 * (`worker.ts`) imports this object; adding a job is adding one entry here. Inputs cross a thread
 * boundary by structured clone: plain objects, arrays, strings, numbers, `Date`s — no class instances,
 * no functions. A job signals a problem of its input by returning it (see `sceneImport`), not by throwing:
 * errors lose their fields on the way back from a thread.
 */
import { windowsResponse, type WindowsBody } from '../sky-api';
import { positionsCsv, windowsCsv } from '../../exports/tables';
import { buildHandout } from '../../handout/handout';
import { readSceneImportBytes } from '../../exports/scene-import';
import { checkPng } from '../png-check';
import type { SceneOut } from '../../contracts/scene';
import { nightData, type NightInput } from '../../sky/night';
import { encodeJson, type Encoding } from './encode';

export const jobs = {
  /** POST /api/sky/windows: a validated body → the response body. */
  windows: (input: WindowsBody) => windowsResponse(input),
  /** export.csv: positions of every target of a scene at one instant (next rise/transit/set within 48 h). */
  positionsCsv: (input: { scene: SceneOut; at: Date }) => positionsCsv(input.scene, input.at),
  /** export-windows.csv / windows.csv: visibility windows of every target over a span. */
  windowsCsv: (input: { scene: SceneOut; from: Date; to: Date; stepSec?: number }) => windowsCsv(input.scene, input.from, input.to, { stepSec: input.stepSec }),
  /** GET /api/scenes/:id/night and the night charts: Sun, Moon, per-target samples, windows and best moment over a span ≤ 36 h. */
  night: (input: NightInput) => nightData(input),
  /** The same answer as the API sends it: JSON, compressed for the client here rather than on the event loop. */
  nightEncoded: (input: { night: NightInput; encoding: Encoding | null }) => encodeJson(nightData(input.night), input.encoding),
  /** The printable handout's model (chart, events, targets) of a scene. */
  handout: (input: { scene: SceneOut }) => buildHandout(input.scene),
  /** An uploaded thumbnail: declared size bounded, image data inflated with a cap (see png-check.ts). */
  pngCheck: (bytes: Uint8Array) => checkPng(bytes),
  /** An uploaded scene file: bytes → JSON → the `armilla-scene` schema (see exports/scene-import.ts). */
  sceneImport: (input: { bytes: Uint8Array; wrapped: boolean }) => readSceneImportBytes(input.bytes, input.wrapped),
};

export type Jobs = typeof jobs;
export type ComputeKind = keyof Jobs;
export type ComputeInput<K extends ComputeKind> = Parameters<Jobs[K]>[0];
export type ComputeOutput<K extends ComputeKind> = Awaited<ReturnType<Jobs[K]>>;

/** Runs one job in the calling thread (the worker's body, and the in-process fallback of dev and unit tests). */
export function runJob<K extends ComputeKind>(kind: K, input: ComputeInput<K>): ComputeOutput<K> {
  const job = jobs[kind] as ((i: ComputeInput<K>) => ComputeOutput<K>) | undefined;
  if (typeof job !== 'function' || !Object.prototype.hasOwnProperty.call(jobs, kind)) throw new Error(`unknown compute job "${String(kind)}"`);
  return job(input);
}
