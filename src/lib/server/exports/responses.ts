/** Shared request parsing and responses of the export routes (member and share-link variants alike). */
import { z } from 'zod';
import { isoUtc } from '../../contracts/scene-doc';
import { HttpError, json, parseQuery } from '../http';
import type { SceneOut } from '../../contracts/scene';
import { attachment, slug, toSceneFile } from '../../exports/scene-json';
import { positionsCsv, windowsCsv } from '../../exports/tables';
import { toVoTable } from '../../exports/votable';
import { voTargets } from './vo-targets';

const MAX_SPAN_MS = 31 * 86400000;

const csvHeaders = (filename: string) => ({
  'content-type': 'text/csv; charset=utf-8; header=present',
  'content-disposition': attachment(filename),
  'cache-control': 'no-store',
});

export function positionsResponse(scene: SceneOut, url: URL): Response {
  const q = parseQuery(z.object({ time: isoUtc.optional() }), url);
  const at = new Date(q.time ?? scene.time);
  const stamp = at.toISOString().slice(0, 16).replace(/[:]/g, '');
  return new Response(positionsCsv(scene, at), { headers: csvHeaders(`${slug(scene.title)}-positions-${stamp}Z.csv`) });
}

export function windowsResponse(scene: SceneOut, url: URL): Response {
  const q = parseQuery(z.object({ from: isoUtc.optional(), to: isoUtc.optional() }), url);
  const from = new Date(q.from ?? scene.time);
  const to = q.to ? new Date(q.to) : new Date(from.getTime() + 86400000);
  if (!(to.getTime() > from.getTime())) throw new HttpError(400, 'invalid', 'to: must be after from', 'to');
  if (to.getTime() - from.getTime() > MAX_SPAN_MS) throw new HttpError(400, 'invalid', 'to: the span may be at most 31 days', 'to');
  return new Response(windowsCsv(scene, from, to), { headers: csvHeaders(`${slug(scene.title)}-windows.csv`) });
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
