/**
 * The comments of a scene (members) or of a share link (guests), as a query. Apart from ReviewPanel so a
 * viewer link, which loads the panel only when it shows it, can still count and mark comments.
 */
import { keys, useCommentList } from '../../lib/client/queries';

export type ReviewAccess =
  | { kind: 'member'; sceneId: string; canComment: boolean; canResolve: boolean }
  | { kind: 'guest'; token: string; canComment: boolean };

export const commentsKey = (a: ReviewAccess) => keys.comments(a);
export const useComments = useCommentList;
