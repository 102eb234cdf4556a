/**
 * Comments pinned to the altitude chart, picked from a scene's comment list. Kept apart from
 * `comment.ts` and free of zod: the night panel of a viewer link needs it, and importing the schemas there
 * put zod and the scene schemas into the JavaScript sent before the link's first frame (measured: 402 kB
 * against the 400 kB goal).
 */
import type { CommentOut } from './comment';

export interface ChartCommentOut {
  id: string;
  target: string;
  time: string;
  body: string;
  author: string;
  resolved: boolean;
  createdAt: string;
}

/** The top-level comments with a chart anchor, in the list's order. */
export function chartPins(comments: readonly CommentOut[]): ChartCommentOut[] {
  const out: ChartCommentOut[] = [];
  for (const c of comments) {
    const a = c.anchor;
    if (c.parentId || !a || !('chart' in a)) continue;
    out.push({ id: c.id, target: a.target, time: a.time, body: c.body, author: c.author.name, resolved: c.resolved, createdAt: c.createdAt });
  }
  return out;
}
