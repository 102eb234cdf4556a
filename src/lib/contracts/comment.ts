/** Review comments: request bodies and the answer (API contract "Comments"). */
import { z } from 'zod';
import { knownKeysOnly } from './known-keys';
import { idRef } from './scene';
import { isoUtc } from './scene-doc';

export const anchorSchema = z.union([
  z.object({ ra: z.number().min(0).lt(360), dec: z.number().min(-90).max(90) }).strict(),
  z.object({ azimuth: z.number().min(0).max(360), altitude: z.number().min(-90).max(90) }).strict(),
  // a point of the altitude-over-time chart: a target (by name) at an instant
  z.object({ chart: z.literal('altitude'), target: z.string().trim().min(1).max(200), time: isoUtc }).strict(),
]);
export type Anchor = z.infer<typeof anchorSchema>;

export const commentBodyText = z.string().trim().min(1, 'must not be empty').max(10_000);
const commentCreateShape = z.object({
  body: commentBodyText,
  anchor: anchorSchema.nullable().optional(),
  stepId: z.string().min(1).max(40).nullable().optional(),
  parentId: idRef.nullable().optional(),
});
export const commentCreateSchema = knownKeysOnly(commentCreateShape, commentCreateShape);
export type CommentCreateBody = z.infer<typeof commentCreateShape>;

const guestCommentShape = commentCreateShape.extend({ authorName: z.string().trim().min(1, 'must not be empty').max(80) });
export const guestCommentSchema = knownKeysOnly(guestCommentShape, guestCommentShape);

const commentPatchShape = z.object({ resolved: z.boolean({ required_error: 'is required' }) });
export const commentPatchSchema = knownKeysOnly(commentPatchShape, commentPatchShape);


export interface CommentOut {
  id: string;
  sceneId: string;
  parentId: string | null;
  author: { userId: string | null; name: string; guest: boolean };
  body: string;
  anchor: Anchor | null;
  stepId: string | null;
  resolved: boolean;
  resolvedAt: string | null;
  resolvedBy: string | null;
  createdAt: string;
}

/**
 * A comment pinned to a point of the altitude chart, as everyone who sees the chart gets it (viewer links
 * too: `GET /api/shared/:token/chart-comments`): the comment's text and author's name, nothing else.
 */
export { chartPins, type ChartCommentOut } from './chart-pins';
