/**
 * Review comments on a scene: by team members (reviewer+) or by guests on a reviewer link.
 * Bodies are Markdown kept as text; the API never returns HTML.
 */
import { chartPins, type ChartCommentOut } from '../contracts/chart-pins';
import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import { writeTx, type DbOrTx } from './db/client';
import { comments, memberships, scenes, users } from './db/schema';
import { oneLine } from './mail/templates';
import { audit } from './audit';
import { badRequest, notFound } from './http';
import type { Anchor, CommentCreateBody, CommentOut } from '../contracts/comment';

export type { CommentOut };
import { docOf } from './scene-service';

type CommentRow = typeof comments.$inferSelect;
type SceneRow = typeof scenes.$inferSelect;

export type CommentAuthor = { userId: string } | { guestName: string; linkId: string };


function commentOut(r: CommentRow, names: Map<string, string>, forGuest: boolean): CommentOut {
  const guest = r.authorUserId === null;
  return {
    id: r.id,
    sceneId: r.sceneId,
    parentId: r.parentId,
    author: {
      userId: forGuest ? null : r.authorUserId,
      name: guest ? (r.authorName ?? 'Guest') : (names.get(r.authorUserId!) ?? 'Former member'),
      guest,
    },
    body: r.body,
    anchor: (r.anchor as Anchor | null) ?? null,
    stepId: r.stepId,
    resolved: r.resolvedAt !== null,
    resolvedAt: r.resolvedAt?.toISOString() ?? null,
    resolvedBy: forGuest ? null : r.resolvedBy,
    createdAt: r.createdAt.toISOString(),
  };
}

async function namesOf(db: DbOrTx, ids: (string | null)[]) {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  if (!wanted.length) return new Map<string, string>();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}

/** The top-level comments pinned to the altitude chart (downloads and handouts draw them), as guests see them. */
export async function chartCommentsOf(db: DbOrTx, sceneId: string): Promise<ChartCommentOut[]> {
  return chartPins(await listComments(db, sceneId, true));
}

export async function listComments(db: DbOrTx, sceneId: string, forGuest = false): Promise<CommentOut[]> {
  const rows = await db.select().from(comments).where(eq(comments.sceneId, sceneId)).orderBy(asc(comments.createdAt), asc(comments.id));
  const names = await namesOf(db, rows.map((r) => r.authorUserId));
  return rows.map((r) => commentOut(r, names, forGuest));
}

export async function addComment(
  db: DbOrTx,
  scene: SceneRow,
  body: CommentCreateBody,
  author: CommentAuthor,
  opts: { now?: Date; resolvedBy?: string | null } = {},
): Promise<CommentOut> {
  if (body.stepId && !docOf(scene).steps.some((s) => s.id === body.stepId)) {
    throw badRequest('stepId: no step with this id in the scene', 'stepId');
  }
  const id = nanoid();
  const at = opts.now ?? new Date();
  await writeTx(db, async (tx) => {
    if (body.parentId) {
      const p = await tx.select({ sceneId: comments.sceneId }).from(comments).where(eq(comments.id, body.parentId)).limit(1);
      if (!p[0] || p[0].sceneId !== scene.id) throw badRequest('parentId: no comment with this id in the scene', 'parentId');
    }
    const userId = 'userId' in author ? author.userId : null;
    await tx.insert(comments).values({
      id,
      sceneId: scene.id,
      parentId: body.parentId ?? null,
      authorUserId: userId,
      authorName: 'guestName' in author ? author.guestName : null,
      linkId: 'linkId' in author ? author.linkId : null,
      body: body.body,
      anchor: body.anchor ?? null,
      stepId: body.stepId ?? null,
      resolvedAt: opts.resolvedBy ? at : null,
      resolvedBy: opts.resolvedBy ?? null,
      createdAt: at,
    });
    await audit(tx, {
      teamId: scene.teamId,
      userId,
      action: 'comment.create',
      subjectType: 'comment',
      subjectId: id,
      detail: { sceneId: scene.id, ...('linkId' in author ? { linkId: author.linkId, guestName: author.guestName } : {}) },
    });
  });
  const row = (await db.select().from(comments).where(eq(comments.id, id)))[0];
  return commentOut(row, await namesOf(db, [row.authorUserId]), false);
}

export async function commentWithScene(db: DbOrTx, id: string) {
  const rows = await db
    .select({ comment: comments, scene: scenes })
    .from(comments)
    .innerJoin(scenes, eq(scenes.id, comments.sceneId))
    .where(eq(comments.id, id))
    .limit(1);
  if (!rows[0]) throw notFound('Comment');
  return rows[0];
}

export async function setResolved(db: DbOrTx, userId: string, row: CommentRow, teamId: string, resolved: boolean) {
  await writeTx(db, async (tx) => {
    await tx
      .update(comments)
      .set(resolved ? { resolvedAt: row.resolvedAt ?? new Date(), resolvedBy: row.resolvedBy ?? userId } : { resolvedAt: null, resolvedBy: null })
      .where(eq(comments.id, row.id));
    await audit(tx, { teamId, userId, action: resolved ? 'comment.resolve' : 'comment.reopen', subjectType: 'comment', subjectId: row.id, detail: { sceneId: row.sceneId } });
  });
  const r = (await db.select().from(comments).where(eq(comments.id, row.id)))[0];
  return commentOut(r, await namesOf(db, [r.authorUserId]), false);
}

/**
 * E-mails the team's owners and editors (not the author) about a new comment. Best effort: a mail
 * failure is logged and never fails the comment. The mail module is loaded lazily so scripts that
 * import this file (the seed) do not pull in the server's mail transport.
 */
export async function notifyComment(db: DbOrTx, scene: SceneRow, c: CommentOut, origin: string): Promise<number> {
  try {
    const recipients = await db
      .select({ id: users.id, email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.teamId, scene.teamId), inArray(memberships.role, ['owner', 'editor']), isNotNull(users.emailVerifiedAt)));
    const to = recipients.filter((r) => r.id !== c.author.userId);
    if (!to.length) return 0;
    const { sendMail } = await import('./mail/index');
    const url = `${origin.replace(/\/+$/, '')}/scenes/${scene.id}#comment-${c.id}`;
    const who = c.author.guest ? `${c.author.name} (guest on a review link)` : c.author.name;
    const quote = c.body.length > 600 ? `${c.body.slice(0, 600)}…` : c.body;
    // Titles are chosen by users: one line, bounded (see oneLine in mail/templates.ts).
    const subject = `New comment on “${oneLine(scene.title, 60)}”`;
    const text = `${who} commented on the scene “${scene.title}”:\n\n${quote}\n\nOpen it: ${url}\n`;
    const html = `<p>${esc(who)} commented on the scene “${esc(scene.title)}”:</p><blockquote><pre style="white-space:pre-wrap;font-family:inherit">${esc(quote)}</pre></blockquote><p><a href="${esc(url)}">Open the comment</a></p>`;
    await Promise.all(to.map((r) => sendMail({ to: r.email, subject, text, html })));
    return to.length;
  } catch (e) {
    console.error('[comments] notification mail failed', e);
    return 0;
  }
}

const esc = (s: string) => s.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!);
