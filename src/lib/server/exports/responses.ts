/** Shared request parsing and responses of the export routes (member and share-link variants alike). */
import { z } from 'zod';
import { isoUtc } from '../../contracts/scene-doc';
import { HttpError, json, parseQuery } from '../http';
import type { SceneOut } from '../../contracts/scene';
import { attachment, slug, toSceneFile } from '../../exports/scene-json';
import { runCompute } from '../compute';
import { chargeWork, handoutWork, MAX_HANDOUT_TARGETS, MAX_POSITION_ROWS, positionsWork, windowsWork, type WORK_PER_MINUTE } from '../compute/budget';
import { windowsStepSec } from '../sky-api';
import { toVoTable } from '../../exports/votable';
import { voTargets } from './vo-targets';

const MAX_SPAN_MS = 31 * 86400000;

const csvHeaders = (filename: string) => ({
  'content-type': 'text/csv; charset=utf-8; header=present',
  'content-disposition': attachment(filename),
  'cache-control': 'no-store',
});

/** `?time=` of the positions export (default: the scene's time). */
export const positionsQuerySchema = z.object({ time: isoUtc.optional() });
/** `?from=&to=` of the windows export (default: 24 h from the scene's time). */
export const windowsCsvQuerySchema = z.object({ from: isoUtc.optional(), to: isoUtc.optional() });

/** Whom the work of an export is charged to: a member's account, or a link holder's address. */
export interface WorkPayer {
  key: string;
  who: keyof typeof WORK_PER_MINUTE;
}

export async function positionsResponse(scene: SceneOut, url: URL, payer: WorkPayer): Promise<Response> {
  const q = parseQuery(positionsQuerySchema, url);
  const at = new Date(q.time ?? scene.time);
  const stamp = at.toISOString().slice(0, 16).replace(/[:]/g, '');
  await chargeWork(
    payer.key,
    positionsWork(scene.targets.length),
    payer.who,
    `This scene has ${scene.targets.length} targets; the positions export (with the next rise, transit and set of each) takes at most ${MAX_POSITION_ROWS}. The windows export and the scene JSON have no such limit.`,
  );
  const csv = await runCompute('positionsCsv', { scene, at }, { caller: payer.key });
  return new Response(csv, { headers: csvHeaders(`${slug(scene.title)}-positions-${stamp}Z.csv`) });
}

export async function windowsResponse(scene: SceneOut, url: URL, payer: WorkPayer): Promise<Response> {
  const q = parseQuery(windowsCsvQuerySchema, url);
  const from = new Date(q.from ?? scene.time);
  const to = q.to ? new Date(q.to) : new Date(from.getTime() + 86400000);
  if (!(to.getTime() > from.getTime())) throw new HttpError(400, 'invalid', 'to: must be after from', 'to');
  if (to.getTime() - from.getTime() > MAX_SPAN_MS) throw new HttpError(400, 'invalid', 'to: the span may be at most 31 days', 'to');
  const spanMs = to.getTime() - from.getTime();
  const stepSec = windowsStepSec(spanMs, scene.targets.length);
  await chargeWork(payer.key, windowsWork(scene.targets.length, spanMs, stepSec), payer.who, 'Ask for a shorter span.');
  const csv = await runCompute('windowsCsv', { scene, from, to, stepSec }, { caller: payer.key });
  return new Response(csv, { headers: csvHeaders(`${slug(scene.title)}-windows.csv`) });
}

export function sceneJsonResponse(scene: SceneOut): Response {
  return json(toSceneFile(scene), 200, { 'content-disposition': attachment(`${slug(scene.title)}.armilla.json`) });
}

export function voTableResponse(scene: SceneOut): Response {
  return new Response(toVoTable(voTargets(scene), { title: scene.title }), {
    headers: {
      'content-type': 'application/x-votable+xml; charset=utf-8',
      'content-disposition': attachment(`${slug(scene.title)}-targets.vot`),
      'cache-control': 'no-store',
    },
  });
}

/** The handout's model, computed on the worker pool and charged like an export. */
export async function handoutModel(scene: SceneOut, payer: WorkPayer) {
  await chargeWork(
    payer.key,
    handoutWork(scene.targets.length),
    payer.who,
    `This scene has ${scene.targets.length} targets; a handout takes at most ${MAX_HANDOUT_TARGETS}.`,
  );
  return runCompute('handout', { scene }, { caller: payer.key });
}
