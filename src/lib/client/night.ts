/** The night charts' data: `GET /api/scenes/:id/night` or `/api/shared/:token/night` through react-query. */
import { useQuery, keepPreviousData } from '@tanstack/react-query';
import { apiGet } from './api';
import type { NightAnswer } from '../sky/night';

export type NightSource = { kind: 'scene'; id: string } | { kind: 'shared'; token: string };

export const nightBase = (s: NightSource) => (s.kind === 'scene' ? `/api/scenes/${s.id}` : `/api/shared/${encodeURIComponent(s.token)}`);

export interface NightParams {
  from?: string;
  to?: string;
  step?: number;
  /** The night around this instant (default: the scene time's). */
  at?: string;
  bodies?: string[];
}

export function nightPath(s: NightSource, p: NightParams = {}, file: 'night' | 'night.svg' = 'night'): string {
  const q = new URLSearchParams();
  if (p.from) q.set('from', p.from);
  if (p.to) q.set('to', p.to);
  if (p.at) q.set('at', p.at);
  if (p.step) q.set('step', String(p.step));
  if (p.bodies?.length) q.set('bodies', p.bodies.join(','));
  const qs = q.toString();
  return `${nightBase(s)}/${file}${qs ? `?${qs}` : ''}`;
}

/** `revision` changes when what the night depends on changes (targets, envelope, site). */
export function useNight(s: NightSource, p: NightParams, revision: string) {
  return useQuery({
    queryKey: ['night', nightBase(s), p, revision],
    queryFn: ({ signal }) => apiGet<NightAnswer>(nightPath(s, p), signal),
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });
}
