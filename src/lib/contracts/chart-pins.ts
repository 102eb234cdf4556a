/**
 * Comments pinned to the altitude chart, picked from a scene's comment list. Kept apart from
 * `comment.ts` and free of zod: the night panel of a viewer link needs it, and importing the schemas there
 * put zod and the scene schemas into the JavaScript sent before the link's first frame (measured: 402 kB
 * against the 400 kB goal).
 */
/** What a pin is picked from: the fields of a comment (`CommentOut` in comment.ts) it reads. */
export interface PinnableComment {
  id: string;
  parentId?: string | null;
  anchor?: unknown;
  body: string;
  author: { name: string };
  resolved: boolean;
  createdAt: string;
}

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
export function chartPins(comments: readonly PinnableComment[]): ChartCommentOut[] {
  const out: ChartCommentOut[] = [];
  for (const c of comments) {
    const a = c.anchor as { chart?: string; target?: string; time?: string } | null | undefined;
    if (c.parentId || !a || typeof a !== 'object' || !('chart' in a) || typeof a.target !== 'string' || typeof a.time !== 'string') continue;
    out.push({ id: c.id, target: a.target, time: a.time, body: c.body, author: c.author.name, resolved: c.resolved, createdAt: c.createdAt });
  }
  return out;
}
