/** Small helpers the scene pages use to mount the night panel. */
import type { CommentOut } from '../../lib/contracts/comment';
import { chartPins } from '../../lib/contracts/chart-pins';
import type { ChartComment } from './AltitudeChart';

/** What the night depends on, as one string (refetch when it changes; the scene time alone does not). */
export function nightRevision(scene: { site: unknown; envelope?: unknown; envelopeId?: string | null; targets: unknown[] }): string {
  return JSON.stringify([scene.site, scene.envelope ?? null, scene.envelopeId ?? null, scene.targets]);
}

/** Top-level comments pinned to a point of the altitude chart. */
export function chartComments(comments: CommentOut[]): ChartComment[] {
  return chartPins(comments);
}
